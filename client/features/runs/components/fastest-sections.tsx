import { formatDistance, pacePerUnit } from '../../../../shared/runs/display.ts';
import type { FastestSection } from '../../../../shared/runs/types.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { METRES_PER_MILE } from '../../../../shared/units.ts';

const NAMES: Record<number, string> = {
  400: '400 m',
  1000: '1 km',
  [METRES_PER_MILE]: '1 mile',
  5000: '5 km',
  10000: '10 km',
  21097.5: 'Half marathon',
  42195: 'Marathon',
};

/** The quickest stretch of each standard distance inside the run, and where it started. */
export function FastestSections({ sections, unit }: { sections: FastestSection[]; unit: Unit }) {
  if (sections.length === 0) return <p className="text-sm text-ink-muted">The run is shorter than 400 m.</p>;
  return (
    <ul className="flex flex-col text-sm tabular-nums">
      {sections.map((s) => (
        <li key={s.distance_m} className="flex items-baseline justify-between gap-3 border-b border-line py-1 last:border-0">
          <span className="font-semibold whitespace-nowrap">{NAMES[s.distance_m] ?? `${s.distance_m} m`}</span>
          <span className="text-right">
            <span className="font-semibold">{formatDuration(s.time_s)}</span>
            <span className="text-ink-muted">
              {' '}
              · {formatPace(pacePerUnit(s.pace_s_per_km, unit))} /{unit} · from {formatDistance(s.start_distance_m, unit)} {unit}
            </span>
          </span>
        </li>
      ))}
    </ul>
  );
}
