import {
  ELEVATION_HYSTERESIS_M,
  ELEVATION_SMOOTHING_HALF_WINDOW_S,
  fillMissing,
  flatEquivalentFactor,
  hysteresisProfile,
  smoothByTime,
} from './elevation.ts';
import { geodesicDistance } from './geodesy.ts';
import { BLOCK } from './blocks.ts';
import type { PointColumns } from './point-columns.ts';
import { SpareColumns } from './spare-columns.ts';
import {
  arcFactors,
  bendGainFactors,
  curveFactors,
  kthSmallest,
  localDistance,
  MAX_SMOOTHED_INTERVAL_S,
  measureJitter,
  shouldSmooth,
  measureWander,
  MIN_CORRECTED_EXCESS,
  smoothedStepNoiseVariance,
  smoothPositions,
  smoothPositionsThroughTurns,
  SPARSE_FLOOR_JITTER_M,
  stepWithoutNoise,
  type JitterEstimate,
  type WanderModel,
} from './position-smoother.ts';
import type { CleanTrack, DistanceReport, DistanceSource, TrackSeries } from './types.ts';

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
/**
 * A device distance that climbs faster than this since the last kept reading (m/s, about
 * 360 km/h: beyond any runner or rider) is a glitch and is treated as missing, so one bad
 * reading cannot lift the rest of the run (the series is forced non-decreasing). Value chosen
 * by us, generous on purpose.
 */
export const DEVICE_DISTANCE_MAX_SPEED_MPS = 100;
/** Share of points that must carry a device distance for it to be the run's distance. */
export const DEVICE_DISTANCE_MIN_SHARE = 0.5;
/** Gradient for flat-equivalent pace is measured over at least this much distance, metres. */
export const GRADE_WINDOW_M = 20;

