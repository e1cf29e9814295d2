import { formatDistance, formatPaceIn, formatRunStart } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { RunSummary as Summary } from '../../../../shared/runs/types.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { CLIMB_UNIT, climbIn } from '../../../../shared/units.ts';

/** Start time in words, then the run's figures on one wrapping line. */
export function RunSummary({ summary, unit }: { summary: Summary; unit: Unit }) {
  const figures: Array<{ label: string; value: string }> = [
    { label: 'Distance', value: `${formatDistance(summary.distance_m, unit)} ${unit}` },
    { label: 'Moving', value: formatDuration(summary.moving_s) },
    { label: 'Clock', value: formatDuration(summary.elapsed_s) },
    {
      label: 'Pace',
      value: summary.pace_s_per_km === null ? '–' : formatPaceIn(summary.pace_s_per_km, unit),
    },
  ];
  if (summary.ascent_m !== null || summary.descent_m !== null)
    figures.push({
      label: 'Climb / descent',
      // Feet with miles, metres with kilometres: one unit choice for every figure (issue 17).
      value: `↑ ${climbIn(summary.ascent_m ?? 0, unit)} ${CLIMB_UNIT[unit]} ↓ ${climbIn(summary.descent_m ?? 0, unit)} ${CLIMB_UNIT[unit]}`,
    });
  if (summary.avg_hr !== null)
    figures.push({
      label: 'Heart rate',
      value: `♥ ${Math.round(summary.avg_hr)} avg${summary.max_hr !== null ? ` · ${Math.round(summary.max_hr)} max` : ''}`,
    });

  return (
    <div>
      <p className="text-ink-muted">
        <time dateTime={summary.started_at}>{formatRunStart(summary.local_date, summary.local_time, summary.time_zone)}</time>
      </p>
      <dl className="mt-3 flex flex-wrap gap-x-6 gap-y-2 tabular-nums">
        {figures.map((figure) => (
          <div key={figure.label} className="flex flex-col">
            <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{figure.label}</dt>
            <dd className="text-lg font-semibold">{figure.value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
