import type { SplitUnit } from '../tracks/types.ts';
import { UNIT_METRES } from '../units.ts';

/** The run's series as the track route returns it (thinned; nulls where a value is unknown). */
export interface TrackColumns {
  t: ReadonlyArray<number | null>;
  d: ReadonlyArray<number | null>;
  ele: ReadonlyArray<number | null> | null;
  hr: ReadonlyArray<number | null> | null;
}

export interface ChartRow {
  /** Distance from the start in the display unit. */
  distance: number;
  /** Seconds per display unit over the trailing window; null while stopped or unknown. */
  pace_s: number | null;
  hr: number | null;
  ele: number | null;
}

/** Pace is measured over the last 200 m: short enough to show a rep, long enough to calm GPS jitter. */
export const PACE_WINDOW_M = 200;
/** Slower than 20:00 per km counts as stopped (walking breaks and waits) and is left blank. */
export const STOPPED_PACE_S_PER_KM = 1200;

/**
 * Rows for charts over distance, one per point with a known time and distance. Pace at a point is
 * time ÷ distance over the trailing `PACE_WINDOW_M` (clock time, so a stop inside the window slows
 * it; slower than `STOPPED_PACE_S_PER_KM` is blank). Inputs are not changed.
 */
export function buildChartRows(track: TrackColumns, unit: SplitUnit): ChartRow[] {
  const unitM = UNIT_METRES[unit];
  const idx: number[] = [];
  for (let i = 0; i < Math.min(track.t.length, track.d.length); i++) {
    const t = track.t[i];
    const d = track.d[i];
    if (t != null && d != null && Number.isFinite(t) && Number.isFinite(d)) idx.push(i);
  }
  const rows: ChartRow[] = [];
  let back = 0;
  for (let k = 0; k < idx.length; k++) {
    const i = idx[k]!;
    const d = track.d[i]!;
    const t = track.t[i]!;
    while (back + 1 < k && d - track.d[idx[back + 1]!]! >= PACE_WINDOW_M) back++;
    const j = idx[back]!;
    const dd = d - track.d[j]!;
    const dt = (t - track.t[j]!) / 1000;
    const perKm = dd >= PACE_WINDOW_M && dt > 0 ? dt / (dd / 1000) : null;
    rows.push({
      distance: Math.round((d / unitM) * 1000) / 1000,
      pace_s: perKm !== null && perKm <= STOPPED_PACE_S_PER_KM ? (perKm * unitM) / 1000 : null,
      hr: track.hr?.[i] ?? null,
      ele: track.ele?.[i] ?? null,
    });
  }
  return rows;
}

/**
 * The `lowShare`–`highShare` quantiles (0–1, nearest rank) of the known values, so one GPS spike
 * does not stretch a chart's scale; null without known values.
 */
export function robustRange(values: ReadonlyArray<number | null>, lowShare = 0.02, highShare = 0.98): [number, number] | null {
  const known = values.filter((v): v is number => v !== null && Number.isFinite(v)).sort((a, b) => a - b);
  if (known.length === 0) return null;
  const at = (share: number) => known[Math.min(known.length - 1, Math.max(0, Math.round(share * (known.length - 1))))]!;
  return [at(lowShare), at(highShare)];
}

/**
 * Round axis ticks covering [min, max]: the smallest step of `steps` (ascending) that needs at most
 * `maxTicks` ticks (the largest step otherwise); the domain runs from the tick at or below `min` to
 * the tick at or above `max`. A zero-width range gets one step either side.
 * Example: (452, 538, [10, 15, 30, 60]) → domain [450, 540], ticks [450, 480, 510, 540].
 */
export function niceTicks(
  min: number,
  max: number,
  steps: readonly number[],
  maxTicks = 5,
): { domain: [number, number]; ticks: number[] } {
  const span = (step: number) => {
    let lo = Math.floor(min / step) * step;
    let hi = Math.ceil(max / step) * step;
    if (lo === hi) {
      lo -= step;
      hi += step;
    }
    return { lo, hi, count: Math.round((hi - lo) / step) + 1 };
  };
  const step = steps.find((s) => span(s).count <= maxTicks) ?? steps[steps.length - 1]!;
  const { lo, hi } = span(step);
  const ticks: number[] = [];
  for (let v = lo; v <= hi + step / 1000; v += step) ticks.push(Math.round(v * 1000) / 1000);
  return { domain: [lo, hi], ticks };
}