/** Which distance a cleaned track will use: the device's when at least half its points carry one. */
export function chooseDistanceSource(points: PointColumns): DistanceSource {
  let device = 0;
  let positioned = 0;
  for (let i = 0; i < points.length; i += BLOCK) {
    const to = Math.min(points.length, i + BLOCK);
    device += countPresent(points.distance_m, i, to);
    positioned += countPresent(points.lat, i, to);
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
  const source = chooseDistanceSource(track.columns);
  const { points, starts } =
    source === 'geodesic'
      ? keepPositioned(track.columns, track.segment_starts)
      : { points: track.columns, starts: track.segment_starts };
  const n = points.length;
  // Views of the track's own columns where the series holds the same values (nothing here writes them):
  // a copy was a fresh column per field (tests/bench/README.md, "Session 10").
  const t = points.t.subarray(0, n);
  // Spent room of this call handed out again (spare-columns.ts); empty unless the track is smoothed.
  const spare = new SpareColumns(n);

  const segmentBreak = new Uint8Array(n);
  for (const s of starts) if (s > 0 && s < n) segmentBreak[s] = 1;
  const segmentOf = segmentNumbers(segmentBreak);

  const d = new Float64Array(n);
  const moving = new Uint8Array(n);
  let report: DistanceReport = {
    source,
    smoothed: false,
    jitter_m: null,
    median_interval_s: null,
    raw_distance_m: 0,
    distance_m: 0,
  };
  if (source === 'device') {
    const filled = fillMissing(t, withoutDistanceSpikes(t, points.distance_m.subarray(0, n))) ?? new Float64Array(n);
    nonDecreasingFromStart(filled, d);
    classifyMoving(t, segmentOf, { d, lat: null, lon: null, along: null, turnsUpTo: null }, moving);
    const total = n > 0 ? (d[n - 1] as number) : 0;
    report = { ...report, raw_distance_m: total, distance_m: total };
  } else if (source === 'geodesic') {
    const { lat, lon } = points;
    const jitter = measureJitter(t, lat, lon, segmentBreak);
    const smoothing = shouldSmooth(jitter);
    if (smoothing) {
      // Noisy 1–2 s track: moving time and distance from the smoothed path (position-smoother.ts),
      // so standing jitter neither counts as moving nor adds length; the raw sum is kept for the report.
      const smooth = smoothPositionsThroughTurns(t, lat, lon, segmentBreak, jitter.sigma_m);
      const sLat = smooth.lat;
      const sLon = smooth.lon;
      // The temporary columns below are carved out of the smoother's leftover room (no fresh pages).
      spare.give(...(smooth.scratch ?? []));
      // Inside a turn the window is judged on the smoothed path's length, not the straight line between
      // its ends: on a 6 m turnaround that line is the 12 m diameter whatever the speed, under the
      // moving threshold of a file with about 1 m of jitter, and the running round it was lost.
      const along = spare.take();
      const turnsUpTo = spare.takeInt32();
      pathAlong(sLat, sLon, smooth.turn ?? null, along, turnsUpTo.ints);
      classifyMoving(
        t,
        segmentOf,
        { d: null, lat: sLat, lon: sLon, along, turnsUpTo: turnsUpTo.ints },
        moving,
        noiseAwareMovingSpeed(jitter.sigma_m),
      );
      spare.give(along, turnsUpTo.room);
      const turns = spare.take();
      const bends = arcFactors(t, sLat, sLon, segmentBreak, moving, spare.take(), turns);
      spare.give(turns);
      // The smoother draws a steady bend on a smaller radius (`bendGainFactors`): given back per step.
      const gains = bendGainFactors(t, smooth, segmentBreak, moving, jitter.sigma_m, undefined, spare.take());
      // Each moving step of the smoothed path, and the raw sum point to point kept for the report.
      const chords = spare.take();
      const raw = movingSteps(moving, sLat, sLon, lat, lon, chords);
      // The slow wander the smoother lets through still adds length (position-smoother.ts,
      // `stepWithoutNoise`): taken out when it is large enough to matter (`MIN_CORRECTED_EXCESS`).
      const steps = spare.take();
      const stepNoise = noiseToRemove(t, chords, moving, jitter, measureWander(t, lat, lon, segmentBreak, jitter), steps);
      smoothedDistance(t, moving, bends, gains, chords, stepNoise, jitter.median_interval_s * 1000, d);
      // Nothing reads these again: the smoothed path's four columns, the factors and the chords.
      spare.give(sLat, sLon, smooth.east_mps, smooth.north_mps, bends, gains, chords, steps);
      report = {
        source,
        smoothed: true,
        jitter_m: jitter.sigma_m,
        median_interval_s: jitter.median_interval_s,
        raw_distance_m: raw,
        distance_m: n > 0 ? (d[n - 1] as number) : 0,
      };
    } else {
      classifyMoving(t, segmentOf, { d: null, lat, lon, along: null, turnsUpTo: null }, moving);
      // Sparse track (points 2 s or more apart): chords cut bends by metres, so each step's chord is
      // lengthened to the curve the smoother's states give between its ends (position-smoother.ts,
      // `curveFactors`; the smoother's noise is the measured jitter, so noise is not taken for bends);
      // the chords stay the raw ones (smoothing 5 s steps with a jitter that holds real turns cut them).
      // Dense clean tracks keep the chord-to-arc factor through their turns.
      const sparse = jitter.median_interval_s > MAX_SMOOTHED_INTERVAL_S;
      const curve = sparse ? smoothPositions(t, lat, lon, segmentBreak, Math.max(jitter.sigma_m, SPARSE_FLOOR_JITTER_M)) : null;
      const bends = curve ? curveFactors(t, curve, segmentBreak, moving) : arcFactors(t, lat, lon, segmentBreak, moving);
      const raw = geodesicSteps(moving, lat, lon, bends, d);
      const total = n > 0 ? (d[n - 1] as number) : 0;
      report = {
        source,
        smoothed: false,
        jitter_m: jitter.sigma_m,
        median_interval_s: Number.isFinite(jitter.median_interval_s) ? jitter.median_interval_s : null,
        raw_distance_m: raw,
        distance_m: total,
      };
    }
  }

  const eleRecorded = points.ele.subarray(0, n);
  const ele = hasValue(eleRecorded) ? fillMissing(t, eleRecorded, spare.take()) : null;
  const eleSmooth = ele ? smoothByTime(t, ele, ELEVATION_SMOOTHING_HALF_WINDOW_S, spare.take()) : null;
  const eleFiltered = eleSmooth ? hysteresisProfile(eleSmooth, ELEVATION_HYSTERESIS_M, spare.take()) : null;
  if (ele) spare.give(ele);
  const hr = points.hr.subarray(0, n);
  const cad = points.cad.subarray(0, n);

  return {
    t,
    d,
    moving,
    segment_break: segmentBreak,
    ele_smooth: eleSmooth,
    ele_filtered: eleFiltered,
    hr: hasValue(hr) ? hr : null,
    cad: hasValue(cad) ? cad : null,
    flat_d: eleSmooth ? flatEquivalentDistances(d, eleSmooth, spare.take()) : null,
    distance_source: source,
    distance_report: report,
  };
}

/** How many of values[from..to) are not NaN. */
function countPresent(values: Float64Array, from: number, to: number): number {
  let count = 0;
  for (let i = from; i < to; i++) if (!Number.isNaN(values[i] as number)) count++;
  return count;
}

/** The first index in [from, to) whose value is NaN, or `to`. */
function firstMissing(values: Float64Array, from: number, to: number): number {
  let i = from;
  while (i < to && !Number.isNaN(values[i] as number)) i++;
  return i;
}

// The loops of `buildSeries`, each in a function of its own: a long track's first import compiles
// each small loop on its own instead of the whole of `buildSeries` again and again (issue 19).

/** segmentOf[i]: how many segment breaks come at or before point i. */
function segmentNumbers(segmentBreak: Uint8Array): Int32Array {
  const n = segmentBreak.length;
  const segmentOf = new Int32Array(n);
  for (let i = 1; i < n; i += BLOCK) segmentNumbersBlock(segmentBreak, segmentOf, i, Math.min(n, i + BLOCK));
  return segmentOf;
}

function segmentNumbersBlock(segmentBreak: Uint8Array, segmentOf: Int32Array, from: number, to: number): void {
  for (let i = from; i < to; i++) segmentOf[i] = (segmentOf[i - 1] as number) + (segmentBreak[i] as number);
}

/** d[i] = the largest of filled[0..i] − filled[0], and at least 0. */
function nonDecreasingFromStart(filled: Float64Array, d: Float64Array): void {
  const d0 = filled[0] ?? 0;
  let level = 0;
  for (let i = 0; i < d.length; i++) {
    level = Math.max(level, (filled[i] as number) - d0);
    d[i] = level;
  }
}

/** Cumulative length of the smoothed path (`approxDistance` per step) and the count of turn points up to each point. */
function pathAlong(
  sLat: Float64Array,
  sLon: Float64Array,
  turn: Uint8Array | null,
  along: Float64Array,
  turnsUpTo: Int32Array,
): void {
  for (let i = 1; i < along.length; i += BLOCK)
    pathAlongBlock(sLat, sLon, turn, along, turnsUpTo, i, Math.min(along.length, i + BLOCK));
}

function pathAlongBlock(
  sLat: Float64Array,
  sLon: Float64Array,
  turn: Uint8Array | null,
  along: Float64Array,
  turnsUpTo: Int32Array,
  from: number,
  to: number,
): void {
  for (let i = from; i < to; i++) {
    along[i] =
      (along[i - 1] as number) +
      approxDistance(sLat[i - 1] as number, sLon[i - 1] as number, sLat[i] as number, sLon[i] as number);
    turnsUpTo[i] = (turnsUpTo[i - 1] as number) + (turn ? (turn[i] as number) : 0);
  }
}

/** Each moving step of the smoothed path into `chords`; returns the raw positions' moving length (for the report). */
function movingSteps(
  moving: Uint8Array,
  sLat: Float64Array,
  sLon: Float64Array,
  lat: Float64Array,
  lon: Float64Array,
  chords: Float64Array,
): number {
  let raw = 0;
  for (let i = 1; i < chords.length; i += BLOCK)
    raw = movingStepsBlock(moving, sLat, sLon, lat, lon, chords, raw, i, Math.min(chords.length, i + BLOCK));
  return raw;
}

/** `movingSteps` over points [from, to), adding to `raw` (returned). */
function movingStepsBlock(
  moving: Uint8Array,
  sLat: Float64Array,
  sLon: Float64Array,
  lat: Float64Array,
  lon: Float64Array,
  chords: Float64Array,
  raw: number,
  from: number,
  to: number,
): number {
  for (let i = from; i < to; i++)
    if (moving[i]) {
      chords[i] = localDistance(sLat[i - 1] as number, sLon[i - 1] as number, sLat[i] as number, sLon[i] as number);
      raw += localDistance(lat[i - 1] as number, lon[i - 1] as number, lat[i] as number, lon[i] as number);
    }
  return raw;
}

/** Cumulative distance of a smoothed track: each moving step without its noise, times its bend and gain factors. */
function smoothedDistance(
  t: Float64Array,
  moving: Uint8Array,
  bends: Float64Array,
  gains: Float64Array,
  chords: Float64Array,
  stepNoise: number,
  intervalMs: number,
  d: Float64Array,
): void {
  for (let i = 1; i < d.length; i += BLOCK)
    smoothedDistanceBlock(t, moving, bends, gains, chords, stepNoise, intervalMs, d, i, Math.min(d.length, i + BLOCK));
}

function smoothedDistanceBlock(
  t: Float64Array,
  moving: Uint8Array,
  bends: Float64Array,
  gains: Float64Array,
  chords: Float64Array,
  stepNoise: number,
  intervalMs: number,
  d: Float64Array,
  from: number,
  to: number,
): void {
  for (let i = from; i < to; i++) {
    let step = 0;
    if (moving[i]) {
      const dt = (t[i] as number) - (t[i - 1] as number);
      // Only steps of the usual interval: the variance is that of one such step.
      const noise = dt <= 1.5 * intervalMs ? stepNoise * (dt / intervalMs) ** 2 : 0;
      step = (bends[i] as number) * (gains[i] as number) * stepWithoutNoise(chords[i] as number, noise);
    }
    d[i] = (d[i - 1] as number) + step;
  }
}

/** Cumulative distance of an unsmoothed track (geodesic chord of each moving step times its bend factor); returns the raw sum. */
function geodesicSteps(moving: Uint8Array, lat: Float64Array, lon: Float64Array, bends: Float64Array, d: Float64Array): number {
  let raw = 0;
  for (let i = 1; i < d.length; i++) {
    const chord = moving[i]
      ? geodesicDistance(lat[i - 1] as number, lon[i - 1] as number, lat[i] as number, lon[i] as number)
      : 0;
    raw += chord;
    d[i] = (d[i - 1] as number) + chord * (bends[i] as number);
  }
  return raw;
}

/** `distance` with readings that jump ahead faster than `DEVICE_DISTANCE_MAX_SPEED_MPS` set to NaN. */
export function withoutDistanceSpikes(t: Float64Array, distance: Float64Array): Float64Array {
  const out = Float64Array.from(distance);
  let lastT = Number.NaN;
  let lastD = Number.NaN;
  for (let i = 0; i < out.length; i++) {
    const d = out[i] as number;
    if (Number.isNaN(d)) continue;
    const seconds = ((t[i] as number) - lastT) / 1000;
    // 1 m of slack: devices round their readings.
    if (d - lastD > DEVICE_DISTANCE_MAX_SPEED_MPS * seconds + 1) {
      out[i] = Number.NaN;
      continue;
    }
    lastT = t[i] as number;
    lastD = d;
  }
  return out;
}

function keepPositioned(points: PointColumns, starts: readonly number[]): { points: PointColumns; starts: number[] } {
  const { lat, lon } = points;
  let firstUnpositioned = 0;
  while (firstUnpositioned < points.length) {
    const to = Math.min(points.length, firstUnpositioned + BLOCK);
    firstUnpositioned = firstMissing(lat, firstUnpositioned, to);
    if (firstUnpositioned < to) break;
  }
  // Usually every point has a position: nothing to copy then.
  if (firstUnpositioned === points.length) return { points, starts: [...starts] };
  const kept: number[] = [];
  const keptStarts: number[] = [];
  let nextStart = 0;
  let pendingStart = false;
  for (let i = 0; i < points.length; i++) {
    while (nextStart < starts.length && (starts[nextStart] as number) <= i) {
      nextStart++;
      pendingStart = true;
    }
    if (Number.isNaN(lat[i] as number) || Number.isNaN(lon[i] as number)) continue;
    if (pendingStart) {
      keptStarts.push(kept.length);
      pendingStart = false;
    }
    kept.push(i);
  }
  return { points: points.select(kept), starts: keptStarts };
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

/**
 * Variance (m², per axis) of the receiver's error left in one smoothed step, when the excess length it
 * adds at the run's median moving step is at least `MIN_CORRECTED_EXCESS`; else 0 (nothing removed).
 */
export function noiseToRemove(
  t: ArrayLike<number>,
  chords: Float64Array,
  moving: Uint8Array,
  jitter: JitterEstimate,
  wander: WanderModel | null,
  /** Room for one number per point (only the values written here are read). */
  steps: Float64Array = new Float64Array(chords.length),
): number {
  if (!wander) return 0;
  const variance = smoothedStepNoiseVariance(jitter.median_interval_s, jitter.sigma_m, wander);
  const intervalMs = jitter.median_interval_s * 1000;
  let count = 0;
  for (let i = 1; i < chords.length; i += BLOCK)
    count = usualSteps(t, chords, moving, intervalMs, steps, count, i, Math.min(chords.length, i + BLOCK));
  if (count === 0) return 0;
  const typical = kthSmallest(steps, count, count >> 1);
  return typical > 0 && variance / (2 * typical * typical) >= MIN_CORRECTED_EXCESS ? variance : 0;
}

/** Moving steps of the usual interval among [from, to) appended to `steps` after its first `count`; returns the new count. */
function usualSteps(
  t: ArrayLike<number>,
  chords: Float64Array,
  moving: Uint8Array,
  intervalMs: number,
  steps: Float64Array,
  count: number,
  from: number,
  to: number,
): number {
  let m = count;
  for (let i = from; i < to; i++)
    if (moving[i] && Math.abs((t[i] as number) - (t[i - 1] as number) - intervalMs) <= intervalMs * 0.01)
      steps[m++] = chords[i] as number;
  return m;
}

/**
 * The moving threshold (m/s) for a noisy track: wander of the positions while standing must not
 * count as moving. White jitter σ seen in third differences (20σ²) is matched by a random walk
 * of 20σ²/6 m² per second (third differences of a random walk: 6 × its step variance); over the
 * window that walk drifts √(2·W·20σ²/6) metres (both axes, rms). A window must beat 1.5 times
 * that drift (our margin) and never less than `MOVING_SPEED_MPS`.
 */
export function noiseAwareMovingSpeed(jitterM: number): number {
  const drift = Math.sqrt((2 * MOVING_WINDOW_S * 20 * jitterM * jitterM) / 6);
  return Math.max(MOVING_SPEED_MPS, (1.5 * drift) / MOVING_WINDOW_S);
}

/**
 * What a moving window's displacement is measured on: the series' own distance (`d`), the straight line
 * between two positions (`lat`, `lon`), and with `along` and `turnsUpTo` the path's length instead where
 * a turn lies between the window's ends. One shape for every track, so the loops stay monomorphic.
 */
interface DisplacementSource {
  d: Float64Array | null;
  lat: ArrayLike<number> | null;
  lon: ArrayLike<number> | null;
  along: Float64Array | null;
  turnsUpTo: Int32Array | null;
}

/**
 * The displacement between points a and b (`DisplacementSource`, its columns passed one by one: an object
 * made per call deoptimised the compiled loops on a long run's first analysis, "code dependencies"). Where
 * the path's length may be taken, both figures are formed on every call, so a track whose first turn comes
 * late runs the same compiled code as one without.
 */
function displacementOf(
  d: Float64Array | null,
  lat: ArrayLike<number> | null,
  lon: ArrayLike<number> | null,
  along: Float64Array | null,
  turnsUpTo: Int32Array | null,
  a: number,
  b: number,
): number {
  if (d !== null) return (d[b] as number) - (d[a] as number);
  const straight = approxDistance(
    (lat as ArrayLike<number>)[a] as number,
    (lon as ArrayLike<number>)[a] as number,
    (lat as ArrayLike<number>)[b] as number,
    (lon as ArrayLike<number>)[b] as number,
  );
  if (along === null || turnsUpTo === null) return straight;
  const path = (along[b] as number) - (along[a] as number);
  return turnsUpTo[b] !== turnsUpTo[a] ? path : straight;
}

function classifyMoving(
  t: Float64Array,
  segmentOf: Int32Array,
  source: DisplacementSource,
  moving: Uint8Array,
  threshold = MOVING_SPEED_MPS,
): void {
  const n = t.length;
  const { d, lat, lon, along, turnsUpTo } = source;
  for (let i = 1; i < n; i += BLOCK)
    classifyBlock(t, segmentOf, d, lat, lon, along, turnsUpTo, moving, threshold, i, Math.min(n, i + BLOCK));
  const original = moving.slice();
  for (let i = 1; i < n; i += BLOCK)
    refineBlock(t, segmentOf, d, lat, lon, along, turnsUpTo, original, moving, i, Math.min(n, i + BLOCK));
}

/** Step 1 of `classifyMoving` for intervals [from, to). */
function classifyBlock(
  t: Float64Array,
  segmentOf: Int32Array,
  d: Float64Array | null,
  lat: ArrayLike<number> | null,
  lon: ArrayLike<number> | null,
  along: Float64Array | null,
  turnsUpTo: Int32Array | null,
  moving: Uint8Array,
  threshold: number,
  from: number,
  to: number,
): void {
  const n = t.length;
  const windowMs = MOVING_WINDOW_S * 1000;
  for (let i = from; i < to; i++) {
    const seg = segmentOf[i] as number;
    if ((segmentOf[i - 1] as number) !== seg) continue;
    let a = i - 1;
    let b = i;
    while ((t[b] as number) - (t[a] as number) < windowMs) {
      // A window never reaches across a recording gap or auto-pause (an interval longer than the
      // window itself): the running just before and after it is judged on its own.
      const canLeft = a > 0 && segmentOf[a - 1] === seg && (t[a] as number) - (t[a - 1] as number) <= windowMs;
      const canRight = b + 1 < n && segmentOf[b + 1] === seg && (t[b + 1] as number) - (t[b] as number) <= windowMs;
      if (!canLeft && !canRight) break;
      const leftSpan = (t[i - 1] as number) - (t[a] as number);
      const rightSpan = (t[b] as number) - (t[i] as number);
      if (canLeft && (!canRight || leftSpan <= rightSpan)) a--;
      else b++;
    }
    const seconds = ((t[b] as number) - (t[a] as number)) / 1000;
    moving[i] = displacementOf(d, lat, lon, along, turnsUpTo, a, b) / seconds >= threshold ? 1 : 0;
  }
}

/**
 * Step 2 of `classifyMoving` for the stopped intervals in [from, to) of `original` (it may clear moving
 * intervals outside it): each stop widened over neighbouring intervals slower than `STOP_EDGE_SPEED_MPS`.
 */
function refineBlock(
  t: Float64Array,
  segmentOf: Int32Array,
  d: Float64Array | null,
  lat: ArrayLike<number> | null,
  lon: ArrayLike<number> | null,
  along: Float64Array | null,
  turnsUpTo: Int32Array | null,
  original: Uint8Array,
  moving: Uint8Array,
  from: number,
  to: number,
): void {
  const n = t.length;
  const reachMs = (MOVING_WINDOW_S * 1000) / 2;
  for (let i = from; i < to; i++) {
    if (original[i] || segmentOf[i - 1] !== segmentOf[i]) continue;
    const seg = segmentOf[i];
    const isStart = i === 1 || original[i - 1] || segmentOf[i - 2] !== seg;
    const isEnd = i === n - 1 || original[i + 1] || segmentOf[i + 1] !== seg;
    if (isStart) {
      const edge = t[i - 1] as number;
      for (let k = i - 1; k >= 1 && segmentOf[k - 1] === seg && original[k]; k--) {
        if (edge - (t[k - 1] as number) > reachMs) break;
        // Slower than STOP_EDGE_SPEED_MPS over interval k?
        const speed =
          displacementOf(d, lat, lon, along, turnsUpTo, k - 1, k) / (((t[k] as number) - (t[k - 1] as number)) / 1000);
        if (!(speed < STOP_EDGE_SPEED_MPS)) break;
        moving[k] = 0;
      }
    }
    if (isEnd) {
      const edge = t[i] as number;
      for (let k = i + 1; k < n && segmentOf[k] === seg && original[k]; k++) {
        if ((t[k] as number) - edge > reachMs) break;
        const speed =
          displacementOf(d, lat, lon, along, turnsUpTo, k - 1, k) / (((t[k] as number) - (t[k - 1] as number)) / 1000);
        if (!(speed < STOP_EDGE_SPEED_MPS)) break;
        moving[k] = 0;
      }
    }
  }
}

function hasValue(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i] as number)) return true;
  return false;
}

