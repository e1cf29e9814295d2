/**
 * Smoothing noisy GPS positions before their length is measured.
 *
 * Why: the length of a path drawn through noisy points is biased long. Each step's error across
 * the direction of travel adds about (jitter variance) / (step length) to the step, so 1 s files
 * from consumer receivers read 1–2 % long while 5 s files (steps five times longer) hardly do.
 *
 * Method: a constant-velocity Kalman filter followed by the Rauch–Tung–Striebel fixed-interval
 * smoother (Rauch, Tung & Striebel 1965, "Maximum likelihood estimates of linear dynamic
 * systems", AIAA Journal 3(8):1445–1450), run separately on east and north metres of a local
 * tangent plane. The motion model is the continuous white-noise acceleration model in its
 * textbook form (Bar-Shalom, Li & Kirubarajan 2001, "Estimation with Applications to Tracking and
 * Navigation", §6.2.2): state (position, velocity), F = [[1, Δt], [0, 1]],
 * Q = q·[[Δt³/3, Δt²/2], [Δt²/2, Δt]], measurement = position with variance r.
 *
 * Strength: both axes share q and r, so the gains are computed once. r is the file's own jitter,
 * measured from third differences of the positions (`measureJitter`): running motion has almost
 * no jerk at 1 s, white noise of variance r gives third differences of variance 20 r. q is fixed
 * (`ACCELERATION_DENSITY`) from how sharply a runner changes speed or turns. In the frequency
 * domain the smoother is a low-pass filter 1 / (1 + (ω/ω_c)⁴) with ω_c = (q / r)^¼, so the
 * more jitter, the lower the cut-off; clean files (jitter under `MIN_JITTER_M`) and sparse files
 * (median interval over `MAX_SMOOTHED_INTERVAL_S`) are not smoothed at all.
 *
 * The slow part of the receiver's wander cannot be smoothed away (it moves like a runner); the length
 * its across-track velocity still adds to each smoothed step is taken out afterwards
 * (`measureWander`, `smoothedStepNoiseVariance`, `stepWithoutNoise`; shared/tracks/README.md).
 *
 * Pure: no I/O, inputs are not modified.
 */

import { BLOCK } from './blocks.ts';

/**
 * Spectral density of the runner's acceleration in the motion model, m²/s³. Textbook guidance for
 * the white-noise acceleration model is √(q·T) of the order of the largest acceleration expected
 * over one interval T (Bar-Shalom et al. 2001, §6.2.2); running changes speed by up to about
 * 1 m/s² at the start of a rep and turns at 0.5 m/s² on a 400 m track's bend, so with T = 1 s,
 * q = 0.5 is about right. A larger q keeps more detail (and more noise).
 */
export const ACCELERATION_DENSITY = 0.05;
/**
 * Below this jitter (standard deviation per axis, m) a file is treated as clean: its expected
 * excess length at running speed over 1 s steps is under 0.01 % (r / L² with L ≈ 3 m).
 */
export const MIN_JITTER_M = 0.03;
/**
 * Files sampled more sparsely than this (median interval, s) are not smoothed: at 2 s the jitter
 * excess is already four times smaller than at 1 s, and third differences start to hold real motion.
 */
export const MAX_SMOOTHED_INTERVAL_S = 1.5;
/**
 * The least measurement noise (m per axis) the smoother assumes for a sparse track: GPX stores
 * positions to 1e-7° (about 1 cm), and a receiver's own filtering leaves more.
 */
export const SPARSE_FLOOR_JITTER_M = 0.05;
/** Intervals longer than this (s) end a smoothing stretch, like a new segment. */
export const SMOOTHING_GAP_S = 10;
/** At most this many third differences are used to measure the jitter (evenly spread over the run). */
const JITTER_SAMPLE = 20_000;

const WGS84_A = 6378137;
const WGS84_E2 = 0.00669437999014;
const DEG = Math.PI / 180;
const PI = Math.PI;
const TWO_PI = 2 * Math.PI;
/**
 * NaN, read from the module's scope: `Number.NaN` inside a hot loop is a property read whose first use
 * after the loop was compiled deoptimised it (tests/bench/README.md, "Session 10").
 */
const NOT_A_NUMBER = Number.NaN;

/** Metres per degree of latitude and of longitude at latitude `latDeg` (WGS-84 radii of curvature). */
export function metresPerDegree(latDeg: number): { north: number; east: number } {
  const s = Math.sin(latDeg * DEG);
  const w = Math.sqrt(1 - WGS84_E2 * s * s);
  const meridian = (WGS84_A * (1 - WGS84_E2)) / (w * w * w);
  const normal = WGS84_A / w;
  return { north: meridian * DEG, east: normal * Math.cos(latDeg * DEG) * DEG };
}

/**
 * Distance in metres between two nearby points on WGS-84 from the radii of curvature at their
 * mean latitude (a local tangent plane). For steps of up to 100 m it agrees with the geodesic to
 * well under a millimetre (checked against GeographicLib in the unit tests), which is why it is
 * used for the many short steps of a smoothed track.
 */
export function localDistance(lat1: number, lon1: number, lat2: number, lon2: number): number {
  // `metresPerDegree` written out (the same operations): no object per step of a 100 000-point track.
  const latDeg = (lat1 + lat2) / 2;
  const s = Math.sin(latDeg * DEG);
  const w = Math.sqrt(1 - WGS84_E2 * s * s);
  const north = ((WGS84_A * (1 - WGS84_E2)) / (w * w * w)) * DEG;
  const east = (WGS84_A / w) * Math.cos(latDeg * DEG) * DEG;
  let dLon = lon2 - lon1;
  if (dLon > 180) dLon -= 360;
  else if (dLon < -180) dLon += 360;
  return Math.hypot(dLon * east, (lat2 - lat1) * north);
}

export interface JitterEstimate {
  /** White-equivalent position jitter per axis, m (√r); 0 when it could not be measured. */
  sigma_m: number;
  /** Median interval between consecutive points of a segment, s (NaN with fewer than two). */
  median_interval_s: number;
  /** Third differences the estimate is based on. */
  samples: number;
}

/**
 * The `k`-th smallest (0-based) of the first `count` values, which are finite: the value `sort()` would
 * put at index k, found in linear expected time by partitioning around a pivot (Hoare's FIND, in Wirth's
 * form: N. Wirth 1976, "Algorithms + Data Structures = Programs", §2.3.4). Reorders the values so that
 * those before k are no larger and those after no smaller. Sorting the 20 000–100 000 values of a long
 * run only to read its middle took several times longer.
 */
export function kthSmallest(values: Float64Array, count: number, k: number): number {
  let lo = 0;
  let hi = count - 1;
  while (lo < hi) {
    const pivot = values[k] as number;
    let i = lo;
    let j = hi;
    do {
      while ((values[i] as number) < pivot) i++;
      while (pivot < (values[j] as number)) j--;
      if (i <= j) {
        const swap = values[i] as number;
        values[i] = values[j] as number;
        values[j] = swap;
        i++;
        j--;
      }
    } while (i <= j);
    if (j < k) lo = i;
    if (k < i) hi = j;
  }
  return values[k] as number;
}

/** Median of the first `count` values, which are finite (reorders them). */
function median(values: Float64Array, count: number): number {
  if (count === 0) return Number.NaN;
  const mid = count >> 1;
  if (count % 2) return kthSmallest(values, count, mid);
  const below = kthSmallest(values, count, mid - 1);
  // Everything after index mid − 1 is no smaller: the next value up is their least.
  let above = values[mid] as number;
  for (let i = mid + 1; i < count; i++) if ((values[i] as number) < above) above = values[i] as number;
  return (below + above) / 2;
}

