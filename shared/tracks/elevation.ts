/**
 * Elevation: smoothing, ascent/descent with hysteresis, and the Minetti et al. (2002) cost of
 * running on slopes used for flat-equivalent pace.
 */

import { BLOCK } from './blocks.ts';

/** Half-width of the centred moving average applied to elevation, seconds (a 20 s window). */
export const ELEVATION_SMOOTHING_HALF_WINDOW_S = 10;
/**
 * Hysteresis for counting ascent and descent, metres: a rise or fall only counts once the smoothed
 * elevation has moved this far from the last turning point, and then counts in full.
 */
export const ELEVATION_HYSTERESIS_M = 3;

/**
 * Fill missing elevations (NaN) by linear interpolation in time between the nearest known
 * values; before the first and after the last known value the nearest one is repeated.
 * Returns null when no value is known. `t` must be increasing (ms).
 */
export function fillMissing(
  t: Float64Array,
  values: Float64Array,
  /** Room for the result, one number per point (every value is written when one is known). */
  out: Float64Array = new Float64Array(values.length),
): Float64Array | null {
  const n = values.length;
  let prev = -1;
  for (let i = 0; i < n; i += BLOCK) prev = fillBlock(t, values, out, prev, i, Math.min(n, i + BLOCK));
  if (prev === -1) return null;
  out.fill(values[prev] as number, prev + 1);
  return out;
}

/** `fillMissing` over points [from, to); `last` is the last known index before them (−1: none), returned updated. */
function fillBlock(t: Float64Array, values: Float64Array, out: Float64Array, last: number, from: number, to: number): number {
  let prev = last;
  for (let i = from; i < to; i++) {
    const v = values[i] as number;
    if (Number.isNaN(v)) continue;
    if (prev === -1) {
      out.fill(v, 0, i);
    } else if (i - prev > 1) {
      const v0 = values[prev] as number;
      const t0 = t[prev] as number;
      const span = (t[i] as number) - t0;
      for (let k = prev + 1; k < i; k++) out[k] = v0 + ((v - v0) * ((t[k] as number) - t0)) / span;
    }
    out[i] = v;
    prev = i;
  }
  return prev;
}

/**
 * Centred moving average over ±`halfWindowS` seconds (time-based, so it suits 1 s and 10 s
 * sampling alike), computed in linear time with a running sum. `t` in ms, increasing.
 */
export function smoothByTime(
  t: Float64Array,
  values: Float64Array,
  halfWindowS: number,
  /** Room for the result, one number per point (every value is written). */
  out: Float64Array = new Float64Array(values.length),
): Float64Array {
  const n = values.length;
  // The window [lo, hi) and its sum, carried from block to block.
  const window = new Int32Array(2);
  const sum = new Float64Array(1);
  for (let i = 0; i < n; i += BLOCK)
    movingAverageBlock(t, values, halfWindowS * 1000, out, window, sum, i, Math.min(n, i + BLOCK));
  return out;
}

function movingAverageBlock(
  t: Float64Array,
  values: Float64Array,
  half: number,
  out: Float64Array,
  window: Int32Array,
  total: Float64Array,
  from: number,
  to: number,
): void {
  const n = values.length;
  let lo = window[0] as number;
  let hi = window[1] as number; // exclusive
  let sum = total[0] as number;
  for (let i = from; i < to; i++) {
    const ti = t[i] as number;
    while (hi < n && (t[hi] as number) <= ti + half) sum += values[hi++] as number;
    while ((t[lo] as number) < ti - half) sum -= values[lo++] as number;
    out[i] = sum / (hi - lo);
  }
  window[0] = lo;
  window[1] = hi;
  total[0] = sum;
}

/**
 * Hysteresis filter for ascent and descent. Turning points are the extremes of the smoothed
 * profile that are at least `thresholdM` apart; between two turning points the output follows
 * the running maximum (on a rise) or minimum (on a fall), clamped to the two turning values, so
 * it is monotone on each leg. Noise smaller than the threshold leaves the output flat, while a
 * real climb counts in full. Ascent = sum of rises of the output, descent = sum of falls.
 * An empty input gives an empty output.
 */
export function hysteresisProfile(
  values: Float64Array,
  thresholdM: number,
  /** Room for the result, one number per point (every value is written). */
  out: Float64Array = new Float64Array(values.length),
): Float64Array {
  const n = values.length;
  if (n === 0) return out;
  const turns = findTurningPoints(values, thresholdM);
  const first = turns[0];
  out.fill(values[first ?? 0] as number, 0, first === undefined ? n : first + 1);
  for (let k = 0; k + 1 < turns.length; k++) {
    const a = turns[k] as number;
    const b = turns[k + 1] as number;
    const va = values[a] as number;
    const vb = values[b] as number;
    let level = va;
    for (let i = a; i <= b; i += BLOCK) level = legBlock(values, va, vb, level, out, i, Math.min(b + 1, i + BLOCK));
  }
  const last = turns[turns.length - 1];
  if (last !== undefined) out.fill(values[last] as number, last);
  return out;
}

