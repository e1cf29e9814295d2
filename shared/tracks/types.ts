/**
 * Types of a recorded track and of what Pacewright computes from it.
 *
 * Field names carry their unit (`_m`, `_s`, `_ms`) and use the snake_case of the public
 * contract (api-contract.md), so summaries and splits can be sent as they are.
 */
import type { PointColumns } from './point-columns.ts';

/** One recorded sample. `t` is milliseconds since the Unix epoch (UTC). */
export interface TrackPoint {
  t: number;
  /** Degrees, WGS-84; absent on indoor/treadmill samples. */
  lat?: number;
  lon?: number;
  /** Metres above the reference the device used (GPS or barometric). */
  ele?: number;
  /** Heart rate, beats per minute. */
  hr?: number;
  /** Cadence as the file records it (per minute; TCX running cadence is usually one foot). */
  cad?: number;
  /** Degrees Celsius. */
  temp?: number;
  /** The device's own cumulative distance in metres (TCX `DistanceMeters`), as recorded. */
  distance_m?: number;
}

/** A device lap as recorded (TCX `Lap`), never recomputed. */
export interface DeviceLap {
  /** Lap start, ms since the epoch. */
  start_t: number;
  /** `TotalTimeSeconds` as recorded. */
  total_time_s: number | null;
  /** `DistanceMeters` of the lap as recorded. */
  distance_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
}

/** One run as a file describes it, before cleaning. Segments are separated by recording pauses. */
export interface RawTrack {
  format: 'gpx' | 'tcx';
  name: string | null;
  /** TCX `Activity/@Sport` or GPX `trk/type`, as written. */
  sport: string | null;
  /** Every recorded point in file order. */
  points: PointColumns;
  /** Index of the first point of each segment, increasing; segments without points are left out. */
  segment_starts: number[];
  laps: DeviceLap[];
}

/** What cleaning removed or merged, so the import can tell the runner. */
export interface CleaningReport {
  input_points: number;
  /** Points without a usable timestamp. */
  dropped_untimed: number;
  /** Points whose timestamp is earlier than the point before them. */
  dropped_backwards: number;
  /** Points with the same timestamp as the point before them, merged into it. */
  merged_duplicates: number;
  /** Points with neither a valid position nor a device distance. */
  dropped_no_position: number;
  /** Points whose coordinates were NaN or out of range (position removed). */
  invalid_positions: number;
}

/** A cleaned track: strictly increasing times, valid values only, segments as start indices. */
export interface CleanTrack {
  /** The kept points as columns (NaN where a point has no value); what the analysis reads. */
  columns: PointColumns;
  /**
   * The same points as objects with only the fields they have, built on first use (for tests and
   * small consumers; a long run has over 100 000 of them, so the import reads `columns`).
   */
  readonly points: TrackPoint[];
  /** Index of the first point of each segment; always starts with 0 when there are points. */
  segment_starts: number[];
  report: CleaningReport;
}

/** Where the distance of a run comes from. */
export type DistanceSource = 'device' | 'geodesic' | 'none';

/** How the distance of a run was measured, for the run page (see position-smoother.ts). */
export interface DistanceReport {
  source: DistanceSource;
  /** True when noisy positions were smoothed before measuring (geodesic source only). */
  smoothed: boolean;
  /** Measured position jitter per axis, m (geodesic source), else null. */
  jitter_m: number | null;
  /** Median interval between points, s (geodesic source), else null. */
  median_interval_s: number | null;
  /** Moving distance point to point before smoothing, m (equal to `distance_m` when not smoothed). */
  raw_distance_m: number;
  /** The run's distance, m. */
  distance_m: number;
}

/**
 * The per-point series every computation works on. Interval `i` (1 ≤ i < n) is the stretch
 * from point `i − 1` to point `i`.
 */
export interface TrackSeries {
  /** Times, ms since the epoch, strictly increasing. */
  t: Float64Array;
  /** Cumulative distance in metres from the first point, non-decreasing. */
  d: Float64Array;
  /** 1 when interval i is moving time, 0 when stopped or a pause between segments; `moving[0]` is 0. */
  moving: Uint8Array;
  /** 1 when interval i crosses from one recorded segment to the next. */
  segment_break: Uint8Array;
  /** Smoothed elevation (m) or null when the file has none. */
  ele_smooth: Float64Array | null;
  /** Elevation after the hysteresis filter; its rises and falls are the counted ascent and descent. */
  ele_filtered: Float64Array | null;
  /** Heart rate per point (NaN where unknown) or null when the file has none. */
  hr: Float64Array | null;
  /** Cadence per point (NaN where unknown) or null when the file has none. */
  cad: Float64Array | null;
  /** Flat-equivalent distance of interval i (Minetti et al. 2002), or null without elevation. */
  flat_d: Float64Array | null;
  distance_source: DistanceSource;
  distance_report: DistanceReport;
}

export type SplitUnit = 'mi' | 'km';

/** One split: a full mile or kilometre, or the last partial one. */
export interface Split {
  /** 1-based. */
  index: number;
  unit: SplitUnit;
  distance_m: number;
  /** Start and end, ms since the epoch (end interpolated at exactly k × unit). */
  start_t: number;
  end_t: number;
  elapsed_s: number;
  moving_s: number;
  /** Seconds per unit from moving time; null when there was no moving time. */
  pace_s: number | null;
  /** Flat-equivalent pace, seconds per unit; null without elevation or moving time. */
  flat_pace_s: number | null;
  /** Time-weighted average and maximum heart rate; null when the file has none here. */
  avg_hr: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  /** Null when the file has no elevation. */
  elev_gain_m: number | null;
  elev_loss_m: number | null;
}

/** The fastest stretch of one distance inside a run (clock time). */
export interface FastestSection {
  distance_m: number;
  time_s: number;
  /** Seconds per km. */
  pace_s_per_km: number;
  start_t: number;
  end_t: number;
  /** Distance from the start of the run where the section begins, metres. */
  start_distance_m: number;
}

export interface RunSummary {
  started_at_t: number;
  ended_at_t: number;
  distance_m: number;
  distance_source: DistanceSource;
  distance_report: DistanceReport;
  elapsed_s: number;
  moving_s: number;
  /** Moving pace, seconds per km and per mile; null without moving time or distance. */
  pace_s_per_km: number | null;
  pace_s_per_mi: number | null;
  ascent_m: number | null;
  descent_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  points: number;
  segments: number;
}
