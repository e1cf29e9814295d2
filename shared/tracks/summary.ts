import { METRES_PER_KM, METRES_PER_MILE } from '../units.ts';
import type { RunSummary, TrackSeries } from './types.ts';
import { measureWindow } from './window-stats.ts';

/**
 * Totals of a run: distance (m), elapsed clock time and moving time (s), moving pace per km and
 * per mile, ascent/descent after smoothing and hysteresis (null without elevation), heart rate
 * (time-weighted average and maximum, null without heart rate) and cadence. A series with fewer
 * than two points has zero distance and time.
 */
export function summarizeRun(series: TrackSeries, segments: number): RunSummary {
  const { t, d } = series;
  const n = t.length;
  const first = n > 0 ? (t[0] as number) : Number.NaN;
  const last = n > 0 ? (t[n - 1] as number) : Number.NaN;
  const distance = n > 0 ? (d[n - 1] as number) : 0;
  const stats = n > 1 ? measureWindow(series, first, last) : null;
  const moving = stats?.moving_s ?? 0;
  const paced = moving > 0 && distance > 0;
  return {
    started_at_t: first,
    ended_at_t: last,
    distance_m: distance,
    distance_source: series.distance_source,
    distance_report: series.distance_report,
    elapsed_s: n > 1 ? (last - first) / 1000 : 0,
    moving_s: moving,
    pace_s_per_km: paced ? moving / (distance / METRES_PER_KM) : null,
    pace_s_per_mi: paced ? moving / (distance / METRES_PER_MILE) : null,
    ascent_m: stats?.elev_gain_m ?? (series.ele_filtered ? 0 : null),
    descent_m: stats?.elev_loss_m ?? (series.ele_filtered ? 0 : null),
    avg_hr: stats?.avg_hr ?? null,
    max_hr: stats?.max_hr ?? null,
    avg_cad: stats?.avg_cad ?? null,
    points: n,
    segments,
  };
}
