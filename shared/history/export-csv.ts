import { formatPace } from '../tracks/format.ts';
import type { Split, SplitUnit } from '../tracks/types.ts';
import { splitsToCsv } from '../runs/splits-csv.ts';

/** A run as the export's runs.csv needs it (units: metres, seconds, beats per minute). */
export interface ExportRun {
  id: string;
  name: string;
  local_date: string;
  local_time: string;
  time_zone: string;
  distance_m: number;
  elapsed_s: number;
  moving_s: number;
  ascent_m: number | null;
  descent_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
  /** Path of the run's original file inside the export. */
  original_file: string;
}

export const RUNS_CSV_COLUMNS = [
  'run_id',
  'name',
  'local_date',
  'local_time',
  'time_zone',
  'distance_m',
  'elapsed_s',
  'moving_s',
  'pace_per_km',
  'pace_per_mi',
  'ascent_m',
  'descent_m',
  'avg_hr',
  'max_hr',
  'original_file',
] as const;

const CRLF = '\r\n';

/** One CSV cell (RFC 4180): quoted when it holds a comma, quote or line break; formula starts are defused. */
export function csvCell(value: string): string {
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

function fixed(value: number | null, decimals: number): string {
  return value === null || !Number.isFinite(value) ? '' : value.toFixed(decimals);
}

function paceOf(run: ExportRun, unitM: number): string {
  return run.moving_s > 0 && run.distance_m > 0 ? formatPace(run.moving_s / (run.distance_m / unitM)) : '';
}

export function runsCsvHeader(): string {
  return RUNS_CSV_COLUMNS.join(',') + CRLF;
}

/** One runs.csv line (with its CRLF). Pace is from moving time, `m:ss` per km and per mile. */
export function runCsvLine(run: ExportRun): string {
  return (
    [
      run.id,
      csvCell(run.name),
      run.local_date,
      run.local_time,
      run.time_zone,
      fixed(run.distance_m, 1),
      fixed(run.elapsed_s, 1),
      fixed(run.moving_s, 1),
      paceOf(run, 1000),
      paceOf(run, 1609.344),
      fixed(run.ascent_m, 1),
      fixed(run.descent_m, 1),
      fixed(run.avg_hr === null ? null : Math.round(run.avg_hr), 0),
      fixed(run.max_hr === null ? null : Math.round(run.max_hr), 0),
      csvCell(run.original_file),
    ].join(',') + CRLF
  );
}

/** The header of splits-mi.csv / splits-km.csv: `run_id` then the columns of one run's splits CSV. */
export function allSplitsCsvHeader(unit: SplitUnit): string {
  return `run_id,${splitsToCsv([], unit).split(CRLF)[0]!}${CRLF}`;
}

/** A run's split lines for the all-runs CSV: exactly its splits CSV rows, each led by the run id. */
export function allSplitsCsvLines(runId: string, splits: readonly Split[], unit: SplitUnit): string {
  const rows = splitsToCsv(splits, unit).split(CRLF).slice(1, -1);
  return rows.map((row) => `${runId},${row}${CRLF}`).join('');
}

/** A name safe inside a zip and on any disk: letters, digits, dot, dash and underscore only. */
export function safeFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const cleaned = base
    .replace(/[^A-Za-z0-9._-]+/g, '_')
    .replace(/^[._]+/, '')
    .slice(-100);
  return cleaned || 'file';
}