/**
 * Measures the jitter of a track's positions. Over four consecutive, evenly spaced points of one
 * segment the third difference x₃ − 3x₂ + 3x₁ − x₀ removes position, velocity and steady
 * acceleration (a runner's turns and speed changes leave almost nothing at 1–2 s), while white
 * noise of variance r leaves variance (1 + 9 + 9 + 1)·r = 20 r. The spread is taken robustly
 * (median absolute value / 0.6745, the normal consistency constant), over east and north, so a few
 * sharp turns or glitches do not count as jitter.
 *
 * `segmentStart[i]` is 1 where point i begins a segment. Latitude and longitude in degrees, times
 * in ms, strictly increasing.
 */
export function measureJitter(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
): JitterEstimate {
  const n = t.length;
  if (n < 2) return { sigma_m: 0, median_interval_s: Number.NaN, samples: 0 };
  const intervals = new Float64Array(n - 1);
  let count = 0;
  const stride = Math.max(1, Math.floor(n / JITTER_SAMPLE));
  // Blocks of BLOCK samples (blocks.ts), each starting on the stride's own grid.
  for (let i = 1; i < n; i += stride * BLOCK)
    count = sampleIntervals(t, segmentStart, stride, intervals, count, i, Math.min(n, i + stride * BLOCK));
  const medianMs = median(intervals, count);
  if (!(medianMs > 0)) return { sigma_m: 0, median_interval_s: Number.NaN, samples: 0 };
  const { north, east } = metresPerDegree(lat[0] as number);
  const third = new Float64Array(2 * Math.ceil(n / stride) + 2);
  let m = 0;
  for (let i = 3; i < n; i += stride * BLOCK)
    m = sampleThirdDifferences(
      t,
      lat,
      lon,
      segmentStart,
      stride,
      medianMs,
      north,
      east,
      third,
      m,
      i,
      Math.min(n, i + stride * BLOCK),
    );
  if (m < 20) return { sigma_m: 0, median_interval_s: medianMs / 1000, samples: m };
  const spread = median(third, m) / 0.6744897501960817;
  return { sigma_m: spread / Math.sqrt(20), median_interval_s: medianMs / 1000, samples: m };
}

/** Intervals at i = from, from + stride, … (< to) that do not start a segment, appended after `count`; returns the new count. */
function sampleIntervals(
  t: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  stride: number,
  intervals: Float64Array,
  count: number,
  from: number,
  to: number,
): number {
  let c = count;
  for (let i = from; i < to; i += stride) if (!segmentStart[i]) intervals[c++] = (t[i] as number) - (t[i - 1] as number);
  return c;
}

/** `measureJitter`'s third differences at i = from, from + stride, … (< to), appended after `count`; returns the new count. */
function sampleThirdDifferences(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  stride: number,
  medianMs: number,
  north: number,
  east: number,
  third: Float64Array,
  count: number,
  from: number,
  to: number,
): number {
  let m = count;
  for (let i = from; i < to; i += stride) {
    if (segmentStart[i] || segmentStart[i - 1] || segmentStart[i - 2]) continue;
    const dt1 = (t[i - 2] as number) - (t[i - 3] as number);
    // Evenly spaced only (within 1 %): uneven spacing would leak velocity into the difference.
    if (Math.abs(dt1 - medianMs) > medianMs * 0.01) continue;
    if (Math.abs((t[i - 1] as number) - (t[i - 2] as number) - dt1) > dt1 * 0.01) continue;
    if (Math.abs((t[i] as number) - (t[i - 1] as number) - dt1) > dt1 * 0.01) continue;
    const dLat = (lat[i] as number) - 3 * (lat[i - 1] as number) + 3 * (lat[i - 2] as number) - (lat[i - 3] as number);
    const dLon = (lon[i] as number) - 3 * (lon[i - 1] as number) + 3 * (lon[i - 2] as number) - (lon[i - 3] as number);
    third[m++] = Math.abs(dLat * north);
    third[m++] = Math.abs(dLon * east);
  }
  return m;
}

/**
 * The receiver's error per axis as two parts: white jitter (independent from point to point) and a
 * slow wander, a first-order Gauss–Markov process (an Ornstein–Uhlenbeck position bias: variance
 * `sigma_m`², correlation time `tau_s`), as consumer receivers show.
 */
export interface WanderModel {
  white_m: number;
  sigma_m: number;
  tau_s: number;
}

/**
 * Robust variance (m², per axis) of third differences over points `lag` intervals apart,
 * x(i) − 3x(i − L) + 3x(i − 2L) − x(i − 3L), on evenly spaced points of one segment; NaN when fewer
 * than 20 could be formed.
 */
export function thirdDifferenceVariance(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  lag: number,
  intervalMs: number,
  counted?: { samples: number },
): number {
  const n = t.length;
  if (n < 3 * lag + 1 || !(intervalMs > 0)) return Number.NaN;
  const { north, east } = metresPerDegree(lat[0] as number);
  const stride = Math.max(1, Math.floor(n / JITTER_SAMPLE));
  const third = new Float64Array(2 * Math.ceil(n / stride) + 2);
  let m = 0;
  for (let i = 3 * lag; i < n; i += stride * BLOCK)
    m = sampleLaggedDifferences(
      t,
      lat,
      lon,
      segmentStart,
      lag,
      intervalMs,
      stride,
      north,
      east,
      third,
      m,
      i,
      Math.min(n, i + stride * BLOCK),
    );
  if (counted) counted.samples = m;
  if (m < 20) return Number.NaN;
  const spread = median(third, m) / 0.6744897501960817;
  return spread * spread;
}

/** `thirdDifferenceVariance`'s differences at i = from, from + stride, … (< to), appended after `count`; returns the new count. */
function sampleLaggedDifferences(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  lag: number,
  intervalMs: number,
  stride: number,
  north: number,
  east: number,
  third: Float64Array,
  count: number,
  from: number,
  to: number,
): number {
  const span = 3 * lag * intervalMs;
  let m = count;
  for (let i = from; i < to; i += stride) {
    // No segment break inside the span, and every one of its intervals the usual one (within 1 %).
    let even = Math.abs((t[i] as number) - (t[i - 3 * lag] as number) - span) <= span * 0.01;
    for (let j = i - 3 * lag + 1; even && j <= i; j++)
      even = !segmentStart[j] && Math.abs((t[j] as number) - (t[j - 1] as number) - intervalMs) <= intervalMs * 0.01;
    if (!even) continue;
    const a = i - lag;
    const b = i - 2 * lag;
    const c = i - 3 * lag;
    const dLat = (lat[i] as number) - 3 * (lat[a] as number) + 3 * (lat[b] as number) - (lat[c] as number);
    const dLon = (lon[i] as number) - 3 * (lon[a] as number) + 3 * (lon[b] as number) - (lon[c] as number);
    third[m++] = Math.abs(dLat * north);
    third[m++] = Math.abs(dLon * east);
  }
  return m;
}

/**
 * Correlation time assumed for the wander, s. Positions alone cannot tell a wander that slow from the
 * runner's own path (both move smoothly), so it is not measured; consumer receivers' errors are
 * correlated over tens of seconds to minutes. What adds length is the wander's velocity noise
 * D = 2σ²/τ, which is measured from the file; with D fixed, τ from 20 to 120 s moves the predicted
 * step noise by under 10 %.
 */
export const WANDER_CORRELATION_S = 60;

/**
 * A wander is measured only when the lag-2 variance exceeds the lag-1 one by this many standard errors
 * of their difference (common practice: a 3σ test).
 */
export const WANDER_SIGNIFICANCE = 3;

/**
 * Relative standard error of a variance estimated from m absolute values by their median (the MAD
 * estimate of σ has asymptotic variance 1.3605 σ²/m for normal data: Rousseeuw & Croux 1993, JASA 88,
 * "Alternatives to the median absolute deviation"; the variance's relative error is twice the σ's).
 */
