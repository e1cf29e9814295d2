import { isValidPosition } from './geodesy.ts';
import { PointColumns } from './point-columns.ts';
import type { CleanTrack, CleaningReport, TrackPoint } from './types.ts';

/** Heart rates outside this range (bpm) are sensor errors and are dropped from the point. */
const HR_MIN = 20;
const HR_MAX = 250;
/** Elevations outside this range (m) are treated as missing. */
const ELE_MIN = -500;
const ELE_MAX = 9000;
/**
 * A device's cumulative distance beyond this (m, 10 000 km) is a corrupt value, not a recording:
 * it is treated as missing. (Without the cap one damaged number can ask for 10^17 splits.)
 */
const DEVICE_DISTANCE_MAX_M = 10_000_000;

/** `value` when it is a finite number within [min, max], else NaN. */
function inRangeOrNaN(value: number, min: number, max: number): number {
  return value >= min && value <= max ? value : Number.NaN;
}

/**
 * Clean the segments of a recorded run into one series with strictly increasing times.
 *
 * Rules, in order, over all segments as one sequence:
 * - a point without a finite `t` is dropped (`dropped_untimed`);
 * - NaN or out-of-range coordinates (|lat| > 90, |lon| > 180) remove the position
 *   (`invalid_positions`); a point left with neither a position nor a device distance is
 *   dropped (`dropped_no_position`);
 * - NaN or implausible elevation, heart rate (outside 20–250 bpm), cadence or temperature
 *   values are removed from the point;
 * - a point earlier than the last kept point is dropped (`dropped_backwards`);
 * - a point with the same time as the last kept point is merged into it: the kept point's
 *   values win, missing ones are filled from the duplicate (`merged_duplicates`);
 * - empty segments disappear.
 * The input is not modified.
 */
export function cleanTrack(segments: readonly (readonly TrackPoint[])[]): CleanTrack {
  const points = new PointColumns(segments.reduce((sum, segment) => sum + segment.length, 0));
  const starts: number[] = [];
  for (const segment of segments) {
    starts.push(points.length);
    for (const point of segment) points.push(point);
  }
  return cleanPoints(points, starts);
}

/** How `cleanPoints` may treat its input. */
export interface CleanOptions {
  /**
   * The input columns are the caller's to give away (a file reader's, dropped after cleaning):
   * the cleaned points are written over them instead of into new columns, sparing a second set of
   * columns (eight arrays of 8 bytes a point) and its first-touch cost. Kept points only move
   * towards the start, so nothing is overwritten before it is read.
   */
  reuseInput?: boolean;
}

/**
 * `cleanTrack` for points already in columns (as the file readers collect them);
 * `segmentStarts` are the indices where segments begin, increasing (repeats mean empty segments).
 * The input is not modified unless `options.reuseInput` gives it away.
 */
export function cleanPoints(raw: PointColumns, segmentStarts: readonly number[], options: CleanOptions = {}): CleanTrack {
  const report: CleaningReport = {
    input_points: raw.length,
    dropped_untimed: 0,
    dropped_backwards: 0,
    merged_duplicates: 0,
    dropped_no_position: 0,
    invalid_positions: 0,
  };
  const reuse = options.reuseInput === true;
  const out = reuse ? raw : new PointColumns(raw.length);
  const total = raw.length;
  /** Points kept so far: the next one goes to out[kept]. */
  let kept = 0;
  const segment_starts: number[] = [];
  let lastT = Number.NEGATIVE_INFINITY;
  let nextSegment = 0;
  let segmentOpen = false;

  for (let i = 0; i < total; i++) {
    while (nextSegment < segmentStarts.length && (segmentStarts[nextSegment] as number) <= i) {
      nextSegment++;
      segmentOpen = false;
    }
    const t = raw.t[i] as number;
    if (!Number.isFinite(t)) {
      report.dropped_untimed++;
      continue;
    }
    const positioned = isValidPosition(raw.lat[i], raw.lon[i]);
    if (!positioned && raw.position_given[i] === 1) report.invalid_positions++;
    const distance = inRangeOrNaN(raw.distance_m[i] as number, 0, DEVICE_DISTANCE_MAX_M);
    if (!positioned && Number.isNaN(distance)) {
      report.dropped_no_position++;
      continue;
    }
    if (t < lastT) {
      report.dropped_backwards++;
      continue;
    }
    const lat = positioned ? (raw.lat[i] as number) : Number.NaN;
    const lon = positioned ? (raw.lon[i] as number) : Number.NaN;
    const ele = inRangeOrNaN(raw.ele[i] as number, ELE_MIN, ELE_MAX);
    const hr = inRangeOrNaN(raw.hr[i] as number, HR_MIN, HR_MAX);
    const cad = inRangeOrNaN(raw.cad[i] as number, 0, 400);
    const temp = inRangeOrNaN(raw.temp[i] as number, -80, 80);
    if (t === lastT) {
      // Merge into the kept point: its own values win, the gaps are filled from this one.
      report.merged_duplicates++;
      const k = kept - 1;
      if (Number.isNaN(out.lat[k] as number)) {
        out.lat[k] = lat;
        out.lon[k] = lon;
        out.position_given[k] = positioned ? 1 : 0;
      }
      fillGap(out.ele, k, ele);
      fillGap(out.hr, k, hr);
      fillGap(out.cad, k, cad);
      fillGap(out.temp, k, temp);
      fillGap(out.distance_m, k, distance);
      continue;
    }
    if (!segmentOpen) {
      segment_starts.push(kept);
      segmentOpen = true;
    }
    const k = reuse ? kept : out.add();
    kept++;
    out.t[k] = t;
    out.lat[k] = lat;
    out.lon[k] = lon;
    out.ele[k] = ele;
    out.hr[k] = hr;
    out.cad[k] = cad;
    out.temp[k] = temp;
    out.distance_m[k] = distance;
    out.position_given[k] = positioned ? 1 : 0;
    lastT = t;
  }
  if (reuse) keepFirst(raw, kept);
  return withPointObjects({ columns: out, segment_starts, report });
}

/** Cut columns written over in place to their first `length` points (views: nothing is copied). */
function keepFirst(columns: PointColumns, length: number): void {
  // Each field by name: a store by computed key would make every later access to the columns generic.
  columns.t = columns.t.subarray(0, length);
  columns.lat = columns.lat.subarray(0, length);
  columns.lon = columns.lon.subarray(0, length);
  columns.ele = columns.ele.subarray(0, length);
  columns.hr = columns.hr.subarray(0, length);
  columns.cad = columns.cad.subarray(0, length);
  columns.temp = columns.temp.subarray(0, length);
  columns.distance_m = columns.distance_m.subarray(0, length);
  columns.position_given = columns.position_given.subarray(0, length);
  columns.length = length;
}

function fillGap(column: Float64Array, k: number, value: number): void {
  if (Number.isNaN(column[k] as number)) column[k] = value;
}

/** Give a cleaned track its `points` view, built from the columns on first use. */
function withPointObjects(track: Omit<CleanTrack, 'points'>): CleanTrack {
  let points: TrackPoint[] | undefined;
  return {
    ...track,
    get points(): TrackPoint[] {
      points ??= Array.from({ length: track.columns.length }, (_, i) => track.columns.pointAt(i));
      return points;
    },
  };
}
