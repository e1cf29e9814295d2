import { csvNumber, toCsv } from '../csv/csv-writer.ts';
import { formatPace } from '../tracks/format.ts';
import type { Split, SplitUnit } from '../tracks/types.ts';
import { UNIT_METRES } from '../units.ts';

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

/**
 * Splits as CSV (api-contract.md): a header row then one row per split. `distance` in `unit`
 * with 3 decimals, times in seconds with 1 decimal, pace `m:ss` per unit from moving time,
 * empty cells where a value is unknown. Written by the app's one CSV writer (shared/csv/csv-writer.ts).
 */
export function splitsToCsv(splits: readonly Split[], unit: SplitUnit): string {
  const unitM = UNIT_METRES[unit];
  const rows = splits.map((s) => [
    s.index,
    unit,
    csvNumber(s.distance_m / unitM, 3),
    csvNumber(s.elapsed_s, 1),
    csvNumber(s.moving_s, 1),
    formatPace(s.pace_s),
    csvNumber(s.avg_hr === null ? null : Math.round(s.avg_hr), 0),
    csvNumber(s.max_hr === null ? null : Math.round(s.max_hr), 0),
    csvNumber(s.elev_gain_m, 1),
    csvNumber(s.elev_loss_m, 1),
    formatPace(s.flat_pace_s),
    csvNumber(s.avg_cad === null ? null : Math.round(s.avg_cad), 0),
  ]);
  return toCsv([...SPLITS_CSV_COLUMNS, ...EXTRA_COLUMNS], rows);
}