function wanderVariableError(samples: number): number {
  return samples > 0 ? 2 * Math.sqrt(1.3605 / samples) : Number.POSITIVE_INFINITY;
}

/**
 * Splits the file's own jitter into white jitter and a slow wander from third differences at lags of
 * one and two intervals. White noise of variance r gives 20 r at every lag; a wander of variance σ²
 * and correlation time τ ≫ the lag gives 12 σ² L Δt / τ (it moves like a random walk of velocity
 * noise density D = 2σ²/τ, third differences 6 D L Δt): so D = (V₂ − V₁) / (6 Δt) and
 * r = (2 V₁ − V₂) / 20. τ is `WANDER_CORRELATION_S` and σ² = D τ / 2. Null when the jitter cannot
 * be split (too few even points).
 */
export function measureWander(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  jitter: JitterEstimate,
  tauS = WANDER_CORRELATION_S,
): WanderModel | null {
  const intervalMs = jitter.median_interval_s * 1000;
  const at1 = { samples: 0 };
  const at2 = { samples: 0 };
  const v1 = thirdDifferenceVariance(t, lat, lon, segmentStart, 1, intervalMs, at1);
  const v2 = thirdDifferenceVariance(t, lat, lon, segmentStart, 2, intervalMs, at2);
  if (!Number.isFinite(v1) || !Number.isFinite(v2)) return null;
  // A difference within the sampling error of the two variances is not a wander: on a short track of
  // white jitter alone it would read as metres of wander (σ² = D·τ/2 multiplies the error by τ/(12 Δt)).
  const standardError = Math.hypot(v1 * wanderVariableError(at1.samples), v2 * wanderVariableError(at2.samples));
  if (v2 - v1 < WANDER_SIGNIFICANCE * standardError) return { white_m: Math.sqrt(v1 / 20), sigma_m: 0, tau_s: tauS };
  const density = Math.max(0, (v2 - v1) / (6 * jitter.median_interval_s));
  const white = Math.max(0, (2 * v1 - v2) / 20);
  return { white_m: Math.sqrt(white), sigma_m: Math.sqrt((density * tauS) / 2), tau_s: tauS };
}

/** Points either side of the impulse when the smoother's response is taken (it decays within a few tens of seconds). */
const RESPONSE_HALF_WIDTH = 120;

/**
 * The smoother's weights on evenly spaced points: its response to one unit measurement in the middle
 * of a long stretch (index `RESPONSE_HALF_WIDTH` + m is the weight of the measurement m points away).
 */
export function smootherWeights(intervalS: number, filterSigmaM: number, q = ACCELERATION_DENSITY): Float64Array {
  const n = 2 * RESPONSE_HALF_WIDTH + 1;
  const t = Float64Array.from({ length: n }, (_, i) => i * intervalS * 1000);
  const z = new Float64Array(n);
  z[RESPONSE_HALF_WIDTH] = 1;
  const states = planeStates(n);
  smoothStretch(t, z, new Float64Array(n), states, 0, n, filterSigmaM * filterSigmaM, q, null, null, q, stretchWork(n));
  return states.sx;
}

/**
 * Variance (m², per axis) that the receiver's error leaves in one step of the smoothed path, for a
 * track `intervalS` seconds apart smoothed by `smoothPositions` with noise `filterSigmaM` and
 * acceleration density `q`, when the error is white jitter plus a first-order Gauss–Markov wander
 * (`noise`). Exact for the smoother away from the ends of a stretch: the smoother is linear, so its
 * smoothed position is Σ w(m) zᵢ₋ₘ with the weights w read off its response to one unit measurement,
 * a step's error is Σ g(m) nᵢ₋ₘ with g(m) = w(m) − w(m − 1), and its variance is
 * Σₘ Σₗ g(m) g(l) C(m − l) with C the error's autocovariance σ² ρ^|k| + r δₖ.
 */
export function smoothedStepNoiseVariance(
  intervalS: number,
  filterSigmaM: number,
  noise: WanderModel,
  q = ACCELERATION_DENSITY,
): number {
  const w = smootherWeights(intervalS, filterSigmaM, q);
  // Weight of the measurement m points before: w(m) = response at RESPONSE_HALF_WIDTH + m.
  const half = RESPONSE_HALF_WIDTH - 1;
  const g = new Float64Array(2 * half + 1);
  for (let m = -half; m <= half; m++)
    g[m + half] = (w[RESPONSE_HALF_WIDTH + m] as number) - (w[RESPONSE_HALF_WIDTH + m - 1] as number);
  const rho = Math.exp(-intervalS / noise.tau_s);
  const wander = noise.sigma_m * noise.sigma_m;
  const white = noise.white_m * noise.white_m;
  const covariance = Float64Array.from({ length: g.length }, (_, k) => wander * rho ** k);
  let variance = 0;
  for (let a = 0; a < g.length; a++) {
    const ga = g[a] as number;
    if (ga === 0) continue;
    variance += ga * ga * white;
    for (let b = 0; b < g.length; b++) variance += ga * (g[b] as number) * (covariance[Math.abs(a - b)] as number);
  }
  return variance;
}

/**
 * The noise correction of a step's length is applied only when the excess it removes, at the run's
 * median moving step, is at least this share of the distance. Below it, the other biases of the
 * measure (corners the smoother rounds, running lost at the edges of stops: −0.1 to −0.3 % on the
 * generated tracks with 0.3–1 m of wander) are as large as the excess, and removing one without the
 * others made splits worse there (shared/tracks/README.md, "The wander").
 */
export const MIN_CORRECTED_EXCESS = 0.003;

/**
 * Length of one smoothed step with the receiver's error taken out (method of moments). A step of true
 * length ℓ with an error of variance s² per axis measures ℓ̂² = (ℓ + e_along)² + e_across², whose
 * across part adds s² / (2ℓ) on average: the length a noisy path gains (Ranacher et al. 2016, "Why GPS
 * makes distances bigger than they are", Int. J. Geographical Information Science 30(2)). So
 * √(ℓ̂² − s²) is the step's length without that gain, to first order in s / ℓ; 0 when ℓ̂² < s².
 */
export function stepWithoutNoise(measured: number, stepNoiseVariance: number): number {
  return Math.sqrt(Math.max(0, measured * measured - stepNoiseVariance));
}

/** Whether a track with this jitter is smoothed at all (clean or sparse tracks are not). */
export function shouldSmooth(jitter: JitterEstimate): boolean {
  return jitter.sigma_m >= MIN_JITTER_M && jitter.median_interval_s <= MAX_SMOOTHED_INTERVAL_S;
}

/**
 * Kalman filter + RTS smoother of positions (see the module comment). Returns smoothed latitude and
 * longitude; stretches restart at every segment start and at intervals over `SMOOTHING_GAP_S`.
 * `sigmaM` is the measurement noise (√r, m) and `q` the acceleration density (m²/s³); with `qSteps`,
 * the step into point i has density qSteps[i] instead (`smoothPositionsThroughTurns`).
 */
export function smoothPositions(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  sigmaM: number,
  q = ACCELERATION_DENSITY,
  qSteps: Float64Array | null = null,
): SmoothedPositions {
  const plane = toPlane(lat, lon);
  const steps = { qSteps, turnMarks: null, qTurn: q };
  const states = smoothInPlane(t, plane, segmentStart, sigmaM * sigmaM, q, steps, null, stretchWork(t.length));
  return fromPlane(plane, states);
}

/** Positions in metres east and north of the first point (a local tangent plane). */
interface Plane {
  lat0: number;
  lon0: number;
  scale: { north: number; east: number };
  x: Float64Array;
  y: Float64Array;
}

/**
 * Per point, the filtered state after the forward pass and the smoothed state after the backward pass
 * (written over it in place): east position (m) and velocity (m/s), north position and velocity. Four
 * columns of one buffer, which become the smoothed latitude, longitude and velocities (`fromPlane`).
 */
