import { UNIT_METRES } from '../units.ts';
import { MILE_M } from './distances.ts';

export type PaceUnit = 'mi' | 'km';

/** An average pace in seconds per km and per mile. */
export interface Pace {
  s_per_km: number;
  s_per_mi: number;
}

/**
 * The even pace that covers `distanceM` metres in `goalS` seconds, per km and per mile (1609.344 m).
 * Example: marathon in 3:00:00 → 255.9545 s/km, 411.9188 s/mi (REFERENCES.md §1).
 */
export function paceFromGoal(distanceM: number, goalS: number): Pace {
  return { s_per_km: goalS / (distanceM / 1000), s_per_mi: goalS / (distanceM / MILE_M) };
}

/** One line of a split table: the split ending at `distance_m` from the start. */
export interface PlannedSplit {
  /** 1, 2, 3 … ; the finish is the last line and may be a partial split. */
  n: number;
  /** Distance from the start to the end of this split, metres. */
  distance_m: number;
  /** Length of this split, metres (a full mile or km except perhaps the last). */
  split_distance_m: number;
  /** Clock time at the end of this split, seconds from the start. */
  cumulative_s: number;
  /** Time for this split alone, seconds. */
  split_s: number;
  /** Pace over this split, seconds per unit of the table. */
  pace_s_per_unit: number;
}

/** A 5 km checkpoint (and the finish) with the clock time there. */
export interface Checkpoint {
  distance_m: number;
  cumulative_s: number;
  /** Time since the previous checkpoint (or the start), seconds. */
  segment_s: number;
}

/** One half of the race, run at an even pace. */
export interface RaceHalf {
  distance_m: number;
  time_s: number;
  pace: Pace;
}

export interface SplitTable {
  unit: PaceUnit;
  distance_m: number;
  goal_s: number;
  /** Seconds by which the second half is faster than the first; 0 for even pacing. */
  negative_split_s: number;
  halves: [RaceHalf, RaceHalf];
  splits: PlannedSplit[];
  /** Every 5 km, then the finish. */
  checkpoints: Checkpoint[];
}

export interface SplitTableOptions {
  unit: PaceUnit;
  /** Second half faster than the first by this many seconds in total; 0 or absent for even pacing. */
  negativeSplitS?: number;
}

/** Boundaries closer to the finish than this (metres) are the finish itself, so a 10 km race has 10 km splits, not 11. */
const SAME_POINT_M = 1e-6;
const CHECKPOINT_EVERY_M = 5000;

/**
 * A pacing plan for `distanceM` metres in `goalS` seconds: the clock time at every full mile or km (per
 * `unit`) and at the finish, and every 5 km.
 *
 * Negative split model — two halves: the race is cut at half its distance and each half is run at its own
 * even pace, the second half `negativeSplitS` seconds faster than the first, so the halves take
 * (goal + N)/2 and (goal − N)/2. That is how runners state and check a negative split ("out in 1:31, back in
 * 1:29"); the one split that contains halfway mixes the two paces. N = 0 gives even pacing. The caller
 * validates N (limits.ts, `checkNegativeSplit`); here it must be at least 0 and less than the goal.
 */
export function splitTable(distanceM: number, goalS: number, { unit, negativeSplitS = 0 }: SplitTableOptions): SplitTable {
  if (!(distanceM > 0) || !(goalS > 0) || !(negativeSplitS >= 0) || !(negativeSplitS < goalS)) {
    throw new RangeError('Distance and goal must be positive and the negative split between 0 and the goal time.');
  }
  const halfM = distanceM / 2;
  const firstS = (goalS + negativeSplitS) / 2;
  const secondS = (goalS - negativeSplitS) / 2;
  const clockAt = (d: number): number => (d <= halfM ? (d / halfM) * firstS : firstS + ((d - halfM) / halfM) * secondS);

  const unitM = UNIT_METRES[unit];
  const splits: PlannedSplit[] = [];
  for (const [i, d] of boundaries(distanceM, unitM).entries()) {
    const previous = splits[i - 1];
    const fromM = previous?.distance_m ?? 0;
    const fromS = previous?.cumulative_s ?? 0;
    const cumulativeS = clockAt(d);
    const splitS = cumulativeS - fromS;
    splits.push({
      n: i + 1,
      distance_m: d,
      split_distance_m: d - fromM,
      cumulative_s: cumulativeS,
      split_s: splitS,
      pace_s_per_unit: splitS / ((d - fromM) / unitM),
    });
  }

  const checkpoints: Checkpoint[] = [];
  for (const d of boundaries(distanceM, CHECKPOINT_EVERY_M)) {
    const cumulativeS = clockAt(d);
    checkpoints.push({
      distance_m: d,
      cumulative_s: cumulativeS,
      segment_s: cumulativeS - (checkpoints.at(-1)?.cumulative_s ?? 0),
    });
  }

  return {
    unit,
    distance_m: distanceM,
    goal_s: goalS,
    negative_split_s: negativeSplitS,
    halves: [
      { distance_m: halfM, time_s: firstS, pace: paceFromGoal(halfM, firstS) },
      { distance_m: halfM, time_s: secondS, pace: paceFromGoal(halfM, secondS) },
    ],
    splits,
    checkpoints,
  };
}

/** k × step for k = 1, 2, … below `distanceM`, then `distanceM` itself. */
function boundaries(distanceM: number, stepM: number): number[] {
  const points: number[] = [];
  for (let k = 1; k * stepM < distanceM - SAME_POINT_M; k++) points.push(k * stepM);
  points.push(distanceM);
  return points;
}
