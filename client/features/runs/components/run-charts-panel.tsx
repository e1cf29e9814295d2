import { lazy, Suspense, useMemo } from 'react';
import { buildChartRows, type ChartRow } from '../../../../shared/runs/chart-series.ts';
import type { RunTrack } from '../../../../shared/runs/types.ts';
import { formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';

const RunCharts = lazy(() => import('./run-charts.tsx'));

/** Rows for the table fallback: the nearest point at every quarter of the unit. */
function sampleRows(rows: ChartRow[], stepUnits: number): ChartRow[] {
  const out: ChartRow[] = [];
  let next = 0;
  for (const row of rows) {
    if (row.distance >= next) {
      out.push(row);
      next = Math.floor(row.distance / stepUnits + 1) * stepUnits;
    }
  }
  return out;
}

function range(values: Array<number | null>): [number, number] | null {
  const known = values.filter((v): v is number => v !== null);
  return known.length ? [Math.min(...known), Math.max(...known)] : null;
}

/** The charts (lazy) with a sentence for screen readers and the same figures as a table. */
export function RunChartsPanel({ track, unit }: { track: RunTrack; unit: Unit }) {
  const rows = useMemo(() => buildChartRows(track, unit), [track, unit]);
  if (rows.length < 2) return <p className="text-sm text-ink-muted">Too few points to draw.</p>;
  const total = rows.at(-1)!.distance;
  const pace = range(rows.map((r) => r.pace_s));
  const hr = range(rows.map((r) => r.hr));
  const ele = range(rows.map((r) => r.ele));
  const description = [
    `Over ${total.toFixed(2)} ${unit}:`,
    pace && `pace between ${formatPace(pace[0])} and ${formatPace(pace[1])} per ${unit}`,
    hr && `heart rate between ${Math.round(hr[0])} and ${Math.round(hr[1])} bpm`,
    ele && `elevation between ${Math.round(ele[0])} and ${Math.round(ele[1])} m`,
  ]
    .filter(Boolean)
    .join('; ');
  const step = total > 8 ? 1 : 0.25;
  const sampled = sampleRows(rows, step);

  return (
    <figure className="flex flex-col gap-3">
      <div role="img" aria-label={`${description}. The same figures follow as a table.`}>
        <Suspense fallback={<p className="py-16 text-center text-sm text-ink-muted">Drawing charts…</p>}>
          <RunCharts rows={rows} unit={unit} />
        </Suspense>
      </div>
      <details className="text-sm">
        <summary className="cursor-pointer font-semibold text-teal">The charts’ figures as a table</summary>
        <div className="relative mt-2 max-h-72 overflow-auto">
          <table className="w-full tabular-nums">
            <caption className="sr-only">
              Pace, heart rate and elevation every {step} {unit}
            </caption>
            <thead className="sticky top-0 border-b border-line-strong bg-card text-ink-muted">
              <tr>
                <th scope="col" className="py-1 pr-3 text-right font-semibold">
                  {unit}
                </th>
                <th scope="col" className="py-1 pr-3 text-right font-semibold">
                  Pace /{unit}
                </th>
                <th scope="col" className="py-1 pr-3 text-right font-semibold">
                  Heart rate
                </th>
                <th scope="col" className="py-1 text-right font-semibold">
                  Elevation m
                </th>
              </tr>
            </thead>
            <tbody>
              {sampled.map((row) => (
                <tr key={row.distance} className="border-b border-line last:border-0">
                  <th scope="row" className="py-0.5 pr-3 text-right font-normal">
                    {row.distance.toFixed(2)}
                  </th>
                  <td className="py-0.5 pr-3 text-right">{formatPace(row.pace_s) || '–'}</td>
                  <td className="py-0.5 pr-3 text-right">{row.hr === null ? '–' : Math.round(row.hr)}</td>
                  <td className="py-0.5 text-right">{row.ele === null ? '–' : Math.round(row.ele)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </figure>
  );
}