/** `out`: zeros, one per point (the result; steps that do not move keep 0). */
function flatEquivalentDistances(d: Float64Array, ele: Float64Array, out: Float64Array): Float64Array {
  const n = d.length;
  // The window's two ends, carried from block to block.
  const ends = new Int32Array(2);
  for (let i = 1; i < n; i += BLOCK) flatEquivalentBlock(d, ele, out, ends, i, Math.min(n, i + BLOCK));
  return out;
}

function flatEquivalentBlock(
  d: Float64Array,
  ele: Float64Array,
  out: Float64Array,
  ends: Int32Array,
  from: number,
  to: number,
): void {
  const n = d.length;
  let a = ends[0] as number;
  let b = ends[1] as number;
  for (let i = from; i < to; i++) {
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
  ends[0] = a;
  ends[1] = b;
}

/**
 * Latitude and longitude of every point of `series` (NaN where a point has none), for storing
 * the track: in geodesic mode the series holds only the positioned points, otherwise all of them.
 */
export function seriesPositions(track: CleanTrack, series: TrackSeries): { lat: Float64Array; lon: Float64Array } {
  const { columns } = track;
  const kept: number[] = [];
  if (series.distance_source === 'geodesic') {
    for (let i = 0; i < columns.length; i++) if (!Number.isNaN(columns.lat[i] as number)) kept.push(i);
  }
  const aligned = kept.length === 0 || kept.length === columns.length ? columns : columns.select(kept);
  return { lat: aligned.column('lat'), lon: aligned.column('lon') };
}
