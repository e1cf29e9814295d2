/**
 * Calendar weeks on plain dates `YYYY-MM-DD` (the runner's local dates). Arithmetic is done on the
 * date at UTC midnight, so no time zone or clock change can shift a day.
 */

const DAY_MS = 86_400_000;
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** Day of the week: 0 = Sunday … 6 = Saturday (as `Date#getUTCDay`). */
export type Weekday = 0 | 1 | 2 | 3 | 4 | 5 | 6;

/** Weeks start on Monday unless the runner chooses another day. */
export const DEFAULT_WEEK_STARTS_ON: Weekday = 1;

/** True when `text` is a real calendar date `YYYY-MM-DD` ('2027-02-29' is not). */
export function isIsoDate(text: string): boolean {
  if (!ISO_DATE.test(text)) return false;
  const ms = Date.parse(`${text}T00:00:00Z`);
  return !Number.isNaN(ms) && new Date(ms).toISOString().slice(0, 10) === text;
}

/** The date `days` after `date` (negative goes back). Throws RangeError for an invalid date or a non-integer count. */
export function addDays(date: string, days: number): string {
  if (!Number.isInteger(days)) throw new RangeError(`addDays: ${days} is not a whole number of days`);
  return new Date(toUtcMs(date) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `from` to `to` (negative when `to` is earlier). Throws RangeError for invalid dates. */
export function daysBetween(from: string, to: string): number {
  return Math.round((toUtcMs(to) - toUtcMs(from)) / DAY_MS);
}

/** Day of the week of `date`, 0 = Sunday. Throws RangeError for an invalid date. */
export function dayOfWeek(date: string): Weekday {
  return new Date(toUtcMs(date)).getUTCDay() as Weekday;
}

/**
 * First day of the week holding `date`, for weeks starting on `weekStartsOn` (0 = Sunday,
 * 1 = Monday, the default, … 6 = Saturday). Throws RangeError for an invalid date or weekday.
 */
export function weekStart(date: string, weekStartsOn: number = DEFAULT_WEEK_STARTS_ON): string {
  if (!Number.isInteger(weekStartsOn) || weekStartsOn < 0 || weekStartsOn > 6) {
    throw new RangeError(`weekStart: weekStartsOn must be 0–6, got ${weekStartsOn}`);
  }
  const back = (dayOfWeek(date) - weekStartsOn + 7) % 7;
  return addDays(date, -back);
}

/** The seven dates of the week starting `start`, in order. Throws RangeError for an invalid date. */
export function weekDates(start: string): string[] {
  return Array.from({ length: 7 }, (_, i) => addDays(start, i));
}

function toUtcMs(date: string): number {
  if (!isIsoDate(date)) throw new RangeError(`not a calendar date YYYY-MM-DD: '${date}'`);
  return Date.parse(`${date}T00:00:00Z`);
}
