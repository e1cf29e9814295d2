import { UNIT_METRES } from '../units.ts';
import type { Split, SplitUnit, TrackSeries } from './types.ts';
import { measureWindow } from './window-stats.ts';

/** Metres in one split unit. */

/**
 * A remainder after the last full split shorter than this (metres) is not reported as a
 * partial split: it would show a meaningless pace.
 */
export const MIN_PARTIAL_SPLIT_M = 1;
/**
 * A last, partial split shorter than this (metres) shows its distance and time but no pace or
 * flat-equivalent pace: over a few metres a pace says nothing (a 10 m stretch gave "2:42").
 */
export const MIN_PACED_SPLIT_M = 100;

/**
 * Time (ms) at which the cumulative distance first reaches `distanceM`, interpolated linearly
 * between the two points around it. `fromIndex` is a hint for forward sweeps (the search starts
 * there). Returns NaN when the run never gets that far; 0 m gives the first point's time.
 */
export function timeAtDistance(series: TrackSeries, distanceM: number, fromIndex = 0): number {
  const { t, d } = series;
  const n = t.length;
  if (n === 0 || distanceM > (d[n - 1] as number)) return Number.NaN;
  if (distanceM <= (d[0] as number)) return t[0] as number;
  let i = Math.max(1, fromIndex);
  while (i > 1 && (d[i - 1] as number) >= distanceM) i--;
  while (i < n && (d[i] as number) < distanceM) i++;
  const d0 = d[i - 1] as number;
  const d1 = d[i] as number;
  const t0 = t[i - 1] as number;
  return t0 + ((distanceM - d0) / (d1 - d0)) * ((t[i] as number) - t0);
}

/**
 * Splits per mile (1609.344 m) or per km. Boundary k is crossed at exactly k × unit of the
 * cumulative distance, at a time interpolated linearly between the points around it. Each split
 * reports its elapsed (clock) and moving time, pace from moving time (s per unit), heart rate,
 * cadence, elevation gain/loss and flat-equivalent pace. The last split is partial and carries
 * its real distance; a remainder under 1 m is left out, and one under 100 m has no pace. A run with no distance has no splits.
 */
export function computeSplits(series: TrackSeries, unit: SplitUnit): Split[] {
  const { t, d } = series;
  const n = t.length;
  if (n < 2) return [];
  const unitM = UNIT_METRES[unit];
  const total = d[n - 1] as number;
  const fullSplits = Math.floor(total / unitM);
  const splits: Split[] = [];
  let startT = t[0] as number;
  let hint = 1;
  let windowHint = 1;
  const count = total - fullSplits * unitM >= MIN_PARTIAL_SPLIT_M ? fullSplits + 1 : fullSplits;
  for (let k = 1; k <= count; k++) {
    const isFull = k <= fullSplits;
    let endT: number;
    if (isFull) {
      endT = timeAtDistance(series, k * unitM, hint);
      while (hint < n && (d[hint] as number) < k * unitM) hint++;
    } else {
      endT = t[n - 1] as number;
    }
    const stats = measureWindow(series, startT, endT, windowHint);
    windowHint = stats.next_index;
    const distance = isFull ? unitM : total - fullSplits * unitM;
    const units = distance / unitM;
    const paced = distance >= MIN_PACED_SPLIT_M;
    splits.push({
      index: k,
      unit,
      distance_m: distance,
      start_t: startT,
      end_t: endT,
      elapsed_s: stats.elapsed_s,
      moving_s: stats.moving_s,
      pace_s: stats.moving_s > 0 && paced ? stats.moving_s / units : null,
      flat_pace_s:
        paced && stats.moving_s > 0 && stats.flat_distance_m !== null && stats.flat_distance_m > 0
          ? stats.moving_s / (stats.flat_distance_m / unitM)
          : null,
      avg_hr: stats.avg_hr,
      max_hr: stats.max_hr,
      avg_cad: stats.avg_cad,
      elev_gain_m: stats.elev_gain_m,
      elev_loss_m: stats.elev_loss_m,
    });
    startT = endT;
  }
  return splits;
}
