import { CSV_LINE_END, csvCell, csvLine, csvNumber } from '../csv/csv-writer.ts';
import { UNIT_METRES } from '../units.ts';
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

const CRLF = CSV_LINE_END;

function paceOf(run: ExportRun, unitM: number): string {
  return run.moving_s > 0 && run.distance_m > 0 ? formatPace(run.moving_s / (run.distance_m / unitM)) : '';
}

export function runsCsvHeader(): string {
  return csvLine(RUNS_CSV_COLUMNS);
}

/** One runs.csv line (with its CRLF), by the app's one CSV writer. Pace is from moving time, `m:ss` per km and per mile. */
export function runCsvLine(run: ExportRun): string {
  return csvLine([
    run.id,
    run.name,
    run.local_date,
    run.local_time,
    run.time_zone,
    csvNumber(run.distance_m, 1),
    csvNumber(run.elapsed_s, 1),
    csvNumber(run.moving_s, 1),
    paceOf(run, UNIT_METRES.km),
    paceOf(run, UNIT_METRES.mi),
    csvNumber(run.ascent_m, 1),
    csvNumber(run.descent_m, 1),
    csvNumber(run.avg_hr === null ? null : Math.round(run.avg_hr), 0),
    csvNumber(run.max_hr === null ? null : Math.round(run.max_hr), 0),
    run.original_file,
  ]);
}

/** The header of splits-mi.csv / splits-km.csv: `run_id` then the columns of one run's splits CSV. */
export function allSplitsCsvHeader(unit: SplitUnit): string {
  return `${csvCell('run_id')},${splitsToCsv([], unit).split(CRLF)[0]!}${CRLF}`;
}

/** A run's split lines for the all-runs CSV: exactly its splits CSV rows, each led by the run id. */
export function allSplitsCsvLines(runId: string, splits: readonly Split[], unit: SplitUnit): string {
  const rows = splitsToCsv(splits, unit).split(CRLF).slice(1, -1);
  return rows.map((row) => `${csvCell(runId)},${row}${CRLF}`).join('');
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
