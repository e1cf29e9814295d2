import { csvNumber, toCsv } from '../csv/csv-writer.ts';
import type { PartCheck } from './plan-check.ts';

const COLUMNS = [
  'part',
  'kind',
  'planned_distance_m',
  'planned_duration_s',
  'pace_fast_s_per_km',
  'pace_slow_s_per_km',
  'actual_distance_m',
  'actual_duration_s',
  'actual_pace_s_per_km',
  'avg_hr',
  'difference_s_per_km',
  'verdict',
] as const;

/**
 * The plan check as CSV: one row per expanded part, paces in seconds per km (the difference stays a signed number),
 * written by the app's one CSV writer (RFC 4180, CRLF, formula starts defused).
 */
export function planCheckToCsv(parts: readonly PartCheck[]): string {
  // Numbered by row, as the table and the summary count them (a recovery the plan did not write has no row).
  const rows = parts.map((p, row) => [
    row + 1,
    p.kind,
    csvNumber(p.planned.distance_m, 1),
    csvNumber(p.planned.duration_s, 0),
    csvNumber(p.planned.pace_fast_s_per_km, 1),
    csvNumber(p.planned.pace_slow_s_per_km, 1),
    csvNumber(p.actual.distance_m, 1),
    csvNumber(p.actual.duration_s, 1),
    csvNumber(p.actual.pace_s_per_km, 1),
    csvNumber(p.actual.avg_hr === null ? null : Math.round(p.actual.avg_hr), 0),
    csvNumber(p.difference_s_per_km, 1),
    p.verdict,
  ]);
  return toCsv(COLUMNS, rows);
}
