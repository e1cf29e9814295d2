import type { CleaningReport, SplitUnit } from '../tracks/types.ts';
import { MAX_SMOOTHED_INTERVAL_S } from '../tracks/position-smoother.ts';
import { formatPace } from '../tracks/format.ts';
import { UNIT_METRES } from '../units.ts';

/**
 * A distance in `unit` as a plain number with `decimals` places (default 2); '' for invalid input.
 * Examples: (11265.408, 'mi') → "7.00", (5000, 'km') → "5.00".
 */
export function formatDistance(metres: number | null, unit: SplitUnit, decimals = 2): string {
  if (metres === null || !Number.isFinite(metres) || metres < 0) return '';
  return (metres / UNIT_METRES[unit]).toFixed(decimals);
}

/**
 * A distance with its unit, one decimal by default: the one "distance with unit" of the week review
 * and the coach's digest. Examples: (24_300, 'km') → "24.3 km", (24_300, 'mi') → "15.1 mi" (the
 * international mile, 1609.344 m); '' for invalid input.
 */
export function formatDistanceIn(metres: number | null, unit: SplitUnit, decimals = 1): string {
  const amount = formatDistance(metres, unit, decimals);
  return amount && `${amount} ${unit}`;
}

/** Seconds per km → seconds per `unit`; null stays null. */
export function pacePerUnit(secondsPerKm: number | null, unit: SplitUnit): number | null {
  if (secondsPerKm === null || !Number.isFinite(secondsPerKm)) return null;
  return unit === 'km' ? secondsPerKm : secondsPerKm * (UNIT_METRES.mi / 1000);
}

/**
 * A pace stored in seconds per km as read in `unit`, with the unit: the one "pace with its unit" of
 * every screen and e-mail. Examples: (300, 'km') → "5:00 /km", (300, 'mi') → "8:03 /mi"; '' for invalid input.
 */
export function formatPaceIn(secondsPerKm: number | null, unit: SplitUnit): string {
  const pace = formatPace(pacePerUnit(secondsPerKm, unit));
  return pace && `${pace} /${unit}`;
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'] as const;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

/**
 * A run's local start as people read it, from the stored local date (`YYYY-MM-DD`), local time
 * (`HH:mm`) and zone: "Sat 28 Nov 2026, 06:30 (America/Chicago)". The weekday is that of the
 * calendar date itself (no time-zone arithmetic). A malformed date is returned as given.
 */
export function formatRunStart(localDate: string, localTime: string, timeZone: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate);
  if (!match) return `${localDate}, ${localTime} (${timeZone})`;
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const weekday = WEEKDAYS[new Date(Date.UTC(year, month - 1, day)).getUTCDay()];
  return `${weekday} ${day} ${MONTHS[month - 1]} ${year}, ${localTime} (${timeZone})`;
}

/** "3 Oct 2026" from `YYYY-MM-DD`, without time zones; a malformed date is returned as given. */
export function formatLocalDate(localDate: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate);
  if (!match) return localDate;
  return `${Number(match[3])} ${MONTHS[Number(match[2]) - 1]} ${match[1]}`;
}

/** `2026-12-04` → `4 Dec` (a phone's date column; the year is in the page's month or list). */
export function formatShortDate(localDate: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate);
  if (!match) return localDate;
  return `${Number(match[3])} ${MONTHS[Number(match[2]) - 1]}`;
}

function plural(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`;
}

const wasOrWere = (count: number) => (count === 1 ? 'was' : 'were');

/**
 * What cleaning the file left out or changed, one sentence per kind, in plain words; empty when
 * nothing was touched. Example: { dropped_backwards: 3 } → ["3 points whose time went backwards were left out."].
 */
export function describeCleaning(report: CleaningReport): string[] {
  const lines: string[] = [];
  const points = (count: number) => plural(count, 'point', 'points');
  if (report.dropped_untimed > 0)
    lines.push(`${points(report.dropped_untimed)} without a time ${wasOrWere(report.dropped_untimed)} left out.`);
  if (report.dropped_backwards > 0)
    lines.push(`${points(report.dropped_backwards)} whose time went backwards ${wasOrWere(report.dropped_backwards)} left out.`);
  if (report.merged_duplicates > 0)
    lines.push(
      `${points(report.merged_duplicates)} with the same time as the point before ${wasOrWere(report.merged_duplicates)} merged into it.`,
    );
  if (report.dropped_no_position > 0)
    lines.push(
      `${points(report.dropped_no_position)} with neither a position nor a distance ${wasOrWere(report.dropped_no_position)} left out.`,
    );
  if (report.invalid_positions > 0)
    lines.push(
      `${points(report.invalid_positions)} had impossible coordinates; ${report.invalid_positions === 1 ? 'its position was' : 'their positions were'} ignored.`,
    );
  return lines;
}

/**
 * One sentence on how a run's distance was measured and what smoothing changed, in `unit`.
 * Examples: smoothed 12 729 m from a 12 900 m point-to-point sum → "Noisy positions (0.31 m of
 * jitter per point) were smoothed before measuring: the distance is 0.11 mi (1.3 %) shorter than the
 * point-to-point sum of 8.02 mi."; a clean track → "Positions were clean (…): measured point to point,
 * no smoothing."; a device distance → "The watch's own distance was used."
 */
export function describeDistanceMeasure(
  report: {
    source: 'device' | 'geodesic' | 'none';
    smoothed: boolean;
    jitter_m: number | null;
    median_interval_s: number | null;
    raw_distance_m: number;
    distance_m: number;
  },
  unit: SplitUnit,
): string {
  if (report.source === 'device') return 'The watch’s own distance was used (no smoothing).';
  if (report.source === 'none') return 'The file has no positions and no device distance.';
  const jitter = report.jitter_m === null ? '' : `${report.jitter_m.toFixed(2)} m of jitter per point`;
  const change = report.distance_m - report.raw_distance_m;
  const share = report.raw_distance_m > 0 ? (Math.abs(change) / report.raw_distance_m) * 100 : 0;
  const amount = `${formatDistance(Math.abs(change), unit)} ${unit} (${share.toFixed(1)} %)`;
  if (!report.smoothed) {
    const sparse = report.median_interval_s !== null && report.median_interval_s > MAX_SMOOTHED_INTERVAL_S;
    const apart = `points ${Math.round(report.median_interval_s!)} s apart`;
    // Sparse tracks are measured along the curve through their points (shared/tracks/README.md).
    if (sparse && share >= 0.05)
      return `Measured along a smooth curve through the points, no smoothing (${apart}): the distance is ${amount} longer than the point-to-point sum of ${formatDistance(report.raw_distance_m, unit)} ${unit}.`;
    return `Measured point to point, no smoothing (${sparse ? apart : `positions clean, ${jitter}`}).`;
  }
  return `Noisy positions (${jitter}) were smoothed before measuring: the distance is ${amount} ${change <= 0 ? 'shorter' : 'longer'} than the point-to-point sum of ${formatDistance(report.raw_distance_m, unit)} ${unit}.`;
}
