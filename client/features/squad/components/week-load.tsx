import { lazy, Suspense } from 'react';
import { formatDistance } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { LOAD_SPIKE_RATIO } from '../../../../shared/weeks/week-review.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { formatDay, formatDayMonth } from '../utils/week-format.ts';

const LoadTrendChart = lazy(() => import('./load-trend-chart.tsx'));

/** This week and the four before it. */
const TREND_SHOWN = 5;

/** TRIMP this week, the last weeks' trend (chart and table), and the acute:chronic ratio with what it means. */
export function WeekLoad({ week, unit }: { week: RunnerWeek; unit: Unit }) {
  const { totals } = week;
  const weeks = week.trend.slice(-TREND_SHOWN);
  const bars = weeks.map((w) => ({
    label: formatDayMonth(w.start),
    trimp: Math.round(w.trimp),
    current: w.start === week.start,
  }));
  const description = `Weekly TRIMP, weeks starting ${weeks.map((w) => `${formatDayMonth(w.start)}: ${Math.round(w.trimp)}`).join('; ')}.`;

  return (
    <div className="flex flex-col gap-4 text-sm">
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <span className="text-xs font-semibold tracking-wide text-ink-muted uppercase">TRIMP this week</span>
        <span className="text-lg font-semibold tabular-nums">{totals.trimp === null ? '–' : Math.round(totals.trimp)}</span>
        <span className="text-ink-muted">
          {totals.trimp === null
            ? 'No run this week has heart rate, so there is no load figure.'
            : totals.runs_without_trimp > 0
              ? `${totals.runs_without_trimp} ${totals.runs_without_trimp === 1 ? 'run has' : 'runs have'} no heart rate and ${totals.runs_without_trimp === 1 ? 'is' : 'are'} not counted.`
              : 'Every run this week has heart rate.'}
        </span>
      </div>

      <figure className="flex flex-col gap-2">
        <figcaption className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Load, this week and the four before (TRIMP)
        </figcaption>
        <div role="img" aria-label={`${description} The same figures follow as a table.`}>
          <Suspense fallback={<p className="py-12 text-center text-ink-muted">Drawing the chart…</p>}>
            <LoadTrendChart bars={bars} />
          </Suspense>
        </div>
        <details>
          <summary className="cursor-pointer font-semibold text-teal">The chart’s figures as a table</summary>
          <table className="mt-2 w-full tabular-nums">
            <caption className="sr-only">Run distance and TRIMP per week</caption>
            <thead className="border-b border-line-strong text-ink-muted">
              <tr>
                <th scope="col" className="py-1 pr-3 text-left font-semibold">
                  Week of
                </th>
                <th scope="col" className="py-1 pr-3 text-right font-semibold">
                  Distance ({unit})
                </th>
                <th scope="col" className="py-1 text-right font-semibold">
                  TRIMP
                </th>
              </tr>
            </thead>
            <tbody>
              {weeks.map((w) => (
                <tr key={w.start} className="border-b border-line last:border-0">
                  <th scope="row" className="py-0.5 pr-3 text-left font-normal">
                    {formatDay(w.start)}
                    {w.start === week.start && <span className="text-ink-muted"> (this week)</span>}
                  </th>
                  <td className="py-0.5 pr-3 text-right">{formatDistance(w.run_distance_m, unit, 1)}</td>
                  <td className="py-0.5 text-right">{Math.round(w.trimp)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      </figure>

      <AcuteChronic week={week} />

      <p className="rounded-md border-l-4 border-line-strong bg-paper px-3 py-2 text-ink-muted">
        <strong className="text-ink">A caution.</strong> TRIMP is worked out from heart rate, and a chest strap or wrist sensor
        can read high or low; the ratio describes how quickly load rose, it does not predict injury. Sudden jumps in weekly
        distance deserve care, yet how fast a runner can build up differs from one person to the next: a qualified coach decides,
        and a physician for any health concern.
      </p>
    </div>
  );
}

function AcuteChronic({ week }: { week: RunnerWeek }) {
  const acwr = week.acute_chronic_ratio;
  return (
    <div className="flex flex-col gap-1">
      <p className="flex flex-wrap items-baseline gap-x-3">
        <span className="text-xs font-semibold tracking-wide text-ink-muted uppercase">Acute:chronic ratio</span>
        <span className="text-lg font-semibold tabular-nums">
          {acwr?.ratio != null ? acwr.ratio.toFixed(2) : acwr ? acwr.reason : 'not yet'}
        </span>
        {acwr?.ratio != null && acwr.ratio > LOAD_SPIKE_RATIO && <span className="font-semibold text-tartan">above 1.5</span>}
      </p>
      <p className="text-ink-muted">
        This week’s load ÷ the average week of the last four; above 1.5 is a spike worth a look (Gabbett 2016).{' '}
        {!acwr
          ? 'This week has not started, so there is no load to compare yet.'
          : acwr.ratio !== null && acwr.acute_load !== null && acwr.chronic_load !== null
            ? `Here: ${Math.round(acwr.acute_load)} TRIMP in the 7 days to ${formatDay(acwr.end_date)} ÷ ${Math.round(acwr.chronic_load)}, the average week of the 28 days to then.`
            : acwr.reason === 'not enough history'
              ? `Not enough history: it needs runs from at least 28 days before ${formatDay(acwr.end_date)}.`
              : 'No run in the last 28 days has heart rate, so there is nothing to compare.'}
      </p>
    </div>
  );
}
