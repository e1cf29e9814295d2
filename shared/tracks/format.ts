import { METRES_PER_MILE } from '../units.ts';

/**
 * Pace as `m:ss` from seconds (per whatever unit the caller uses), rounded to the nearest
 * second; an hour or more shows as `h:mm:ss`. Null, NaN, infinite or negative input gives ''.
 * Examples: 482.8 → "8:03", 59.6 → "1:00", 3600 → "1:00:00".
 */
export function formatPace(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds) || seconds < 0) return '';
  return formatClock(Math.round(seconds));
}

/**
 * A duration as `m:ss` or `h:mm:ss`, rounded to the nearest second; invalid input gives ''.
 * Examples: 0 → "0:00", 754.4 → "12:34", 3725 → "1:02:05".
 */
export function formatDuration(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds) || seconds < 0) return '';
  return formatClock(Math.round(seconds));
}

function formatClock(total: number): string {
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** Seconds per km → seconds per mile (× 1.609344). */
export function paceKmToMile(secondsPerKm: number): number {
  return secondsPerKm * (METRES_PER_MILE / 1000);
}

/** Seconds per mile → seconds per km (÷ 1.609344). */
export function paceMileToKm(secondsPerMile: number): number {
  return secondsPerMile / (METRES_PER_MILE / 1000);
}
