import type { SplitUnit } from '../tracks/types.ts';
import { UNIT_METRES } from './display.ts';

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
