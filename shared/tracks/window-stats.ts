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
  let movingMs = 0;
  let distance = 0;
  let flat = 0;
  let gain = 0;
  let loss = 0;
  let hrSum = 0;
  let hrMs = 0;
  let hrMax = Number.NEGATIVE_INFINITY;
  let cadSum = 0;
  let cadMs = 0;
  let next = i;
  for (; i < n; i++) {
    const t0 = t[i - 1] as number;
    const t1 = t[i] as number;
    if (t0 >= endT) break;
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
  const hasEle = series.ele_filtered !== null;
  return {
    elapsed_s: (endT - startT) / 1000,
    moving_s: movingMs / 1000,
    distance_m: distance,
    flat_distance_m: series.flat_d ? flat : null,
    avg_hr: hrMs > 0 ? hrSum / hrMs : null,
    max_hr: hrMs > 0 ? hrMax : null,
    avg_cad: cadMs > 0 ? cadSum / cadMs : null,
    elev_gain_m: hasEle ? gain : null,
    elev_loss_m: hasEle ? loss : null,
    next_index: Math.max(1, next),
  };
}
