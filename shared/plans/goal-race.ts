import { HALF_MARATHON_M, MARATHON_M } from '../units.ts';

const DAY_MS = 86_400_000;
/** Race distances within 1 % under the standard one count as it (a course measured a little short). */
const DISTANCE_SLACK = 0.99;

/** Calendar days since 1970-01-01 of a `YYYY-MM-DD`; NaN when malformed. */
function dayNumber(date: string): number {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(date)) return Number.NaN;
  const ms = Date.parse(`${date}T00:00:00Z`);
  return Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== date ? Number.NaN : ms / DAY_MS;
}

/**
 * Whole calendar days from `today` to `raceDate` (both `YYYY-MM-DD`, no time zones): 0 on race day,
 * negative once the race is past, NaN when either date is malformed.
 * Example: ('2026-12-01', '2027-04-18') → 138.
 */
export function daysToRace(today: string, raceDate: string): number {
  return dayNumber(raceDate) - dayNumber(today);
}

/**
 * Weeks of taper before a race of `distanceM` metres. Common practice, not a published rule: about
 * three weeks before a marathon (and anything longer), two before a half marathon (up to the
 * marathon), one before shorter races. A coach may well choose otherwise.
 */
export function taperWeeks(distanceM: number): number {
  if (distanceM >= MARATHON_M * DISTANCE_SLACK) return 3;
  if (distanceM >= HALF_MARATHON_M * DISTANCE_SLACK) return 2;
  return 1;
}

/**
 * Which week of the taper `today` falls in, counting the 7-day blocks that end the day before the
 * race: for a marathon, 21–15 days out is week 1 of 3, 14–8 days out week 2, 7–1 days out week 3.
 * Null before the taper, on race day, after it, or for malformed dates.
 */
export function taperWeek(today: string, raceDate: string, distanceM: number): { week: number; of: number } | null {
  const days = daysToRace(today, raceDate);
  const of = taperWeeks(distanceM);
  if (!Number.isFinite(days) || days < 1 || days > of * 7) return null;
  return { week: of - Math.floor((days - 1) / 7), of };
}
