import { calendarDaysAgo } from '../../shared/runs/local-time.ts';

/**
 * Dates and times on the screens, always read in a named IANA time zone (client/README.md, "Whose clock").
 * Anything a runner did (a run, a note, a check-in, a review of their week) is read in the runner's zone, the one
 * the server dates their runs and weeks in; account-level moments (a token made, a mail sent) in this device's.
 */

export type Shape = 'date' | 'date-time' | 'time';

const SHAPES: Record<Shape, Intl.DateTimeFormatOptions> = {
  date: { day: 'numeric', month: 'short', year: 'numeric' },
  'date-time': { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
  time: { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
};

/** One formatter per shape and zone: building one costs far more than formatting with it. */
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(shape: Shape, timeZone: string): Intl.DateTimeFormat {
  const key = `${shape}|${timeZone}`;
  let formatter = formatters.get(key);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-GB', { ...SHAPES[shape], timeZone });
    formatters.set(key, formatter);
  }
  return formatter;
}

/** The zone this device's clock is set to (a travelling phone may be set to another zone than its owner's profile). */
export function deviceTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

/** An instant in `timeZone`: "3 Oct 2026" (date), "3 Oct 2026, 07:05" (date-time) or "07:05" (time). */
export function formatInZone(iso: string, timeZone: string, shape: Shape): string {
  return formatterFor(shape, timeZone).format(new Date(iso));
}

/** "3 Oct 2026" in `timeZone`. */
export function formatDate(iso: string, timeZone: string): string {
  return formatInZone(iso, timeZone, 'date');
}

/** "3 Oct 2026, 07:05" in `timeZone`. */
export function formatDateTime(iso: string, timeZone: string): string {
  return formatInZone(iso, timeZone, 'date-time');
}

/** An account-level moment (a token made, a mail caught) on this device's clock; say so once near it (DeviceClockNote). */
export function formatOnDevice(iso: string, shape: Shape = 'date'): string {
  return formatInZone(iso, deviceTimeZone(), shape);
}

/**
 * Whether an instant written in `timeZone` would read otherwise on a clock set to `viewerZone`: only then does
 * the screen say whose clock it is. Compares what is shown, not zone names: two zones with the same offset at
 * that moment (or a date shown without its time that falls on the same day in both) need no words.
 */
export function readsDifferently(iso: string, timeZone: string, viewerZone: string, shape: Shape): boolean {
  return formatInZone(iso, timeZone, shape) !== formatInZone(iso, viewerZone, shape);
}

/**
 * When something last happened, in calendar days of `timeZone` (the instant and today both read there, never
 * on the device's clock): "today", "yesterday", "3 days ago"; "never" for null. Counted in dates, not hours, so
 * last night's upload is "yesterday".
 */
export function formatDaysAgo(iso: string | null, timeZone: string, now: number = Date.now()): string {
  if (!iso) return 'never';
  const days = calendarDaysAgo(Date.parse(iso), timeZone, now);
  if (days <= 0) return 'today';
  if (days === 1) return 'yesterday';
  return `${days} days ago`;
}

/** Whether "… days ago" counted on `timeZone`'s calendar would read otherwise on `viewerZone`'s (readsDifferently's twin). */
export function daysAgoReadsDifferently(
  iso: string | null,
  timeZone: string,
  viewerZone: string,
  now: number = Date.now(),
): boolean {
  return formatDaysAgo(iso, timeZone, now) !== formatDaysAgo(iso, viewerZone, now);
}

/**
 * Whose clock a time is read on, in words, shown after the time when the viewer's clock would read it
 * otherwise: "runner's clock, America/Chicago" to a coach, "America/Chicago clock" to the runner themselves.
 */
export function whoseClock(timeZone: string, viewerIsRunner: boolean): string {
  return viewerIsRunner ? `${timeZone} clock` : `runner's clock, ${timeZone}`;
}

/** A duration in words rounded to the minute: "4 h 35 min", "4 h", "50 min". */
export function formatHoursMinutes(seconds: number): string {
  const minutes = Math.round(seconds / 60);
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return h > 0 ? `${h} h${m > 0 ? ` ${m} min` : ''}` : `${m} min`;
}
