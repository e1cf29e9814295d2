import { formatPace } from '../tracks/format.ts';
import type { Split, SplitUnit } from '../tracks/types.ts';
import { SPLIT_UNIT_M } from '../tracks/splits.ts';

/** The columns promised in api-contract.md, in order; more may follow, never fewer. */
export const SPLITS_CSV_COLUMNS = [
  'split',
  'unit',
  'distance',
  'elapsed_s',
  'moving_s',
  'pace',
  'avg_hr',
  'max_hr',
  'elev_gain_m',
  'elev_loss_m',
] as const;

const EXTRA_COLUMNS = ['flat_pace', 'avg_cadence'] as const;

function fixed(value: number | null, decimals: number): string {
  return value === null || !Number.isFinite(value) ? '' : value.toFixed(decimals);
}

/**
 * Splits as CSV (api-contract.md): a header row then one row per split. `distance` in `unit`
 * with 3 decimals, times in seconds with 1 decimal, pace `m:ss` per unit from moving time,
 * empty cells where a value is unknown. Lines end with CRLF (RFC 4180).
 */
export function splitsToCsv(splits: readonly Split[], unit: SplitUnit): string {
  const unitM = SPLIT_UNIT_M[unit];
  const rows = splits.map((s) =>
    [
      String(s.index),
      unit,
      (s.distance_m / unitM).toFixed(3),
      fixed(s.elapsed_s, 1),
      fixed(s.moving_s, 1),
      formatPace(s.pace_s),
      fixed(s.avg_hr === null ? null : Math.round(s.avg_hr), 0),
      fixed(s.max_hr === null ? null : Math.round(s.max_hr), 0),
      fixed(s.elev_gain_m, 1),
      fixed(s.elev_loss_m, 1),
      formatPace(s.flat_pace_s),
      fixed(s.avg_cad === null ? null : Math.round(s.avg_cad), 0),
    ].join(','),
  );
  return [[...SPLITS_CSV_COLUMNS, ...EXTRA_COLUMNS].join(','), ...rows].join('\r\n') + '\r\n';
}