interface PlaneStates {
  sx: Float64Array;
  vx: Float64Array;
  sy: Float64Array;
  vy: Float64Array;
}

function planeStates(n: number): PlaneStates {
  const room = new Float64Array(4 * n);
  return {
    sx: room.subarray(0, n),
    vx: room.subarray(n, 2 * n),
    sy: room.subarray(2 * n, 3 * n),
    vy: room.subarray(3 * n, 4 * n),
  };
}

/**
 * The process noise of each step: `qSteps[i]` for the step into point i when given (tests), else `qTurn`
 * where `turnMarks` marks both ends of the step, else the run's q.
 */
interface StepNoise {
  qSteps: Float64Array | null;
  turnMarks: Uint8Array | null;
  qTurn: number;
}

function toPlane(lat: ArrayLike<number>, lon: ArrayLike<number>): Plane {
  const n = lat.length;
  const lat0 = n > 0 ? (lat[0] as number) : 0;
  const lon0 = n > 0 ? (lon[0] as number) : 0;
  const scale = metresPerDegree(lat0);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i += BLOCK) toPlaneBlock(lat, lon, lat0, lon0, scale.north, scale.east, x, y, i, Math.min(n, i + BLOCK));
  return { lat0, lon0, scale, x, y };
}

function toPlaneBlock(
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  lat0: number,
  lon0: number,
  north: number,
  east: number,
  x: Float64Array,
  y: Float64Array,
  from: number,
  to: number,
): void {
  for (let i = from; i < to; i++) {
    let dLon = (lon[i] as number) - lon0;
    if (dLon > 180) dLon -= 360;
    else if (dLon < -180) dLon += 360;
    x[i] = dLon * east;
    y[i] = ((lat[i] as number) - lat0) * north;
  }
}

/**
 * Latitude and longitude of the smoothed states, written over their plane positions (`states.sy`, `states.sx`:
 * each is read once, at its own index, before it is written); the velocities are the states' own columns.
 * No fresh arrays: a 30 h file's first analysis paid for every fresh page it touched (tests/bench/README.md,
 * "Session 9" and "Session 10").
 */
function fromPlane(plane: Plane, states: PlaneStates): SmoothedPositions {
  const n = plane.x.length;
  const outLat = states.sy;
  const outLon = states.sx;
  const { lat0, lon0 } = plane;
  const { north, east } = plane.scale;
  for (let i = 0; i < n; i += BLOCK)
    fromPlaneBlock(lat0, lon0, north, east, states.sx, states.sy, outLat, outLon, i, Math.min(n, i + BLOCK));
  return { lat: outLat, lon: outLon, east_mps: states.vx, north_mps: states.vy };
}

function fromPlaneBlock(
  lat0: number,
  lon0: number,
  north: number,
  east: number,
  sx: Float64Array,
  sy: Float64Array,
  outLat: Float64Array,
  outLon: Float64Array,
  from: number,
  to: number,
): void {
  for (let i = from; i < to; i++) {
    outLat[i] = lat0 + (sy[i] as number) / north;
    outLon[i] = lon0 + (sx[i] as number) / east;
  }
}

/**
 * Runs the smoother on every stretch (split at segment starts and at intervals over `SMOOTHING_GAP_S`).
 * With `qSteps` the step ending at point i has acceleration density qSteps[i]; with `redo`, only the
 * stretches holding a point where redo[i] is 1 are smoothed again, in place in `into` (the others keep
 * their values).
 */
function smoothInPlane(
  t: ArrayLike<number>,
  plane: Plane,
  segmentStart: ArrayLike<number>,
  r: number,
  q: number,
  steps: StepNoise,
  redo: { marks: Uint8Array; into: PlaneStates } | null,
  work: StretchWork,
): PlaneStates {
  const n = t.length;
  const states = redo ? redo.into : planeStates(n);
  // No marks in a first pass: zeros, so both passes run the same code.
  const marks = redo ? redo.marks : new Uint8Array(n);
  // marked[0]: 1 when a point of the stretch so far is marked (carried from block to block).
  const marked = new Uint8Array(1);
  let start = 0;
  let from = 1;
  while (from <= n) {
    const end = stretchEnd(t, segmentStart, marks, marked, n, from, Math.min(n + 1, from + BLOCK));
    if (end === -1) {
      from += BLOCK;
      continue;
    }
    if (!redo || marked[0])
      smoothStretch(t, plane.x, plane.y, states, start, end, r, q, steps.qSteps, steps.turnMarks, steps.qTurn, work);
    start = end;
    marked[0] = 0;
    from = end + 1;
  }
  return states;
}

/**
 * The first i in [from, to) where a stretch ends (i = n, a segment start or a smoothing gap before point i),
 * or −1; sets marked[0] when marks[i − 1] is set for an i up to it.
 */
function stretchEnd(
  t: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  marks: Uint8Array,
  marked: Uint8Array,
  n: number,
  from: number,
  to: number,
): number {
  // The same code in both passes (the first reads marks of zeros): reached first in the one-hour warm-up's
  // second pass, a mark deoptimised this loop.
  let seen = marked[0] as number;
  for (let i = from; i < to; i++) {
    seen |= marks[i - 1] as number;
    if (i === n || segmentStart[i] === 1 || ((t[i] as number) - (t[i - 1] as number)) / 1000 > SMOOTHING_GAP_S) {
      marked[0] = seen;
      return i;
    }
  }
  marked[0] = seen;
  return -1;
}

/**
 * Turns sharper than this over `TURN_WINDOW_S` (radians, in the first pass's smoothed heading) are
 * manoeuvres: a turnaround or a street corner. A 400 m track's bend (36.8 m radius) turns 180° over 22 s
 * or more at up to 5.2 m/s (under 50° in the window) and is not one; a 6 m turnaround at 3 m/s turns 172°
 * in it, a 12 m corner at 2.5–5 m/s 72–90°.
 */
export const TURN_ANGLE = Math.PI / 3;
/** Window over which a manoeuvre's turn is summed, s (centred on the point). */
export const TURN_WINDOW_S = 6;
/** Seconds either side of a manoeuvre's points whose steps get the manoeuvre's process noise too. */
export const TURN_MARGIN_S = 3;
/** Headings are read only where the smoothed speed is at least this, m/s (standing jitter has no heading). */
export const TURN_MIN_SPEED_MPS = 1;
/**
 * Cut-off of the smoother inside a manoeuvre, rad/s. The smoother passes a circle run at angular rate ω
 * with gain 1 / (1 + (ω/ω_c)⁴) (module comment); a 6 m turnaround at 3 m/s is ω = 0.5 rad/s, a 12 m
 * corner at 4.5 m/s 0.375 rad/s, so ω_c = 1.2 rad/s keeps 97 % or more of their radius. Its process
 * noise is q = r·ω_c⁴ (never less than the run's): more jitter, more process noise needed to follow the turn.
 * Chosen on generated tracks (shared/tracks/README.md, "Turnarounds and corners"): 1.0 and 1.5 rad/s do
 * about as well; a fixed q of 0.5 or 2 m²/s³ lets more of the wander through (streets' mean total +0.10 and
 * +0.16 % instead of +0.04 %).
 */
export const TURN_CUTOFF_RAD_S = 1.2;

/**
 * Points inside a manoeuvre: where the heading of the smoothed velocity turns by at least `TURN_ANGLE`
 * within `TURN_WINDOW_S`, widened by `TURN_MARGIN_S` either side. Returns 1 per such point, or null
 * when the track has none.
 */
