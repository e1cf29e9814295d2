import { isIsoDate, weekStart } from '../weeks/weeks.ts';
import { isClosingRecovery } from './closing-recovery.ts';
import { expandParts } from './expand.ts';
import type { PlanItem } from './types.ts';

export { addDays, weekDates } from '../weeks/weeks.ts';

/** `text` when it is a real calendar date `YYYY-MM-DD`, else null ('2026-02-30' is null). For URL parameters. */
export function parseIsoDate(text: string | null): string | null {
  return text !== null && isIsoDate(text) ? text : null;
}

/** The Monday (ISO 8601 week start) of the week holding `date`. */
export function mondayOf(date: string): string {
  return weekStart(date, 1);
}

/**
 * The planned volume of a session, with repeats unrolled: metres over the parts given as a distance
 * and seconds over the parts given as a time (the two are not mixed: turning a time into a distance
 * would need a pace). A recovery after the last rep counts only when written (`isClosingRecovery`, as
 * the plan check judges it). Example: '2 mi warm-up, 6 x 800 m w/ 400 m jog, 20 min easy' → 10 018.688 m
 * (2 mi, six reps and five jogs) and 1200 s.
 */
export function plannedVolume(items: readonly PlanItem[]): { distance_m: number; duration_s: number } {
  let distance_m = 0;
  let duration_s = 0;
  const parts = expandParts(items);
  for (const [i, part] of parts.entries()) {
    if (isClosingRecovery(parts, i)) continue;
    if (part.amount.type === 'distance') distance_m += part.amount.distance_m;
    else duration_s += part.amount.duration_s;
  }
  return { distance_m, duration_s };
}
