import type { RunRow } from '../../lib/db.ts';
import type { RunListItem } from '../../../shared/runs/schemas.ts';

// A run as a list shows it (the runs list, a week's days): part of the runs feature's face, because the
// week review reads its runs with these columns in its own query.

/** The columns a run list item is made of (reading only these skips the track details on long lists). */
export const RUN_LIST_COLUMNS = [
  'id',
  'name',
  'started_at',
  'local_date',
  'local_time',
  'time_zone',
  'distance_m',
  'elapsed_s',
  'moving_s',
  'ascent_m',
  'avg_hr',
  'activity_kind',
] as const satisfies ReadonlyArray<keyof RunRow>;

export type RunListRow = Pick<RunRow, (typeof RUN_LIST_COLUMNS)[number]>;

export function toRunListItem(row: RunListRow): RunListItem {
  return {
    id: row.id,
    name: row.name,
    started_at: row.started_at.toISOString(),
    local_date: row.local_date,
    local_time: row.local_time,
    time_zone: row.time_zone,
    distance_m: row.distance_m,
    elapsed_s: row.elapsed_s,
    moving_s: row.moving_s,
    pace_s_per_km: row.moving_s > 0 && row.distance_m > 0 ? row.moving_s / (row.distance_m / 1000) : null,
    ascent_m: row.ascent_m,
    avg_hr: row.avg_hr,
    kind: row.activity_kind,
  };
}
