import { BLOCK } from './blocks.ts';
import type { TrackSeries } from './types.ts';

/** Totals over a stretch of time of a run; see `measureWindow`. */
export interface WindowStats {
  elapsed_s: number;
  moving_s: number;
  distance_m: number;
  flat_distance_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  elev_gain_m: number | null;
  elev_loss_m: number | null;
  /** First interval index that reaches past `endT`, to continue a forward sweep from. */
  next_index: number;
}

function valueAt(values: Float64Array, i: number, f: number): number {
  const a = values[i - 1] as number;
  const b = values[i] as number;
  if (Number.isNaN(a)) return b;
  if (Number.isNaN(b)) return a;
  return a + (b - a) * f;
}

/**
 * Measure the stretch of a run between two times (ms, `startT` ≤ `endT`). Each interval
 * overlapping the stretch contributes the overlapping fraction of its time, distance, moving
 * time, elevation change and flat-equivalent distance; values at the cut are interpolated
 * linearly in time. Heart rate is a time-weighted average (trapezoids over intervals, pauses
 * between segments excluded) and its maximum includes the interpolated values at the cuts.
 * Cadence is averaged over moving time only. `fromIndex` lets a caller sweep forward through
 * consecutive stretches in linear total time.
 */
export function measureWindow(series: TrackSeries, startT: number, endT: number, fromIndex = 1): WindowStats {
  // Columns in locals: one property read per window, not per interval.
  const { t, d, moving, flat_d: flatD, ele_filtered: ele, hr, cad, segment_break: segmentBreak } = series;
  const n = t.length;
  let i = Math.max(1, fromIndex);
  while (i < n && (t[i] as number) <= startT) i++;
  const sums = new Float64Array(SUMS);
  sums[HR_MAX] = Number.NEGATIVE_INFINITY;
  sums[NEXT] = i;
  for (; i < n; i += BLOCK) {
    if (!windowBlock(t, d, moving, flatD, ele, hr, cad, segmentBreak, startT, endT, sums, i, Math.min(n, i + BLOCK))) break;
  }
  const movingMs = sums[MOVING_MS] as number;
  const hrMs = sums[HR_MS] as number;
  const cadMs = sums[CAD_MS] as number;
  const hasEle = series.ele_filtered !== null;
  return {
    elapsed_s: (endT - startT) / 1000,
    moving_s: movingMs / 1000,
    distance_m: sums[DISTANCE] as number,
    flat_distance_m: series.flat_d ? (sums[FLAT] as number) : null,
    avg_hr: hrMs > 0 ? (sums[HR_SUM] as number) / hrMs : null,
    max_hr: hrMs > 0 ? (sums[HR_MAX] as number) : null,
    avg_cad: cadMs > 0 ? (sums[CAD_SUM] as number) / cadMs : null,
    elev_gain_m: hasEle ? (sums[GAIN] as number) : null,
    elev_loss_m: hasEle ? (sums[LOSS] as number) : null,
    next_index: Math.max(1, sums[NEXT] as number),
  };
}

// Slots of the sums `windowBlock` carries from block to block.
const MOVING_MS = 0;
const DISTANCE = 1;
const FLAT = 2;
const GAIN = 3;
const LOSS = 4;
const HR_SUM = 5;
const HR_MS = 6;
const HR_MAX = 7;
const CAD_SUM = 8;
const CAD_MS = 9;
const NEXT = 10;
const SUMS = 11;

/** `measureWindow` over intervals [from, to), adding to `sums`; false once an interval starts at or after `endT`. */
function windowBlock(
  t: Float64Array,
  d: Float64Array,
  moving: Uint8Array,
  flatD: Float64Array | null,
  ele: Float64Array | null,
  hr: Float64Array | null,
  cad: Float64Array | null,
  segmentBreak: Uint8Array,
  startT: number,
  endT: number,
  sums: Float64Array,
  from: number,
  to: number,
): boolean {
  let movingMs = sums[MOVING_MS] as number;
  let distance = sums[DISTANCE] as number;
  let flat = sums[FLAT] as number;
  let gain = sums[GAIN] as number;
  let loss = sums[LOSS] as number;
  let hrSum = sums[HR_SUM] as number;
  let hrMs = sums[HR_MS] as number;
  let hrMax = sums[HR_MAX] as number;
  let cadSum = sums[CAD_SUM] as number;
  let cadMs = sums[CAD_MS] as number;
  let next = sums[NEXT] as number;
  let more = true;
  for (let i = from; i < to; i++) {
    const t0 = t[i - 1] as number;
    const t1 = t[i] as number;
    if (t0 >= endT) {
      more = false;
      break;
    }
    const a = Math.max(t0, startT);
    const b = Math.min(t1, endT);
    if (b <= a) continue;
    const dt = t1 - t0;
    const fa = (a - t0) / dt;
    const fb = (b - t0) / dt;
    const share = fb - fa;
    const ms = b - a;
    distance += share * ((d[i] as number) - (d[i - 1] as number));
    if (moving[i]) movingMs += ms;
    if (flatD) flat += share * (flatD[i] as number);
    if (ele) {
      const de = share * ((ele[i] as number) - (ele[i - 1] as number));
      if (de > 0) gain += de;
      else loss -= de;
    }
    if (hr && !segmentBreak[i]) {
      const ha = valueAt(hr, i, fa);
      const hb = valueAt(hr, i, fb);
      if (!Number.isNaN(ha)) {
        hrSum += (ms * (ha + hb)) / 2;
        hrMs += ms;
        hrMax = Math.max(hrMax, ha, hb);
      }
    }
    if (cad && moving[i]) {
      const ca = valueAt(cad, i, fa);
      const cb = valueAt(cad, i, fb);
      if (!Number.isNaN(ca)) {
        cadSum += (ms * (ca + cb)) / 2;
        cadMs += ms;
      }
    }
    next = t1 > endT ? i : i + 1;
  }
  sums[MOVING_MS] = movingMs;
  sums[DISTANCE] = distance;
  sums[FLAT] = flat;
  sums[GAIN] = gain;
  sums[LOSS] = loss;
  sums[HR_SUM] = hrSum;
  sums[HR_MS] = hrMs;
  sums[HR_MAX] = hrMax;
  sums[CAD_SUM] = cadSum;
  sums[CAD_MS] = cadMs;
  sums[NEXT] = next;
  return more;
}