export function findManoeuvres(
  t: ArrayLike<number>,
  east_mps: ArrayLike<number>,
  north_mps: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  /** Room for one number per point (every value is written before it is read). */
  turned: Float64Array = new Float64Array(t.length),
): Uint8Array | null {
  const n = t.length;
  // `turned`: cumulative signed heading change up to each point (0 across breaks and where too slow to steer).
  const heading = new Float64Array([Number.NaN]);
  for (let i = 0; i < n; i += BLOCK)
    turnedBlock(t, east_mps, north_mps, segmentStart, turned, heading, i, Math.min(n, i + BLOCK));
  // The window's ends, carried from block to block; marks made at the first manoeuvre.
  const ends = new Int32Array(2);
  const marks = new Uint8Array(n);
  let found = false;
  for (let i = 0; i < n; i += BLOCK) if (manoeuvreMarksBlock(t, turned, ends, marks, i, Math.min(n, i + BLOCK))) found = true;
  return found ? marks : null;
}

/** Cumulative signed heading change of points [from, to); `prev[0]` carries the last heading. */
function turnedBlock(
  t: ArrayLike<number>,
  east_mps: ArrayLike<number>,
  north_mps: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  turned: Float64Array,
  prev: Float64Array,
  from: number,
  to: number,
): void {
  let prevHeading = prev[0] as number;
  for (let i = from; i < to; i++) {
    const vx = east_mps[i] as number;
    const vy = north_mps[i] as number;
    const broken = i === 0 || segmentStart[i] === 1 || ((t[i] as number) - (t[i - 1] as number)) / 1000 > SMOOTHING_GAP_S;
    const heading = vx * vx + vy * vy >= TURN_MIN_SPEED_MPS * TURN_MIN_SPEED_MPS ? Math.atan2(vy, vx) : NOT_A_NUMBER;
    // The wrapped change is formed on every point, so a run whose heading first wraps past ±π late (the
    // one-hour warm-up's never did) runs the same compiled code (a deopt there cost the first long analysis).
    const raw = heading - prevHeading;
    const down = raw - TWO_PI;
    const up = raw + TWO_PI;
    const wrapped = raw > PI ? down : raw < -PI ? up : raw;
    const change = !broken && !Number.isNaN(heading) && !Number.isNaN(prevHeading) ? wrapped : 0;
    turned[i] = (i > 0 ? (turned[i - 1] as number) : 0) + change;
    prevHeading = heading;
  }
  prev[0] = prevHeading;
}

function manoeuvreMarksBlock(
  t: ArrayLike<number>,
  turned: Float64Array,
  ends: Int32Array,
  marks: Uint8Array,
  from: number,
  to: number,
): boolean {
  const n = t.length;
  const halfMs = (TURN_WINDOW_S * 1000) / 2;
  const marginMs = TURN_MARGIN_S * 1000;
  let found = false;
  let lo = ends[0] as number;
  let hi = ends[1] as number;
  for (let i = from; i < to; i++) {
    const ti = t[i] as number;
    while ((t[lo] as number) < ti - halfMs) lo++;
    while (hi + 1 < n && (t[hi + 1] as number) <= ti + halfMs) hi++;
    if (Math.abs((turned[hi] as number) - (turned[lo] as number)) < TURN_ANGLE) continue;
    found = true;
    for (let j = i; j >= 0 && (t[j] as number) >= ti - halfMs - marginMs; j--) marks[j] = 1;
    for (let j = i + 1; j < n && (t[j] as number) <= ti + halfMs + marginMs; j++) marks[j] = 1;
  }
  ends[0] = lo;
  ends[1] = hi;
  return found;
}

/**
 * Points near a stop's edges: where the first pass's smoothed speed crosses `TURN_MIN_SPEED_MPS`,
 * widened by half `TURN_WINDOW_S` and `TURN_MARGIN_S` either side. A runner stops and starts within a
 * second or two, far above the cut-off of one process noise: the smoothed path would creep on into the
 * stop for seconds (counted as moving time). Returns 1 per such point, or null when there is none.
 */
export function findStopEdges(
  t: ArrayLike<number>,
  east_mps: ArrayLike<number>,
  north_mps: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
): Uint8Array | null {
  const n = t.length;
  // Made here, not at the first edge: a block that met its first edge late deoptimised on the construction.
  const marks = new Uint8Array(n);
  let found = false;
  for (let i = 1; i < n; i += BLOCK)
    if (stopEdgesBlock(t, east_mps, north_mps, segmentStart, marks, i, Math.min(n, i + BLOCK))) found = true;
  return found ? marks : null;
}

function stopEdgesBlock(
  t: ArrayLike<number>,
  east_mps: ArrayLike<number>,
  north_mps: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  marks: Uint8Array,
  from: number,
  to: number,
): boolean {
  const n = t.length;
  const reachMs = (TURN_WINDOW_S / 2 + TURN_MARGIN_S) * 1000;
  const min2 = TURN_MIN_SPEED_MPS * TURN_MIN_SPEED_MPS;
  let found = false;
  for (let i = from; i < to; i++) {
    if (segmentStart[i] === 1 || ((t[i] as number) - (t[i - 1] as number)) / 1000 > SMOOTHING_GAP_S) continue;
    const a = (east_mps[i - 1] as number) ** 2 + (north_mps[i - 1] as number) ** 2 >= min2;
    const b = (east_mps[i] as number) ** 2 + (north_mps[i] as number) ** 2 >= min2;
    if (a === b) continue;
    found = true;
    const ti = t[i] as number;
    for (let j = i; j >= 0 && (t[j] as number) >= ti - reachMs; j--) marks[j] = 1;
    for (let j = i + 1; j < n && (t[j] as number) <= ti + reachMs; j++) marks[j] = 1;
  }
  return found;
}

/**
 * `smoothPositions` that lets the velocity turn at turnarounds and tight corners. With one process
 * noise for the whole run, the smoother is a low-pass filter of cut-off ω_c = (q/r)^¼ (module comment):
 * a runner going round a 6 m turnaround at 3 m/s turns at 0.5 rad/s, near that cut-off, so the smoothed
 * path cuts inside and the turnaround loses metres, while raising q everywhere lets the noise through
 * everywhere. So the process noise has two levels, switched by a manoeuvre detector: a first pass with
 * q = `ACCELERATION_DENSITY` finds where the smoothed heading turns sharply (`findManoeuvres`), and the
 * stretches holding such a turn are smoothed again with a larger q on the steps inside it (cut-off
 * `TURN_CUTOFF_RAD_S`) (adjustable-level process noise for manoeuvring targets: Bar-Shalom, Li & Kirubarajan 2001,
 * ch. 11). The time-varying Qₖ keeps the smoother exact for its model (Rauch, Tung & Striebel 1965
 * allow any Qₖ; checked against the batch solution in the unit test). Tracks without such a turn get
 * exactly `smoothPositions`.
 */
export function smoothPositionsThroughTurns(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  sigmaM: number,
  q = ACCELERATION_DENSITY,
): SmoothedPositions {
  const plane = toPlane(lat, lon);
  const r = sigmaM * sigmaM;
  const n = t.length;
  const work = stretchWork(n);
  // Marks of zeros in the first pass: its steps read them as the second pass's do (the same compiled code).
  const first = smoothInPlane(t, plane, segmentStart, r, q, { qSteps: null, turnMarks: new Uint8Array(n), qTurn: q }, null, work);
  // The smoother gains are spent between the passes (each stretch's forward pass writes them before its
  // backward pass reads them): the heading sums go there.
  const turns = findManoeuvres(t, first.vx, first.vy, segmentStart, work.gain.subarray(0, n));
  const stops = findStopEdges(t, first.vx, first.vy, segmentStart);
  const marks = turns && stops ? eitherMarked(turns, stops) : (turns ?? stops);
  // Left for the caller's temporary columns: the gains and the plane positions, no longer read.
  const scratch = [work.gain, plane.x, plane.y];
  if (!marks) return { ...fromPlane(plane, first), manoeuvre: null, turn: null, scratch };
  const qTurn = Math.max(q, r * TURN_CUTOFF_RAD_S ** 4);
  const manoeuvre = new Uint8Array(n);
  // The step into point i is inside the manoeuvre when both its ends are.
  manoeuvreSteps(marks, q, qTurn, manoeuvre);
  const second = smoothInPlane(
    t,
    plane,
    segmentStart,
    r,
    q,
    { qSteps: null, turnMarks: marks, qTurn },
    { marks, into: first },
    work,
  );
  return { ...fromPlane(plane, second), manoeuvre, turn: turns, scratch };
}

