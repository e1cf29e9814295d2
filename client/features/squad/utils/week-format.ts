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
