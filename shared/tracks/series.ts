import {
  ELEVATION_HYSTERESIS_M,
  ELEVATION_SMOOTHING_HALF_WINDOW_S,
  fillMissing,
  flatEquivalentFactor,
  hysteresisProfile,
  smoothByTime,
} from './elevation.ts';
import { geodesicDistance } from './geodesy.ts';
import type { CleanTrack, DistanceSource, TrackPoint, TrackSeries } from './types.ts';

/**
 * Moving rule, step 1: an interval is moving when the displacement across a centred window around
 * it, divided by the window's duration, is at least this speed (m/s). 0.3 m/s (about 1 km/h) is
 * far under a slow walk, so walking breaks and steep hiking count as moving; standing still does
 * not. Displacement (straight line between the window's ends) rather than path length is used so
 * GPS jitter while standing does not add up to speed.
 */
export const MOVING_SPEED_MPS = 0.3;
/**
 * The window grows point by point around the interval, within its segment, until it spans at
 * least this many seconds (one interval when sampling is sparser).
 */
export const MOVING_WINDOW_S = 10;
/**
 * Moving rule, step 2: a centred window smears the edges of a stop by a few seconds, so each
 * stopped stretch is widened, one interval at a time and by at most half a window, over
 * neighbouring intervals whose own speed is under this value (m/s). A runner leaving or reaching
 * a stop covers more than 1 m in a second; standing jitter seldom does.
 */
export const STOP_EDGE_SPEED_MPS = 1;
/** Share of points that must carry a device distance for it to be the run's distance. */
export const DEVICE_DISTANCE_MIN_SHARE = 0.5;
/** Gradient for flat-equivalent pace is measured over at least this much distance, metres. */
export const GRADE_WINDOW_M = 20;

/** Which distance a cleaned track will use: the device's when at least half its points carry one. */
export function chooseDistanceSource(points: readonly TrackPoint[]): DistanceSource {
  let device = 0;
  let positioned = 0;
  for (const p of points) {
    if (p.distance_m !== undefined) device++;
    if (p.lat !== undefined) positioned++;
  }
  if (device >= 2 && device >= points.length * DEVICE_DISTANCE_MIN_SHARE) return 'device';
  if (positioned >= 2) return 'geodesic';
  return 'none';
}

/**
 * Build the per-point series of a cleaned track: cumulative distance, moving flags, smoothed and
 * hysteresis-filtered elevation, heart rate, cadence and flat-equivalent distance.
 *
 * Distance: the device's cumulative distance when the file carries it (see
 * `chooseDistanceSource`), taken relative to the first point, gaps filled by linear
 * interpolation in time and forced non-decreasing; otherwise the WGS-84 geodesic between
 * consecutive positioned points within a segment, counted only for moving intervals (so jitter
 * while stopped adds nothing) and never across a segment break (pauses are not joined).
 * Points without a position are left out in geodesic mode.
 *
 * Moving: see `MOVING_SPEED_MPS` and `MOVING_WINDOW_S`; an interval across a segment break is
 * never moving. A recording gap inside a segment is moving only if the runner covered ground at
 * walking speed or faster during it (signal lost in a tunnel), otherwise it is stopped time.
 *
 * Requires at least one point; the input is not modified.
 */
