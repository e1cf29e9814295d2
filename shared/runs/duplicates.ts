/**
 * The same run in two files (issue #14): a watch's single-activity TCX and a multi-activity export
 * that holds it, or a GPX and a TCX of one recording, differ in every byte but start at the same
 * second and measure about the same distance. Our rule, with its limits as numbers:
 */

/** Starts at most this far apart (s) may be the same run: devices and converters round or shift the first point. */
export const SAME_RUN_START_S = 5;
/** Distances at most this share apart (of the longer one) may be the same run: device and position distances differ by ~1 %. */
export const SAME_RUN_DISTANCE_SHARE = 0.02;

export interface RunStartAndDistance {
  /** Start, ms since the epoch. */
  started_at_t: number;
  distance_m: number;
}

/** True when `a` and `b` start within 5 s of each other and their distances are within 2 %. */
export function isSameRun(a: RunStartAndDistance, b: RunStartAndDistance): boolean {
  if (Math.abs(a.started_at_t - b.started_at_t) > SAME_RUN_START_S * 1000) return false;
  const longer = Math.max(a.distance_m, b.distance_m);
  return Math.abs(a.distance_m - b.distance_m) <= SAME_RUN_DISTANCE_SHARE * longer;
}
