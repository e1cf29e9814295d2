/** A calendar month: `month` is 1–12. */
export interface YearMonth {
  year: number;
  month: number;
}

const pad = (n: number) => String(n).padStart(2, '0');

/** `YYYY-MM-DD` of a day of a month (no time zones involved). */
export function isoDate(year: number, month: number, day: number): string {
  return `${year}-${pad(month)}-${pad(day)}`;
}

function daysInMonth({ year, month }: YearMonth): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/** First and last `YYYY-MM-DD` of the month, both inclusive (as the runs list's from/to). */
export function monthBounds(ym: YearMonth): { from: string; to: string } {
  return { from: isoDate(ym.year, ym.month, 1), to: isoDate(ym.year, ym.month, daysInMonth(ym)) };
}

/** The month `delta` months after `ym` (negative goes back); crosses years. */
export function shiftMonth(ym: YearMonth, delta: number): YearMonth {
  const index = ym.year * 12 + (ym.month - 1) + delta;
  return { year: Math.floor(index / 12), month: (((index % 12) + 12) % 12) + 1 };
}

/** Parses `YYYY-MM` (month 01–12); null when malformed. */
export function parseYearMonth(text: string | null): YearMonth | null {
  const match = /^(\d{4})-(\d{2})$/.exec(text ?? '');
  if (!match) return null;
  const month = Number(match[2]);
  return month >= 1 && month <= 12 ? { year: Number(match[1]), month } : null;
}

/** `YYYY-MM`. */
export function formatYearMonth({ year, month }: YearMonth): string {
  return `${year}-${pad(month)}`;
}

/**
 * The month as weeks of seven days, Monday first (ISO 8601): each cell is the day's `YYYY-MM-DD`,
 * or null for days of the neighbouring months. Four to six weeks.
 */
export function monthWeeks(ym: YearMonth): Array<Array<string | null>> {
  const firstWeekday = (new Date(Date.UTC(ym.year, ym.month - 1, 1)).getUTCDay() + 6) % 7; // 0 = Monday
  const days = daysInMonth(ym);
  const cells: Array<string | null> = Array.from({ length: firstWeekday }, () => null);
  for (let day = 1; day <= days; day++) cells.push(isoDate(ym.year, ym.month, day));
  while (cells.length % 7 !== 0) cells.push(null);
  const weeks: Array<Array<string | null>> = [];
  for (let i = 0; i < cells.length; i += 7) weeks.push(cells.slice(i, i + 7));
  return weeks;
}

/** Column heads of a Monday-first calendar: short label and the full name for screen readers. */
export const CALENDAR_WEEKDAYS = [
  ['Mo', 'Monday'],
  ['Tu', 'Tuesday'],
  ['We', 'Wednesday'],
  ['Th', 'Thursday'],
  ['Fr', 'Friday'],
  ['Sa', 'Saturday'],
  ['Su', 'Sunday'],
] as const;
