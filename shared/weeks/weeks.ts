/**
 * Calendar weeks on plain dates `YYYY-MM-DD` (the runner's local dates). Arithmetic is done on the
 * date at UTC midnight, so no time zone or clock change can shift a day.
 */

const DAY_MS = 86_400_000;
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;
/** Days per month in a common year (the proleptic Gregorian calendar, as `Date` uses). */
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Day of the week: 0 = Sunday … 6 = Saturday (as `Date#getUTCDay`). */
export type Weekday = 0 | 1 | 2 | 3 | 4 | 5 | 6;

/** Weeks start on Monday unless the runner chooses another day. */
export const DEFAULT_WEEK_STARTS_ON: Weekday = 1;

/** True when `text` is a real calendar date `YYYY-MM-DD` ('2027-02-29' is not). */
export function isIsoDate(text: string): boolean {
  if (!ISO_DATE.test(text)) return false;
  // Arithmetic rather than a round trip through Date: every date step of a week review passes here.
  const year = Number(text.slice(0, 4));
  const month = Number(text.slice(5, 7));
  const day = Number(text.slice(8, 10));
  if (month < 1 || month > 12 || day < 1) return false;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  return day <= (month === 2 && leap ? 29 : DAYS_IN_MONTH[month - 1]!);
}

/** The date `days` after `date` (negative goes back). Throws RangeError for an invalid date or a non-integer count. */
export function addDays(date: string, days: number): string {
  if (!Number.isInteger(days)) throw new RangeError(`addDays: ${days} is not a whole number of days`);
  const [year, month, day] = civilFromDays(daysFromCivil(date) + days);
  if (year < 0 || year > 9999) return new Date(toUtcMs(date) + days * DAY_MS).toISOString().slice(0, 10);
  return `${String(year).padStart(4, '0')}-${month < 10 ? '0' : ''}${month}-${day < 10 ? '0' : ''}${day}`;
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
  return daysFromCivil(date) * DAY_MS;
}

/*
 * Day numbers by arithmetic (H. Hinnant, "chrono-compatible low-level date algorithms"), not through
 * Date and its string forms: a squad overview steps through a few thousand dates.
 */

/** Days from 1970-01-01 to `date` in the proleptic Gregorian calendar (as `Date` counts). */
function daysFromCivil(date: string): number {
  if (!isIsoDate(date)) throw new RangeError(`not a calendar date YYYY-MM-DD: '${date}'`);
  const month = Number(date.slice(5, 7));
  const year = Number(date.slice(0, 4)) - (month <= 2 ? 1 : 0);
  const era = Math.floor(year / 400);
  const yearOfEra = year - era * 400;
  const dayOfYear = Math.floor((153 * ((month + 9) % 12) + 2) / 5) + Number(date.slice(8, 10)) - 1; // from 1 March
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146097 + dayOfEra - 719468;
}

/** [year, month 1–12, day 1–31] of a day number from `daysFromCivil`. */
function civilFromDays(days: number): [number, number, number] {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const dayOfEra = z - era * 146097;
  const yearOfEra = Math.floor(
    (dayOfEra - Math.floor(dayOfEra / 1460) + Math.floor(dayOfEra / 36524) - Math.floor(dayOfEra / 146096)) / 365,
  );
  const dayOfYear = dayOfEra - (365 * yearOfEra + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100));
  const shifted = Math.floor((5 * dayOfYear + 2) / 153); // months from March
  const day = dayOfYear - Math.floor((153 * shifted + 2) / 5) + 1;
  const month = shifted < 10 ? shifted + 3 : shifted - 9;
  return [yearOfEra + era * 400 + (month <= 2 ? 1 : 0), month, day];
}