function eitherMarked(a: Uint8Array, b: Uint8Array): Uint8Array {
  const marks = new Uint8Array(a.length);
  for (let i = 0; i < a.length; i += BLOCK) eitherMarkedBlock(a, b, marks, i, Math.min(a.length, i + BLOCK));
  return marks;
}

function eitherMarkedBlock(a: Uint8Array, b: Uint8Array, marks: Uint8Array, from: number, to: number): void {
  for (let i = from; i < to; i++) marks[i] = (a[i] as number) | (b[i] as number);
}

/** 1 in `manoeuvre` where the step into point i has the manoeuvre's process noise (`qTurn` where both its ends are marked, and not `q`). */
function manoeuvreSteps(marks: Uint8Array, q: number, qTurn: number, manoeuvre: Uint8Array): void {
  const n = manoeuvre.length;
  for (let i = 1; i < n; i += BLOCK) manoeuvreStepsBlock(marks, q, qTurn, manoeuvre, i, Math.min(n, i + BLOCK));
}

function manoeuvreStepsBlock(marks: Uint8Array, q: number, qTurn: number, manoeuvre: Uint8Array, from: number, to: number): void {
  for (let i = from; i < to; i++) {
    const stepQ = marks[i] && marks[i - 1] ? qTurn : q;
    manoeuvre[i] = stepQ === q ? 0 : 1;
  }
}

/** Bends whose smoother gain is below this are not corrected by `bendGainFactors` (not a steady turn). */
export const MIN_BEND_GAIN = 0.8;

/**
 * Factor by which each smoothed step (interval i) falls short of the runner's path on a steady bend.
 * The smoother with one process noise is linear and time-invariant away from a stretch's ends, with
 * frequency response H(ω) = 1 / (1 + (ω/ω_c)⁴), ω_c = (q/r)^¼ (module comment; the unit test checks it
 * against the smoother's own weights). A circle run at angular rate ω is a complex exponential in the
 * plane, so the smoother returns the same circle with its radius times H(ω): every step on a bend is
 * H(ω) of the true one (a 400 m track's bend at 5 m/s with 0.75 m of jitter: −0.4 %). The step gets
 * 1 / H(ω), with ω the turn of the smoothed velocity over the step. Steps inside a manoeuvre (their own
 * process noise, a short turn, not a steady circle), slow steps (no heading), gaps, breaks and turns
 * whose gain is under `MIN_BEND_GAIN` get 1.
 */
export function bendGainFactors(
  t: ArrayLike<number>,
  smooth: SmoothedPositions,
  segmentStart: ArrayLike<number>,
  moving: ArrayLike<number>,
  sigmaM: number,
  q = ACCELERATION_DENSITY,
  /** Room for the result, one number per point (every value is set here). */
  factors: Float64Array = new Float64Array(t.length),
): Float64Array {
  const n = t.length;
  factors.fill(1);
  const cutoff = (q / (sigmaM * sigmaM)) ** 0.25;
  const manoeuvre = smooth.manoeuvre ?? null;
  for (let i = 1; i < n; i += BLOCK)
    bendGainBlock(
      t,
      smooth.east_mps,
      smooth.north_mps,
      manoeuvre,
      segmentStart,
      moving,
      cutoff,
      factors,
      i,
      Math.min(n, i + BLOCK),
    );
  return factors;
}

function bendGainBlock(
  t: ArrayLike<number>,
  eastMps: Float64Array,
  northMps: Float64Array,
  manoeuvre: Uint8Array | null,
  segmentStart: ArrayLike<number>,
  moving: ArrayLike<number>,
  cutoff: number,
  factors: Float64Array,
  from: number,
  to: number,
): void {
  const minSpeed2 = TURN_MIN_SPEED_MPS * TURN_MIN_SPEED_MPS;
  for (let i = from; i < to; i++) {
    const dt = ((t[i] as number) - (t[i - 1] as number)) / 1000;
    if (!moving[i] || segmentStart[i] || dt > MAX_SMOOTHED_INTERVAL_S || manoeuvre?.[i]) continue;
    const ax = eastMps[i - 1] as number;
    const ay = northMps[i - 1] as number;
    const bx = eastMps[i] as number;
    const by = northMps[i] as number;
    if (ax * ax + ay * ay < minSpeed2 || bx * bx + by * by < minSpeed2) continue;
    const omega = Math.abs(Math.atan2(ax * by - ay * bx, ax * bx + ay * by)) / dt;
    const loss = (omega / cutoff) ** 4;
    if (1 / (1 + loss) >= MIN_BEND_GAIN) factors[i] = 1 + loss;
  }
}

export interface SmoothedPositions {
  lat: Float64Array;
  lon: Float64Array;
  /** Smoothed velocity east and north, m/s (the second half of each smoothed state). */
  east_mps: Float64Array;
  north_mps: Float64Array;
  /** From `smoothPositionsThroughTurns`: 1 where the step into point i had the manoeuvre's process noise. */
  manoeuvre?: Uint8Array | null;
  /** From `smoothPositionsThroughTurns`: 1 per point inside a turn (`findManoeuvres`), null without any. */
  turn?: Uint8Array | null;
  /**
   * From `smoothPositionsThroughTurns`: room the smoother no longer reads (its gains, 4 numbers per point, and
   * its plane positions, 1 each), for the caller's own temporary columns, so they need no fresh memory. Holds
   * leftovers of this track's smoothing: whoever carves a column out of it sets every value it reads.
   */
  scratch?: Float64Array[] | null;
}

/**
 * Room for the forward pass of `smoothStretch` over up to `capacity` points, made once per smoothing and
 * reused by every stretch and by both passes of `smoothPositionsThroughTurns` (a 30 h file at 1 s is
 * 108 000 points: fresh arrays per pass were a good part of the garbage collector's work).
 */
interface StretchWork {
  /** The RTS smoother gain Cₖ per point: c00, c01, c10, c11 (shared by both axes). */
  gain: Float64Array;
  /** What one block of steps hands the next (`forwardBlock`, `backwardBlock`). */
  state: Float64Array;
}

function stretchWork(capacity: number): StretchWork {
  return { gain: new Float64Array(4 * capacity), state: new Float64Array(8) };
}

/**
 * Filter and smooth points [from, to) of both axes; the covariances are shared by the axes. The smoother
 * gain Cₖ = Pₖ Fᵀ (P⁻ₖ₊₁)⁻¹ is formed in the forward pass as soon as P⁻ₖ₊₁ is known (the same operations
 * in the same order as forming it in the backward pass, so the same bits), and the predicted state
 * x⁻ₖ₊₁ = F x̂ₖ is formed again in the backward pass from the filtered one. The filtered states are written
 * into `states` and the smoothed ones over them (the backward step at k reads the filtered state at k
 * before it writes the smoothed one there): 8 numbers per point in all, 4 of which are the result.
 */
