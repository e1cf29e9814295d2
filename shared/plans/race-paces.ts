import { equivalentTime, performanceIndex } from '../race/equivalence.ts';
import type { RacePaces, RelativePaceRef } from './types.ts';

export interface RaceTime {
  date: string;
  distance_m: number;
  time_s: number;
}

const REF_DISTANCES_M: Readonly<Record<Exclude<RelativePaceRef, 'goal'>, number>> = {
  MP: 42195,
  HMP: 21097.5,
  '10K': 10000,
  '5K': 5000,
};

/** Race results older than this no longer speak for current fitness. */
export const RECENT_RESULT_DAYS = 182;

function daysBetween(from: string, to: string): number {
  return (Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000;
}

/**
 * The race-named paces (seconds per km) a plan's `@ goal`, `@ MP`, `@ HMP`, `@ 10K` and `@ 5K` resolve to.
 *
 * - `goal`: the goal race's goal time over its distance.
 * - A race pace at the goal race's own distance is the goal pace (the runner trains for it).
 * - Others come from the most recent race result of the last `RECENT_RESULT_DAYS` days (current
 *   fitness), else from the goal, carried to the distance with the Daniels & Gilbert (1979)
 *   equations (equivalent performance at the same index).
 * `today` is the runner's local date (pure code reads no clock). Missing inputs leave paces out.
 */
export function racePacesFor(goal: RaceTime | null, results: readonly RaceTime[], today: string): RacePaces {
  const paces: RacePaces = {};
  if (goal) paces.goal = goal.time_s / (goal.distance_m / 1000);
  const reference = referencePerformance(goal, results, today);
  for (const [ref, distance] of Object.entries(REF_DISTANCES_M) as Array<[Exclude<RelativePaceRef, 'goal'>, number]>) {
    if (goal && Math.abs(goal.distance_m / distance - 1) < 0.01) {
      paces[ref] = paces.goal;
    } else if (reference) {
      paces[ref] = equivalentTime(performanceIndex(reference.distance_m, reference.time_s), distance) / (distance / 1000);
    }
  }
  return paces;
}

/** The performance that speaks for current fitness: the most recent result of the last `RECENT_RESULT_DAYS` days, else the goal. */
export function referencePerformance(goal: RaceTime | null, results: readonly RaceTime[], today: string): RaceTime | null {
  const recent = results
    .filter((r) => r.date <= today && daysBetween(r.date, today) <= RECENT_RESULT_DAYS)
    .sort((a, b) => (a.date < b.date ? 1 : -1))[0];
  return recent ?? goal;
}
