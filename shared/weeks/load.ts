/**
 * Acute:chronic workload ratio (Gabbett, T. J. 2016, "The training–injury prevention paradox",
 * Br J Sports Med 50:273–280), as usually computed with rolling sums:
 *
 * - acute load = the sum of the last 7 days, ending on (and including) the end date;
 * - chronic load = the mean weekly load of the last 28 days = (sum of the 28 days) / 4;
 * - ratio = acute / chronic.
 *
 * Windows are **coupled**: the acute week is one of the four chronic weeks. (Uncoupled would take the
 * chronic load from the 4 weeks before the acute week; the same history can then read 1.33 coupled
 * and 1.50 uncoupled.) A coupled ratio can never exceed 4. Lolli et al. (2019) and Impellizzeri et
 * al. (2020) question what the ratio predicts, so present it as a description of how quickly load
 * rose, not as an injury forecast. The load unit is the caller's (TRIMP, distance, minutes).
 */
import { addDays, daysBetween } from './weeks.ts';

export const ACUTE_DAYS = 7;
export const CHRONIC_DAYS = 28;

export interface DailyLoad {
  /** Local date `YYYY-MM-DD`. */
  date: string;
  /** Load of that day, ≥ 0, in any unit. */
  load: number;
}

export type AcuteChronicReason = 'not enough history' | 'no load in the last 28 days';

export interface AcuteChronic {
  /** Last day of the acute week. */
  end_date: string;
  /** acute / chronic, or null (see `reason`). */
  ratio: number | null;
  /** Sum of the 7 days ending on `end_date`, or null with `reason` 'not enough history'. */
  acute_load: number | null;
  /** Sum of the 28 days ending on `end_date`, divided by 4 (a mean week), or null with 'not enough history'. */
  chronic_load: number | null;
  window: 'coupled';
  /** Why `ratio` is null; null when there is a ratio. */
  reason: AcuteChronicReason | null;
}

/**
 * The coupled acute:chronic ratio on `endDate`. Pass one entry per day (0 on rest days) from the
 * first day you hold data for; days missing inside the window count as 0, several entries on one date
 * add up, and entries after `endDate` are ignored. History starts at the earliest date listed: when
 * that is later than the first day of the 28-day window the ratio is null, "not enough history";
 * when the 28 days hold no load it is null, "no load in the last 28 days".
 * Throws RangeError for an invalid date or a negative or non-finite load.
 */
export function acuteChronicRatio(dailyLoads: readonly DailyLoad[], endDate: string): AcuteChronic {
  const chronicStart = addDays(endDate, -(CHRONIC_DAYS - 1));
  let earliest: string | null = null;
  let acute = 0;
  let chronicSum = 0;
  for (const { date, load } of dailyLoads) {
    if (!Number.isFinite(load) || load < 0) throw new RangeError(`load on ${date} must be a number ≥ 0, got ${load}`);
    const back = daysBetween(date, endDate);
    if (earliest === null || date < earliest) earliest = date;
    if (back < 0 || back >= CHRONIC_DAYS) continue;
    chronicSum += load;
    if (back < ACUTE_DAYS) acute += load;
  }
  const base = { end_date: endDate, window: 'coupled' as const };
  if (earliest === null || earliest > chronicStart) {
    return { ...base, ratio: null, acute_load: null, chronic_load: null, reason: 'not enough history' };
  }
  const chronic = chronicSum / (CHRONIC_DAYS / ACUTE_DAYS);
  if (chronicSum === 0) {
    return { ...base, ratio: null, acute_load: acute, chronic_load: chronic, reason: 'no load in the last 28 days' };
  }
  // acute · 4 / sum rather than acute / (sum / 4): exact when a ratio of exactly 1.5 is meant.
  const ratio = (acute * (CHRONIC_DAYS / ACUTE_DAYS)) / chronicSum;
  return { ...base, ratio, acute_load: acute, chronic_load: chronic, reason: null };
}