function smoothStretch(
  t: ArrayLike<number>,
  x: Float64Array,
  y: Float64Array,
  states: PlaneStates,
  from: number,
  to: number,
  r: number,
  qAll: number,
  qSteps: Float64Array | null,
  turnMarks: Uint8Array | null,
  qTurn: number,
  work: StretchWork,
): void {
  const { sx, vx, sy, vy } = states;
  const len = to - from;
  if (len < 3) {
    for (let i = from; i < to; i++) {
      sx[i] = x[i] as number;
      sy[i] = y[i] as number;
    }
    // Two points: the straight line between them at constant speed; one point: standing.
    if (len === 2) {
      const dt = ((t[from + 1] as number) - (t[from] as number)) / 1000;
      const ex = ((x[from + 1] as number) - (x[from] as number)) / dt;
      const ny = ((y[from + 1] as number) - (y[from] as number)) / dt;
      vx[from] = vx[from + 1] = ex;
      vy[from] = vy[from + 1] = ny;
    }
    return;
  }
  const c = work.gain;
  const state = work.state;
  // First point: position as measured, velocity unknown (10 m/s standard deviation).
  state[FX] = x[from] as number;
  state[FV] = 0;
  state[FY] = y[from] as number;
  state[FW] = 0;
  state[P00] = r;
  state[P01] = 0;
  state[P11] = 100;
  state[TIME] = t[from] as number;
  sx[from] = state[FX];
  vx[from] = 0;
  sy[from] = state[FY];
  vy[from] = 0;
  // In blocks, so that the warm-up of a short run already compiles these loops for the next call.
  for (let k = 1; k < len; k += SMOOTHER_BLOCK)
    forwardBlock(
      t,
      x,
      y,
      from,
      k,
      Math.min(len, k + SMOOTHER_BLOCK),
      r,
      qAll,
      qSteps,
      turnMarks,
      qTurn,
      sx,
      vx,
      sy,
      vy,
      c,
      state,
    );
  // RTS backward pass: x̂ₖ = xₖ + Cₖ (x̂ₖ₊₁ − x⁻ₖ₊₁). The last point's smoothed state is its filtered one.
  state[TIME] = t[to - 1] as number;
  for (let k = len - 2; k >= 0; k -= SMOOTHER_BLOCK)
    backwardBlock(t, from, k, Math.max(-1, k - SMOOTHER_BLOCK), c, sx, vx, sy, vy, state);
}

/** Steps per call of `forwardBlock` and `backwardBlock`. */
const SMOOTHER_BLOCK = 512;
// Slots of `StretchWork.state`: the state (east position and velocity, north position and velocity), its
// covariance and the time of the last point done.
const FX = 0;
const FV = 1;
const FY = 2;
const FW = 3;
const P00 = 4;
const P01 = 5;
const P11 = 6;
const TIME = 7;

/**
 * Kalman filter steps k ∈ [kFrom, kTo) of the stretch starting at `from`, carrying `state`, writing the
 * filtered states into sx, vx, sy, vy (see `smoothStretch`).
 */
function forwardBlock(
  t: ArrayLike<number>,
  x: Float64Array,
  y: Float64Array,
  from: number,
  kFrom: number,
  kTo: number,
  r: number,
  qAll: number,
  qSteps: Float64Array | null,
  turnMarks: Uint8Array | null,
  qTurn: number,
  sx: Float64Array,
  vx: Float64Array,
  sy: Float64Array,
  vy: Float64Array,
  c: Float64Array,
  state: Float64Array,
): void {
  let xPos = state[FX] as number;
  let xVel = state[FV] as number;
  let yPos = state[FY] as number;
  let yVel = state[FW] as number;
  let a00 = state[P00] as number;
  let a01 = state[P01] as number;
  let a11 = state[P11] as number;
  let tPrev = state[TIME] as number;
  for (let k = kFrom; k < kTo; k++) {
    const i = from + k;
    const tk = t[i] as number;
    const dt = (tk - tPrev) / 1000;
    tPrev = tk;
    // The step into point i has the manoeuvre's noise when both its ends are marked.
    let q = qAll;
    if (qSteps) q = qSteps[i] as number;
    else if (turnMarks && (turnMarks[i] as number) & (turnMarks[i - 1] as number)) q = qTurn;
    // Predict: P⁻ = F P Fᵀ + Q.
    const b00 = a00 + 2 * dt * a01 + dt * dt * a11 + (q * dt * dt * dt) / 3;
    const b01 = a01 + dt * a11 + (q * dt * dt) / 2;
    const b11 = a11 + q * dt;
    // Smoother gain of point k − 1: P Fᵀ (P⁻)⁻¹.
    const m00 = a00 + dt * a01;
    const m01 = a01;
    const m10 = a01 + dt * a11;
    const m11 = a11;
    const det = b00 * b11 - b01 * b01;
    const i00 = b11 / det;
    const i01 = -b01 / det;
    const i11 = b00 / det;
    const g = 4 * (k - 1);
    c[g] = m00 * i00 + m01 * i01;
    c[g + 1] = m00 * i01 + m01 * i11;
    c[g + 2] = m10 * i00 + m11 * i01;
    c[g + 3] = m10 * i01 + m11 * i11;
    const xPred = xPos + dt * xVel;
    const yPred = yPos + dt * yVel;
    // Update with the measured position: gain K = P⁻Hᵀ / (HP⁻Hᵀ + r).
    const s = b00 + r;
    const k0 = b00 / s;
    const k1 = b01 / s;
    const ix = (x[i] as number) - xPred;
    const iy = (y[i] as number) - yPred;
    xPos = xPred + k0 * ix;
    xVel = xVel + k1 * ix;
    yPos = yPred + k0 * iy;
    yVel = yVel + k1 * iy;
    sx[i] = xPos;
    vx[i] = xVel;
    sy[i] = yPos;
    vy[i] = yVel;
    a00 = (1 - k0) * b00;
    a01 = (1 - k0) * b01;
    a11 = b11 - k1 * b01;
  }
  state[FX] = xPos;
  state[FV] = xVel;
  state[FY] = yPos;
  state[FW] = yVel;
  state[P00] = a00;
  state[P01] = a01;
  state[P11] = a11;
  state[TIME] = tPrev;
}

/**
 * RTS smoother steps k = kFrom down to kTo + 1 of the stretch starting at `from`, carrying the smoothed state
 * in `state`: each reads the filtered state at k in sx, vx, sy, vy and writes the smoothed one over it.
 */
function backwardBlock(
  t: ArrayLike<number>,
  from: number,
  kFrom: number,
  kTo: number,
  c: Float64Array,
  sx: Float64Array,
  vx: Float64Array,
  sy: Float64Array,
  vy: Float64Array,
  state: Float64Array,
): void {
  let xPos = state[FX] as number;
  let xVel = state[FV] as number;
  let yPos = state[FY] as number;
  let yVel = state[FW] as number;
  let tNext = state[TIME] as number;
  for (let k = kFrom; k > kTo; k--) {
    const i = from + k;
    const tk = t[i] as number;
    const dt = (tNext - tk) / 1000;
    tNext = tk;
    const fxPos = sx[i] as number;
    const fxVel = vx[i] as number;
    const fyPos = sy[i] as number;
    const fyVel = vy[i] as number;
    const at = 4 * k;
    const c00 = c[at] as number;
    const c01 = c[at + 1] as number;
    const c10 = c[at + 2] as number;
    const c11 = c[at + 3] as number;
    const dxp = xPos - (fxPos + dt * fxVel);
    const dxv = xVel - fxVel;
    const dyp = yPos - (fyPos + dt * fyVel);
    const dyv = yVel - fyVel;
    xPos = fxPos + c00 * dxp + c01 * dxv;
    xVel = fxVel + c10 * dxp + c11 * dxv;
    yPos = fyPos + c00 * dyp + c01 * dyv;
    yVel = fyVel + c10 * dyp + c11 * dyv;
    sx[i] = xPos;
    vx[i] = xVel;
    sy[i] = yPos;
    vy[i] = yVel;
  }
  state[FX] = xPos;
  state[FV] = xVel;
  state[FY] = yPos;
  state[FW] = yVel;
  state[TIME] = tNext;
}