export function buildSeries(track: CleanTrack): TrackSeries {
  const source = chooseDistanceSource(track.points);
  const { points, starts } =
    source === 'geodesic'
      ? keepPositioned(track.points, track.segment_starts)
      : { points: track.points, starts: track.segment_starts };
  const n = points.length;
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) t[i] = (points[i] as TrackPoint).t;

  const segmentBreak = new Uint8Array(n);
  for (const s of starts) if (s > 0 && s < n) segmentBreak[s] = 1;
  const segmentOf = new Int32Array(n);
  for (let i = 1; i < n; i++) segmentOf[i] = (segmentOf[i - 1] as number) + (segmentBreak[i] as number);

  const d = new Float64Array(n);
  const moving = new Uint8Array(n);
  if (source === 'device') {
    const raw = new Float64Array(n);
    for (let i = 0; i < n; i++) raw[i] = (points[i] as TrackPoint).distance_m ?? Number.NaN;
    const filled = fillMissing(t, raw) ?? new Float64Array(n);
    const d0 = filled[0] ?? 0;
    let level = 0;
    for (let i = 0; i < n; i++) {
      level = Math.max(level, (filled[i] as number) - d0);
      d[i] = level;
    }
    const displacement = (a: number, b: number): number => (d[b] as number) - (d[a] as number);
    classifyMoving(t, segmentOf, displacement, moving);
  } else if (source === 'geodesic') {
    const displacement = (a: number, b: number): number => {
      const pa = points[a] as TrackPoint;
      const pb = points[b] as TrackPoint;
      return approxDistance(pa.lat as number, pa.lon as number, pb.lat as number, pb.lon as number);
    };
    classifyMoving(t, segmentOf, displacement, moving);
    for (let i = 1; i < n; i++) {
      let step = 0;
      if (moving[i]) {
        const pa = points[i - 1] as TrackPoint;
        const pb = points[i] as TrackPoint;
        step = geodesicDistance(pa.lat as number, pa.lon as number, pb.lat as number, pb.lon as number);
      }
      d[i] = (d[i - 1] as number) + step;
    }
  }

  const ele = fillMissing(t, fieldArray(points, 'ele'));
  const eleSmooth = ele ? smoothByTime(t, ele, ELEVATION_SMOOTHING_HALF_WINDOW_S) : null;
  const eleFiltered = eleSmooth ? hysteresisProfile(eleSmooth, ELEVATION_HYSTERESIS_M) : null;
  const hr = fieldArray(points, 'hr');
  const cad = fieldArray(points, 'cad');

  return {
    t,
    d,
    moving,
    segment_break: segmentBreak,
    ele_smooth: eleSmooth,
    ele_filtered: eleFiltered,
    hr: hr.some((v) => !Number.isNaN(v)) ? hr : null,
    cad: cad.some((v) => !Number.isNaN(v)) ? cad : null,
    flat_d: eleSmooth ? flatEquivalentDistances(d, eleSmooth) : null,
    distance_source: source,
  };
}

function keepPositioned(points: readonly TrackPoint[], starts: readonly number[]): { points: TrackPoint[]; starts: number[] } {
  const kept: TrackPoint[] = [];
  const keptStarts: number[] = [];
  const startSet = new Set(starts);
  let pendingStart = false;
  for (let i = 0; i < points.length; i++) {
    if (startSet.has(i)) pendingStart = true;
    const p = points[i] as TrackPoint;
    if (p.lat === undefined || p.lon === undefined) continue;
    if (pendingStart) {
      keptStarts.push(kept.length);
      pendingStart = false;
    }
    kept.push(p);
  }
  return { points: kept, starts: keptStarts };
}

function fieldArray(points: readonly TrackPoint[], key: 'ele' | 'hr' | 'cad'): Float64Array {
  const out = new Float64Array(points.length);
  for (let i = 0; i < points.length; i++) out[i] = (points[i] as TrackPoint)[key] ?? Number.NaN;
  return out;
}

/**
 * Local flat-earth distance in metres (equirectangular on the WGS-84 radii of curvature). Used
 * only to test window speeds against a threshold: over tens of metres it is within 0.1 % of the
 * geodesic, and it is much cheaper.
 */
function approxDistance(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const a = 6378137;
  const e2 = 0.00669437999014;
  const phi = (((lat1 + lat2) / 2) * Math.PI) / 180;
  const s = Math.sin(phi);
  const w = Math.sqrt(1 - e2 * s * s);
  const meridian = (a * (1 - e2)) / (w * w * w);
  const normal = a / w;
  let dLon = lon2 - lon1;
  if (dLon > 180) dLon -= 360;
  else if (dLon < -180) dLon += 360;
  const dy = ((lat2 - lat1) * Math.PI * meridian) / 180;
  const dx = (dLon * Math.PI * normal * Math.cos(phi)) / 180;
  return Math.hypot(dx, dy);
}

