/**
 * What the race tools accept. The equations are fits to running races; outside these limits they
 * describe nothing real, so the tools refuse the input with a sentence instead of printing a number.
 */

/** Longest distance the tools take: 250 km, in metres. */
export const MAX_RACE_DISTANCE_M = 250_000;
/** Longest time the tools take: 100 hours, in seconds. */
export const MAX_RACE_TIME_S = 100 * 3600;
/**
 * Fastest average pace accepted: 1:00 per km (60 s/km, 16.7 m/s). Even a 100 m sprint world record
 * averages more than 1:30 per km, so anything faster is a typing mistake.
 */
export const FASTEST_PACE_S_PER_KM = 60;
/**
 * Slowest average pace accepted: 30:00 per km (2 km/h). Slower than that is a stroll with long stops;
 * the Daniels & Gilbert oxygen-cost fit turns negative below about 40:00 per km.
 */
export const SLOWEST_PACE_S_PER_KM = 30 * 60;
/** Largest negative split, as a share of the goal time: the second half at most 10 % of the goal faster. */
export const MAX_NEGATIVE_SPLIT_SHARE = 0.1;

/** The problem with a race distance in metres, as a sentence, or null when it is fine. */
export function checkRaceDistance(distanceM: number): string | null {
  if (!Number.isFinite(distanceM)) return 'The distance must be a number of metres, e.g. 21097.5 for a half marathon.';
  if (distanceM <= 0) return 'The distance must be more than 0 m.';
  if (distanceM > MAX_RACE_DISTANCE_M) return 'Distances up to 250 km (250000 m) are supported.';
  return null;
}

/** The problem with a race time in seconds, as a sentence, or null when it is fine. */
export function checkRaceTime(timeS: number): string | null {
  if (!Number.isFinite(timeS)) return 'The time must be a number of seconds, e.g. 5100 for 1:25:00.';
  if (timeS <= 0) return 'The time must be more than 0 seconds.';
  if (timeS > MAX_RACE_TIME_S) return 'Times up to 100 hours are supported.';
  return null;
}

/**
 * The problem with the average pace of `distanceM` metres in `timeS` seconds, as a sentence, or null when it lies
 * between 1:00 and 30:00 per km. Assumes both values passed their own checks.
 */
export function checkRacePace(distanceM: number, timeS: number): string | null {
  const paceSPerKm = timeS / (distanceM / 1000);
  if (paceSPerKm < FASTEST_PACE_S_PER_KM) {
    return 'That is faster than 1:00 per km, quicker than anyone has ever run. Check the distance and the time.';
  }
  if (paceSPerKm > SLOWEST_PACE_S_PER_KM) {
    return 'That is slower than 30:00 per km, a pace the race equations do not describe. Check the distance and the time.';
  }
  return null;
}

/**
 * The first problem with a race of `distanceM` metres in `timeS` seconds, as a sentence, or null when the pair
 * is plausible: the distance, then the time, then the average pace.
 */
export function checkRaceResult(distanceM: number, timeS: number): string | null {
  return checkRaceDistance(distanceM) ?? checkRaceTime(timeS) ?? checkRacePace(distanceM, timeS);
}

/**
 * The problem with a negative split of `negativeSplitS` seconds (second half that much faster than the first)
 * for a goal of `goalS` seconds, as a sentence, or null when it is fine. 0 means even pacing.
 */
export function checkNegativeSplit(negativeSplitS: number, goalS: number): string | null {
  if (!Number.isFinite(negativeSplitS)) return 'The negative split must be a number of seconds.';
  if (negativeSplitS < 0) return 'The negative split is how much faster the second half is; use 0 for even pacing.';
  if (negativeSplitS > goalS * MAX_NEGATIVE_SPLIT_SHARE) {
    return 'A negative split can be at most a tenth of the goal time (6:00 for a 1:00:00 goal).';
  }
  return null;
}
