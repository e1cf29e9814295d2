/**
 * The one CSV writer of the app: every CSV it produces (splits.csv, plan-check.csv, week.csv, overview.csv, and
 * runs.csv / splits-mi.csv / splits-km.csv in the export) is built from these cells. RFC 4180: a cell holding a
 * comma, quote or line break is quoted with quotes doubled; lines end with CRLF.
 *
 * Formula injection (OWASP, "CSV Injection"): a text cell starting with `=`, `+`, `-`, `@`, tab or carriage return
 * gets a leading apostrophe, so a spreadsheet shows it as text instead of running it. Numbers are the exception:
 * a cell the app formats itself from a finite number (`-12.5`) is written as it is, so genuine negative numbers
 * stay numeric in the runner's spreadsheet. That is safe because such a cell can only be `-?digits[.digits]`, which
 * no spreadsheet reads as a formula (a lone minus sign and digits evaluate to that number, nothing else). Text that
 * merely looks like a number (a run named "-5") is text and is defused like any other.
 */

/** A number formatted by the app; written verbatim. Build it with `csvNumber`. */
export interface CsvNumber {
  readonly csvNumber: string;
}

export type CsvValue = string | number | CsvNumber | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]/;
const PLAIN_NUMBER = /^-?\d+(\.\d+)?$/;
export const CSV_LINE_END = '\r\n';

/**
 * A number with `decimals` decimals (`toFixed`), or null (an empty cell) when the value is missing or not finite.
 * Example: csvNumber(-3.14159, 1) → a cell "-3.1".
 */
export function csvNumber(value: number | null | undefined, decimals: number): CsvNumber | null {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  return { csvNumber: value.toFixed(decimals) };
}

/** Text as a cell: formula starts defused with a leading apostrophe, then quoted when needed. */
export function csvText(value: string): string {
  const safe = FORMULA_START.test(value) ? `'${value}` : value;
  return NEEDS_QUOTES.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * One cell. Missing values and non-finite numbers are empty; finite numbers and `csvNumber`s are written as plain
 * numbers; everything else is text (`csvText`). A number whose text is not a plain decimal (1e+21) is treated as text.
 */
export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return '';
    const text = String(value);
    return PLAIN_NUMBER.test(text) ? text : csvText(text);
  }
  if (typeof value === 'object') return PLAIN_NUMBER.test(value.csvNumber) ? value.csvNumber : csvText(value.csvNumber);
  return csvText(value);
}

/** One CSV line with its CRLF. */
export function csvLine(values: readonly CsvValue[]): string {
  return values.map(csvCell).join(',') + CSV_LINE_END;
}

/** A whole CSV: the header line, then one line per row. */
export function toCsv(header: readonly string[], rows: ReadonlyArray<readonly CsvValue[]>): string {
  return csvLine(header) + rows.map(csvLine).join('');
}