function classifyMoving(
  t: Float64Array,
  segmentOf: Int32Array,
  displacement: (a: number, b: number) => number,
  moving: Uint8Array,
): void {
  const n = t.length;
  const windowMs = MOVING_WINDOW_S * 1000;
  for (let i = 1; i < n; i++) {
    const seg = segmentOf[i] as number;
    if ((segmentOf[i - 1] as number) !== seg) continue;
    let a = i - 1;
    let b = i;
    while ((t[b] as number) - (t[a] as number) < windowMs) {
      const canLeft = a > 0 && segmentOf[a - 1] === seg;
      const canRight = b + 1 < n && segmentOf[b + 1] === seg;
      if (!canLeft && !canRight) break;
      const leftSpan = (t[i - 1] as number) - (t[a] as number);
      const rightSpan = (t[b] as number) - (t[i] as number);
      if (canLeft && (!canRight || leftSpan <= rightSpan)) a--;
      else b++;
    }
    const seconds = ((t[b] as number) - (t[a] as number)) / 1000;
    moving[i] = displacement(a, b) / seconds >= MOVING_SPEED_MPS ? 1 : 0;
  }
  refineStopEdges(t, segmentOf, displacement, moving);
}

function refineStopEdges(
  t: Float64Array,
  segmentOf: Int32Array,
  displacement: (a: number, b: number) => number,
  moving: Uint8Array,
): void {
  const n = t.length;
  const reachMs = (MOVING_WINDOW_S * 1000) / 2;
  const slow = (k: number): boolean =>
    displacement(k - 1, k) / (((t[k] as number) - (t[k - 1] as number)) / 1000) < STOP_EDGE_SPEED_MPS;
  const original = moving.slice();
  for (let i = 1; i < n; i++) {
    if (original[i] || segmentOf[i - 1] !== segmentOf[i]) continue;
    const seg = segmentOf[i];
    const isStart = i === 1 || original[i - 1] || segmentOf[i - 2] !== seg;
    const isEnd = i === n - 1 || original[i + 1] || segmentOf[i + 1] !== seg;
    if (isStart) {
      const edge = t[i - 1] as number;
      for (let k = i - 1; k >= 1 && segmentOf[k - 1] === seg && original[k]; k--) {
        if (edge - (t[k - 1] as number) > reachMs || !slow(k)) break;
        moving[k] = 0;
      }
    }
    if (isEnd) {
      const edge = t[i] as number;
      for (let k = i + 1; k < n && segmentOf[k] === seg && original[k]; k++) {
        if ((t[k] as number) - edge > reachMs || !slow(k)) break;
        moving[k] = 0;
      }
    }
  }
}

function flatEquivalentDistances(d: Float64Array, ele: Float64Array): Float64Array {
  const n = d.length;
  const out = new Float64Array(n);
  let a = 0;
  let b = 0;
  for (let i = 1; i < n; i++) {
    const step = (d[i] as number) - (d[i - 1] as number);
    if (step <= 0) continue;
    // Centred distance window of at least GRADE_WINDOW_M around the interval, by two pointers.
    const mid = ((d[i] as number) + (d[i - 1] as number)) / 2;
    const half = GRADE_WINDOW_M / 2;
    while (a < i - 1 && (d[a + 1] as number) <= mid - half) a++;
    if (a > i - 1) a = i - 1;
    if (b < i) b = i;
    while (b < n - 1 && (d[b] as number) < mid + half) b++;
    const run = (d[b] as number) - (d[a] as number);
    const grade = run > 0 ? ((ele[b] as number) - (ele[a] as number)) / run : 0;
    out[i] = step * flatEquivalentFactor(grade);
  }
  return out;
}
