import { calendarDaysAgo } from '../../../../shared/runs/local-time.ts';
import { addDays } from '../../../../shared/weeks/weeks.ts';

const DAY_SHORT = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });
const DAY_LONG = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', timeZone: 'UTC' });
const DAY_MONTH = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', timeZone: 'UTC' });

/** "Mon 7 Dec" (or "Monday 7 December" when `long`) for a `YYYY-MM-DD`. */
export function formatDay(date: string, long = false): string {
  return (long ? DAY_LONG : DAY_SHORT).format(new Date(`${date}T00:00:00Z`));
}

/** "7 Dec" for a `YYYY-MM-DD`. */
export function formatDayMonth(date: string): string {
  return DAY_MONTH.format(new Date(`${date}T00:00:00Z`));
}

/** "Mon 28 Sep – Sun 4 Oct 2026" for the week starting `start`. */
export function formatWeekRange(start: string): string {
  const end = addDays(start, 6);
  return `${formatDay(start)} – ${formatDay(end)} ${end.slice(0, 4)}`;
}

/**
 * When something last happened, in calendar days of the profile's time zone (the instant and today both
 * read there, never on the device's clock zone): "today", "yesterday", "3 days ago"; "never" for null.
 * Counted in dates, not hours, so last night's upload is "yesterday".
 */
export function formatDaysAgo(iso: string | null, timeZone: string, now: number = Date.now()): string {
  if (!iso) return 'never';
  const days = calendarDaysAgo(Date.parse(iso), timeZone, now);
  if (days <= 0) return 'today';
  if (days === 1) return 'yesterday';
  return `${days} days ago`;
}

/** Short words for each flag; the week review shows the full reason beside them. */
const FLAG_WORDS: Record<string, string> = {
  'volume-jump': 'weekly distance up',
  'load-spike': 'load rose quickly',
  'easy-too-fast': 'easy run too fast',
  'long-run-missed': 'long run missed',
};

export function flagWords(code: string): string {
  return FLAG_WORDS[code] ?? code.replace(/-/g, ' ');
}