/** One leg of `hysteresisProfile` over points [from, to), from `level`; returns the level reached. */
function legBlock(
  values: Float64Array,
  va: number,
  vb: number,
  start: number,
  out: Float64Array,
  from: number,
  to: number,
): number {
  let level = start;
  for (let i = from; i < to; i++) {
    const v = values[i] as number;
    level = vb > va ? Math.min(vb, Math.max(level, v)) : Math.max(vb, Math.min(level, v));
    out[i] = level;
  }
  return level;
}

// Slots of the state `turningBlock` carries from block to block.
const DIRECTION = 0; // 0 unknown, 1 rising, -1 falling
const MAX_I = 1;
const MIN_I = 2;
const CANDIDATE = 3;

function findTurningPoints(values: Float64Array, threshold: number): number[] {
  const n = values.length;
  const turns: number[] = [];
  const state = new Int32Array(4);
  for (let i = 1; i < n; i += BLOCK) turningBlock(values, threshold, turns, state, i, Math.min(n, i + BLOCK));
  if (state[DIRECTION] !== 0) turns.push(state[CANDIDATE] as number);
  return turns;
}

function turningBlock(
  values: Float64Array,
  threshold: number,
  turns: number[],
  state: Int32Array,
  from: number,
  to: number,
): void {
  let direction = state[DIRECTION] as number;
  let maxI = state[MAX_I] as number;
  let minI = state[MIN_I] as number;
  let candidate = state[CANDIDATE] as number;
  for (let i = from; i < to; i++) {
    const v = values[i] as number;
    if (direction === 0) {
      if (v > (values[maxI] as number)) maxI = i;
      if (v < (values[minI] as number)) minI = i;
      if (v - (values[minI] as number) >= threshold) {
        turns.push(minI);
        direction = 1;
        candidate = i;
      } else if ((values[maxI] as number) - v >= threshold) {
        turns.push(maxI);
        direction = -1;
        candidate = i;
      }
    } else if (direction === 1) {
      if (v >= (values[candidate] as number)) candidate = i;
      else if ((values[candidate] as number) - v >= threshold) {
        turns.push(candidate);
        direction = -1;
        candidate = i;
      }
    } else if (v <= (values[candidate] as number)) candidate = i;
    else if (v - (values[candidate] as number) >= threshold) {
      turns.push(candidate);
      direction = 1;
      candidate = i;
    }
  }
  state[DIRECTION] = direction;
  state[MAX_I] = maxI;
  state[MIN_I] = minI;
  state[CANDIDATE] = candidate;
}

/** Sum of rises and of falls of a profile, metres. */
export function sumRisesAndFalls(values: Float64Array): { gain: number; loss: number } {
  let gain = 0;
  let loss = 0;
  for (let i = 1; i < values.length; i++) {
    const dv = (values[i] as number) - (values[i - 1] as number);
    if (dv > 0) gain += dv;
    else loss -= dv;
  }
  return { gain, loss };
}

/** Gradient limits of the Minetti et al. (2002) fit; steeper slopes are clamped to these. */
export const MINETTI_GRADE_MIN = -0.45;
export const MINETTI_GRADE_MAX = 0.45;

/**
 * Energy cost of running on a gradient, J·kg⁻¹·m⁻¹, from the polynomial fit of Minetti et al.
 * (2002), J Appl Physiol 93:1039–1046: Cr(i) = 155.4i⁵ − 30.4i⁴ − 43.3i³ + 46.3i² + 19.5i + 3.6,
 * with i the gradient as a decimal (rise / horizontal distance), clamped to [−0.45, 0.45].
 */
export function minettiRunningCost(grade: number): number {
  const i = Math.min(MINETTI_GRADE_MAX, Math.max(MINETTI_GRADE_MIN, grade));
  return ((((155.4 * i - 30.4) * i - 43.3) * i + 46.3) * i + 19.5) * i + 3.6;
}

/**
 * Flat-equivalent factor f(i) = Cr(i) / Cr(0): a metre run at gradient i costs as much as f
 * metres on the flat. Flat-equivalent pace = actual pace / f. f(0) = 1.
 */
export function flatEquivalentFactor(grade: number): number {
  return minettiRunningCost(grade) / 3.6;
}
