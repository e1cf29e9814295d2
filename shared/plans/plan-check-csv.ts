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

const num = (v: number | null | undefined, decimals: number) =>
  v === null || v === undefined || !Number.isFinite(v) ? '' : v.toFixed(decimals);

/** The plan check as CSV: one row per expanded part, paces in seconds per km, CRLF line ends (RFC 4180). */
export function planCheckToCsv(parts: readonly PartCheck[]): string {
  const rows = parts.map((p) =>
    [
      String(p.index + 1),
      p.kind,
      num(p.planned.distance_m, 1),
      num(p.planned.duration_s, 0),
      num(p.planned.pace_fast_s_per_km, 1),
      num(p.planned.pace_slow_s_per_km, 1),
      num(p.actual.distance_m, 1),
      num(p.actual.duration_s, 1),
      num(p.actual.pace_s_per_km, 1),
      num(p.actual.avg_hr === null ? null : Math.round(p.actual.avg_hr), 0),
      num(p.difference_s_per_km, 1),
      p.verdict,
    ].join(','),
  );
  return [COLUMNS.join(','), ...rows].join('\r\n') + '\r\n';
}