/** Turns of more than this (radians) between two steps are not treated as part of a circle. */
const MAX_ARC_ANGLE = Math.PI / 2;
/** Steps shorter than this (m) give no direction worth using (standing, jitter). */
const MIN_ARC_STEP_M = 0.5;

/**
 * Factor by which each step's chord (interval i, from point i − 1 to i) falls short of the curve the
 * runner followed through a bend. Sampled points lie on the path, so a chord cuts every bend: on a
 * circle, a chord spanning a central angle α is shorter than its arc by (α/2) / sin(α/2). The
 * angle is estimated as the mean of the turns at the chord's two ends (on a circle the turn
 * between equal chords equals their central angle); turns over 90° (a turnaround, a glitch) and
 * steps next to a stop, a gap or a segment break get no correction (factor 1). At 1 s on a 12 m
 * street corner at 4.4 m/s this gives back 0.55 % of the corner; on straights the factor is 1.
 */
export function arcFactors(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  moving: ArrayLike<number>,
  /** Room for the result and for the turns, one number per point each (every value is set here). */
  factors: Float64Array = new Float64Array(t.length),
  turn: Float64Array = new Float64Array(t.length),
): Float64Array {
  const n = t.length;
  factors.fill(1);
  if (n < 3) return factors;
  const { north, east } = metresPerDegree(lat[0] as number);
  const cosRef = Math.cos((lat[0] as number) * DEG);
  // Turn at each point i (between interval i and i + 1); NaN where unusable.
  turn.fill(Number.NaN);
  // The last step's east and north and the last interval, carried from block to block.
  const last = new Float64Array([Number.NaN, Number.NaN, Number.NaN]);
  for (let i = 1; i < n; i += BLOCK)
    arcTurnsBlock(t, lat, lon, segmentStart, moving, north, east, cosRef, turn, last, i, Math.min(n, i + BLOCK));
  for (let i = 1; i < n; i += BLOCK) arcFactorsBlock(turn, factors, i, Math.min(n, i + BLOCK));
  return factors;
}

function arcTurnsBlock(
  t: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  moving: ArrayLike<number>,
  north: number,
  east: number,
  cosRef: number,
  turn: Float64Array,
  last: Float64Array,
  from: number,
  to: number,
): void {
  let px = last[0] as number;
  let py = last[1] as number;
  let pdt = last[2] as number;
  for (let i = from; i < to; i++) {
    const dt = (t[i] as number) - (t[i - 1] as number);
    // Only steps of like duration form the chords of one bend (a recording gap is a long chord).
    if (!moving[i] || segmentStart[i] || !(dt <= 1.5 * pdt && pdt <= 1.5 * dt)) px = NOT_A_NUMBER;
    pdt = dt;
    if (!moving[i] || segmentStart[i]) continue;
    // East scale follows latitude: the track may span a few degrees.
    const eastHere = (east * Math.cos(((lat[i] as number) + (lat[i - 1] as number)) * 0.5 * DEG)) / cosRef;
    let dLon = (lon[i] as number) - (lon[i - 1] as number);
    if (dLon > 180) dLon -= 360;
    else if (dLon < -180) dLon += 360;
    const x = dLon * eastHere;
    const y = ((lat[i] as number) - (lat[i - 1] as number)) * north;
    if (Math.hypot(x, y) < MIN_ARC_STEP_M) {
      px = NOT_A_NUMBER;
      continue;
    }
    if (!Number.isNaN(px)) turn[i - 1] = Math.abs(Math.atan2(px * y - py * x, px * x + py * y));
    px = x;
    py = y;
  }
  last[0] = px;
  last[1] = py;
  last[2] = pdt;
}

function arcFactorsBlock(turn: Float64Array, factors: Float64Array, from: number, to: number): void {
  for (let i = from; i < to; i++) {
    const a = turn[i - 1] as number;
    const b = turn[i] as number;
    if (Number.isNaN(a) || Number.isNaN(b) || a > MAX_ARC_ANGLE || b > MAX_ARC_ANGLE) continue;
    const half = (a + b) / 4;
    if (half > 1e-4) factors[i] = half / Math.sin(half);
  }
}

/** Gauss–Legendre nodes and weights on [0, 1], five points: exact for polynomials up to degree 9. */
const GL_NODES = [0.04691007703066802, 0.23076534494715845, 0.5, 0.7692346550528415, 0.9530899229693319];
const GL_WEIGHTS = [0.11846344252809454, 0.23931433524968324, 0.28444444444444444, 0.23931433524968324, 0.11846344252809454];

/**
 * Length of the cubic Hermite curve from (x0, y0) with velocity (vx0, vy0) to (x1, y1) with velocity
 * (vx1, vy1) over `dt` seconds, m: ∫|p′(s)| ds over s ∈ [0, 1] by five-point Gauss–Legendre.
 */
export function hermiteLength(
  dt: number,
  x0: number,
  y0: number,
  vx0: number,
  vy0: number,
  x1: number,
  y1: number,
  vx1: number,
  vy1: number,
): number {
  let length = 0;
  for (let k = 0; k < 5; k++) {
    const s = GL_NODES[k] as number;
    // Derivatives of the Hermite basis h00, h10, h01, h11 with respect to s.
    const d00 = 6 * s * s - 6 * s;
    const d10 = (3 * s * s - 4 * s + 1) * dt;
    const d11 = (3 * s * s - 2 * s) * dt;
    const dx = d00 * (x0 - x1) + d10 * vx0 + d11 * vx1;
    const dy = d00 * (y0 - y1) + d10 * vy0 + d11 * vy1;
    length += (GL_WEIGHTS[k] as number) * Math.hypot(dx, dy);
  }
  return length;
}

/**
 * Factor by which each step's chord (interval i, from point i − 1 to i) falls short of the path
 * between the two smoothed states. Under the white-noise-acceleration prior the estimate of the
 * path between two sample times, given the smoothed position and velocity at both, is the cubic
 * Hermite curve through them (Barfoot, Tong & Särkkä 2014, "Batch continuous-time trajectory
 * estimation as exactly sparse Gaussian process regression", Robotics: Science and Systems X:
 * interpolation under the constant-velocity prior); its length over the chord's is the factor.
 * Intervals that are not moving, cross a segment break or a smoothing gap get 1 (a straight line:
 * nothing is known between their ends).
 */
export function curveFactors(
  t: ArrayLike<number>,
  smooth: SmoothedPositions,
  segmentStart: ArrayLike<number>,
  moving: ArrayLike<number>,
): Float64Array {
  const n = t.length;
  const factors = new Float64Array(n).fill(1);
  if (n < 2) return factors;
  const { north, east } = metresPerDegree(smooth.lat[0] as number);
  for (let i = 1; i < n; i++) {
    const dt = ((t[i] as number) - (t[i - 1] as number)) / 1000;
    if (!moving[i] || segmentStart[i] || dt > SMOOTHING_GAP_S) continue;
    let dLon = (smooth.lon[i] as number) - (smooth.lon[i - 1] as number);
    if (dLon > 180) dLon -= 360;
    else if (dLon < -180) dLon += 360;
    const x1 = dLon * east;
    const y1 = ((smooth.lat[i] as number) - (smooth.lat[i - 1] as number)) * north;
    const chord = Math.hypot(x1, y1);
    if (chord < 1e-6) continue;
    const curve = hermiteLength(
      dt,
      0,
      0,
      smooth.east_mps[i - 1] as number,
      smooth.north_mps[i - 1] as number,
      x1,
      y1,
      smooth.east_mps[i] as number,
      smooth.north_mps[i] as number,
    );
    factors[i] = curve / chord;
  }
  return factors;
}
