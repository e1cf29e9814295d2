/**
 * The calendar date (`YYYY-MM-DD`) and wall-clock time (`HH:mm`) of an instant in an IANA time zone.
 * A run belongs to the local date on which it started, wherever in the world that was.
 */
export function localDateTime(epochMs: number, timeZone: string): { date: string; time: string } {
  const parts = formatterFor(timeZone).formatToParts(new Date(epochMs));
  const get = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  return { date: `${get('year')}-${get('month')}-${get('day')}`, time: `${get('hour')}:${get('minute')}` };
}

/** One formatter per time zone: building one costs far more than formatting (a squad overview asks 50 times). */
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-CA', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

/**
 * Today as `YYYY-MM-DD` in a profile's time zone, not the device's (issue 17): the one "today" of the
 * screens and the server, the same zone runs are dated in, even when a phone is set to another zone.
 */
export function todayIn(timeZone: string, now: number = Date.now()): string {
  return localDateTime(now, timeZone).date;
}

const DAY_MS = 86_400_000;

/** Whole calendar days from one `YYYY-MM-DD` to another (negative when `to` is earlier); no time zone involved. */
export function calendarDaysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** How many calendar days ago an instant was, both days read in `timeZone`: 0 today, 1 yesterday. */
export function calendarDaysAgo(at: number, timeZone: string, now: number = Date.now()): number {
  return calendarDaysBetween(localDateTime(at, timeZone).date, todayIn(timeZone, now));
}
