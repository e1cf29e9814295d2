import { isValidPosition } from './geodesy.ts';
import type { CleanTrack, CleaningReport, TrackPoint } from './types.ts';

/** Heart rates outside this range (bpm) are sensor errors and are dropped from the point. */
const HR_MIN = 20;
const HR_MAX = 250;
/** Elevations outside this range (m) are treated as missing. */
const ELE_MIN = -500;
const ELE_MAX = 9000;

function finiteOrUndefined(v: number | undefined, min: number, max: number): number | undefined {
  return typeof v === 'number' && Number.isFinite(v) && v >= min && v <= max ? v : undefined;
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
  const report: CleaningReport = {
    input_points: 0,
    dropped_untimed: 0,
    dropped_backwards: 0,
    merged_duplicates: 0,
    dropped_no_position: 0,
    invalid_positions: 0,
  };
  const points: TrackPoint[] = [];
  const segment_starts: number[] = [];
  let lastT = Number.NEGATIVE_INFINITY;

  for (const segment of segments) {
    let segmentOpen = false;
    for (const raw of segment) {
      report.input_points++;
      if (typeof raw.t !== 'number' || !Number.isFinite(raw.t)) {
        report.dropped_untimed++;
        continue;
      }
      const point = sanitizePoint(raw);
      if (point.lat === undefined && (raw.lat !== undefined || raw.lon !== undefined)) {
        report.invalid_positions++;
      }
      if (point.lat === undefined && point.distance_m === undefined) {
        report.dropped_no_position++;
        continue;
      }
      if (point.t < lastT) {
        report.dropped_backwards++;
        continue;
      }
      if (point.t === lastT) {
        report.merged_duplicates++;
        const kept = points[points.length - 1];
        if (kept) points[points.length - 1] = mergePoints(kept, point);
        continue;
      }
      if (!segmentOpen) {
        segment_starts.push(points.length);
        segmentOpen = true;
      }
      points.push(point);
      lastT = point.t;
    }
  }
  return { points, segment_starts, report };
}

function sanitizePoint(raw: TrackPoint): TrackPoint {
  const point: TrackPoint = { t: raw.t };
  if (isValidPosition(raw.lat, raw.lon)) {
    point.lat = raw.lat;
    point.lon = raw.lon;
  }
  const ele = finiteOrUndefined(raw.ele, ELE_MIN, ELE_MAX);
  if (ele !== undefined) point.ele = ele;
  const hr = finiteOrUndefined(raw.hr, HR_MIN, HR_MAX);
  if (hr !== undefined) point.hr = hr;
  const cad = finiteOrUndefined(raw.cad, 0, 400);
  if (cad !== undefined) point.cad = cad;
  const temp = finiteOrUndefined(raw.temp, -80, 80);
  if (temp !== undefined) point.temp = temp;
  const dist = finiteOrUndefined(raw.distance_m, 0, Number.MAX_VALUE);
  if (dist !== undefined) point.distance_m = dist;
  return point;
}

function mergePoints(kept: TrackPoint, extra: TrackPoint): TrackPoint {
  const merged: TrackPoint = { ...extra, ...definedFields(kept) };
  return merged;
}

function definedFields(point: TrackPoint): Partial<TrackPoint> {
  const out: Partial<TrackPoint> = {};
  for (const [key, value] of Object.entries(point) as [keyof TrackPoint, number | undefined][]) {
    if (value !== undefined) out[key] = value;
  }
  return out;
}
