import { RACE_EFFORTS, raceEffortPaces, type RaceEffort } from '../race/training-ranges.ts';
import type { RacePaces } from './types.ts';

export interface RaceTime {
  date: string;
  distance_m: number;
  time_s: number;
}

/** The race efforts a plan can name (`@ MP`, `@ HMP`, `@ 10K`, `@ 5K`). */
const NAMED_EFFORTS = RACE_EFFORTS.filter(
  (e): e is RaceEffort & { shorthand: NonNullable<RaceEffort['shorthand']> } => e.shorthand !== null,
);

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
 * - Others are the runner's race efforts (shared/race/training-ranges.ts) from the most recent race
 *   result of the last `RECENT_RESULT_DAYS` days (current fitness), else from the goal: the Daniels &
 *   Gilbert (1979) pace of the equivalents table at that distance, the very number the Tools page's
 *   race-effort range shows for the same result.
 * `today` is the runner's local date (pure code reads no clock). Missing inputs leave paces out.
 */
export function racePacesFor(goal: RaceTime | null, results: readonly RaceTime[], today: string): RacePaces {
  const paces: RacePaces = {};
  if (goal) paces.goal = goal.time_s / (goal.distance_m / 1000);
  const reference = referencePerformance(goal, results, today);
  for (const effort of NAMED_EFFORTS) {
    if (goal && Math.abs(goal.distance_m / effort.distance_m - 1) < 0.01) {
      paces[effort.shorthand] = paces.goal;
    } else if (reference) {
      // The same number as the Tools page's race-effort range (its Daniels & Gilbert pace) for this result.
      paces[effort.shorthand] = raceEffortPaces(effort, reference.distance_m, reference.time_s).daniels_gilbert.s_per_km;
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
