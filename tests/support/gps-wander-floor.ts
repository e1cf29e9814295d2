/**
 * The part of a split's error that the receiver's slow wander leaves for any method that has only
 * positions (issue #14; shared/tracks/README.md, "The wander").
 *
 * The wander moves like a runner, so no estimator tells it from the runner's own line (its least
 * mean-square position error stays 0.93–1.00 σ, README): the best a position-only method can measure
 * is the length of the true path moved by the wander. To first order that length differs from the
 * truth by Σₖ (eₖ₊₁ − eₖ)·uₖ over the steps (uₖ the unit vector of true step k, eₖ the wander at point k).
 * Summed by parts this is the along-track wander at the two ends minus Σ dₖ·Δθₖ, the sideways wander
 * times the turn at each point: a curve moved sideways by d is d·θ shorter over a turn of θ (a parallel
 * curve moves at (1 − d·κ) times the curve's speed). A split boundary is reached early by that length
 * over the runner's speed there, so a split's floor is the difference of the shifts at its two ends.
 * Computed from the generator's truth and wander alone, no estimator involved.
 */
import { METRES_PER_KM, METRES_PER_MILE } from '../../shared/units.ts';
import { metresPerDegree } from '../../shared/tracks/position-smoother.ts';
import type { SplitUnit } from '../../shared/tracks/types.ts';
import { gpsTrueDistance, gpsTrueTimeAt, type GpsPointError, type GpsTrackOptions } from './gps-tracks.ts';

/**
 * Length the wander adds to the true path up to each recorded point, m (first order): cumulative
 * Σ (eₖ₊₁ − eₖ)·uₖ over steps that move (a stop's or a pause's steps have no direction and add nothing).
 */
export function wanderLengthChange(errors: readonly GpsPointError[]): Float64Array {
  const out = new Float64Array(errors.length);
  for (let k = 1; k < errors.length; k++) {
    const a = errors[k - 1]!;
    const b = errors[k]!;
    const scale = metresPerDegree((a.lat + b.lat) / 2);
    const dx = (b.lon - a.lon) * scale.east;
    const dy = (b.lat - a.lat) * scale.north;
    const length = Math.hypot(dx, dy);
    let change = 0;
    if (length > 1e-6) change = ((b.wander_east_m - a.wander_east_m) * dx + (b.wander_north_m - a.wander_north_m) * dy) / length;
    out[k] = out[k - 1]! + change;
  }
  return out;
}

/** Running speed of the recordable profile where it reaches `distanceM` (as `gpsTrueTimeAt` finds it). */
function speedAt(options: GpsTrackOptions, distanceM: number): number {
  let s = 0;
  for (const phase of options.phases) {
    const v = phase.kind === 'run' || phase.kind === 'gap' ? phase.speed_mps : 0;
    if (v > 0 && s + v * phase.duration_s >= distanceM) return v;
    s += v * phase.duration_s;
  }
  return Number.NaN;
}

/**
 * Seconds by which a split boundary at each full `unit` is reached early because of the wander (the
 * length it added by then over the speed there); index k is the boundary at k units (0 at the start).
 */
export function wanderBoundaryShifts(recordable: GpsTrackOptions, errors: readonly GpsPointError[], unit: SplitUnit): number[] {
  const unitM = unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM;
  const change = wanderLengthChange(errors);
  const total = gpsTrueDistance(recordable.phases);
  const shifts = [0];
  let k = 1;
  for (let b = 1; b * unitM <= total; b++) {
    const at = (gpsTrueTimeAt(recordable, b * unitM) - recordable.start_t) / 1000;
    while (k < errors.length - 1 && errors[k]!.at_s < at) k++;
    const p = errors[k - 1]!;
    const q = errors[k]!;
    const f = q.at_s > p.at_s ? Math.min(1, Math.max(0, (at - p.at_s) / (q.at_s - p.at_s))) : 1;
    const length = change[k - 1]! + f * (change[k]! - change[k - 1]!);
    shifts.push(length / speedAt(recordable, b * unitM));
  }
  return shifts;
}
