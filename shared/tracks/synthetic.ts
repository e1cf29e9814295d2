/**
 * Synthetic runs with exactly known splits, for tests, demo data and benchmarks.
 *
 * The route is a loop around an invented lake ("Lake Tamsel"), built from geodesic legs
 * (WGS-84 direct problem) that turn a few degrees each, so chords between 1 s samples lose
 * almost nothing at the bends. The runner follows a speed profile of constant-speed phases, so
 * the time at any distance, and therefore every split, is known exactly. Phases can be stops
 * (points recorded, no progress) and recording gaps (the runner keeps going, nothing recorded).
 * GPS noise drifts like real GPS: a first-order Gauss–Markov (AR(1)) process per axis from a
 * seeded PRNG, so the result is deterministic for a given seed.
 */
import { METRES_PER_KM, METRES_PER_MILE } from '../units.ts';
import { geodesicDirect } from './geodesy.ts';
import type { SplitUnit, TrackPoint } from './types.ts';

/** The invented lake's starting jetty (open water far from any real lake). */
export const LAKE_START = { lat: 46.2, lon: -31.4 } as const;

export type Phase =
  | { kind: 'run'; duration_s: number; speed_mps: number }
  | { kind: 'stop'; duration_s: number }
  | { kind: 'gap'; duration_s: number; speed_mps: number };

export interface SyntheticOptions {
  /** Start, ms since the epoch (pass it in: pure code reads no clock). */
  start_t: number;
  phases: readonly Phase[];
  /** Seconds between recorded points (default 1). */
  sample_s?: number;
  /** PRNG seed (default 1). */
  seed?: number;
  /** Standard deviation of horizontal GPS error per axis, m (default 0: exact positions). */
  gps_sigma_m?: number;
  /** Correlation time of the GPS error, s (default 300). */
  gps_tau_s?: number;
  /** Standard deviation of elevation noise, m (default 0). */
  ele_sigma_m?: number;
  /** Write the true cumulative distance as the device distance (default false). */
  device_distance?: boolean;
  /** Length of one lap of the lake, m (default 2500). */
  lap_m?: number;
}

export interface SyntheticRun {
  /** Recorded points in one segment (a recording gap leaves a hole in time, not a new segment). */
  points: TrackPoint[];
  /** True route distance covered, m. */
  distance_m: number;
  /** True elevation gain over the run, m. */
  ascent_m: number;
}

/** Exact time (ms) at which the runner has covered `distanceM`; NaN beyond the end. */
export function trueTimeAtDistance(options: SyntheticOptions, distanceM: number): number {
  let t = options.start_t;
  let s = 0;
  for (const phase of options.phases) {
    const speed = phase.kind === 'stop' ? 0 : phase.speed_mps;
    const covered = speed * phase.duration_s;
    if (speed > 0 && s + covered >= distanceM) return t + ((distanceM - s) / speed) * 1000;
    s += covered;
    t += phase.duration_s * 1000;
  }
  return distanceM <= s ? t : Number.NaN;
}

/** True total distance of a profile, m. */
export function trueDistance(phases: readonly Phase[]): number {
  return phases.reduce((sum, p) => sum + (p.kind === 'stop' ? 0 : p.speed_mps * p.duration_s), 0);
}

/** True moving seconds between two times (ms): everything except stop phases. */
export function trueMovingSeconds(options: SyntheticOptions, fromT: number, toT: number): number {
  let t = options.start_t;
  let moving = 0;
  for (const phase of options.phases) {
    const end = t + phase.duration_s * 1000;
    if (phase.kind !== 'stop') moving += Math.max(0, Math.min(end, toT) - Math.max(t, fromT));
    t = end;
  }
  return moving / 1000;
}

/** Exact split boundaries (ms) of a profile: start, then one per full unit, then the end. */
export function trueSplitBoundaries(options: SyntheticOptions, unit: SplitUnit): number[] {
  const unitM = unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM;
  const total = trueDistance(options.phases);
  const times = [options.start_t];
  for (let k = 1; k * unitM <= total; k++) times.push(trueTimeAtDistance(options, k * unitM));
  const end = options.start_t + options.phases.reduce((sum, p) => sum + p.duration_s, 0) * 1000;
  if (total - Math.floor(total / unitM) * unitM >= 1) times.push(end);
  return times;
}

/** Small, fast, seedable PRNG (mulberry32); returns [0, 1). */
export function createPrng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let r = Math.imul(a ^ (a >>> 15), 1 | a);
    r = (r + Math.imul(r ^ (r >>> 7), 61 | r)) ^ r;
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
}

function gaussian(random: () => number): number {
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/**
 * First-order Gauss–Markov (AR(1)) process with standard deviation `sigma` and correlation time
 * `tau` seconds, stepped every `dt` seconds: x' = ρx + σ√(1−ρ²)·w, ρ = e^(−dt/τ).
 */
export function createGaussMarkov(random: () => number, sigma: number, tau: number): (dt: number) => number {
  let x = sigma * gaussian(random);
  return (dt: number) => {
    const rho = Math.exp(-dt / tau);
    x = rho * x + sigma * Math.sqrt(1 - rho * rho) * gaussian(random);
    return x;
  };
}

interface Leg {
  lat: number;
  lon: number;
  azi: number;
  start_m: number;
  length_m: number;
}

/**
 * The lake loop as geodesic legs: 72 legs, each turning 5° to the right, with lengths that vary
 * around the shore so the outline looks like a lake and not a circle. The loop is repeated as
 * often as the run needs (each lap starts where the last one ended).
 */
function buildLegs(totalM: number, lapM: number): Leg[] {
  const legs: Leg[] = [];
  const count = 72;
  const weights = Array.from(
    { length: count },
    (_, k) => 1 + 0.45 * Math.sin((3 * 2 * Math.PI * k) / count) + 0.2 * Math.cos((5 * 2 * Math.PI * k) / count),
  );
  const weightSum = weights.reduce((a, b) => a + b, 0);
  let lat: number = LAKE_START.lat;
  let lon: number = LAKE_START.lon;
  let azi = 0;
  let start = 0;
  while (start < totalM + 1) {
    for (let k = 0; k < count && start < totalM + 1; k++) {
      const length = (lapM * (weights[k] as number)) / weightSum;
      legs.push({ lat, lon, azi, start_m: start, length_m: length });
      const end = geodesicDirect(lat, lon, azi, length);
      lat = end.lat;
      lon = end.lon;
      azi = end.azi + 5;
      start += length;
    }
  }
  return legs;
}

/** Elevation of the shore path at route distance s, m: gentle rolling ground. */
export function shoreElevation(s: number): number {
  return 212 + 6 * Math.sin((2 * Math.PI * s) / 900) + 3 * Math.sin((2 * Math.PI * s) / 260);
}

/** True ascent along the shore path between 0 and `distanceM`, m (sampled finely). */
export function shoreAscent(distanceM: number): number {
  let gain = 0;
  let prev = shoreElevation(0);
  for (let s = 1; s <= distanceM; s += 1) {
    const e = shoreElevation(s);
    if (e > prev) gain += e - prev;
    prev = e;
  }
  return gain;
}

/**
 * Generate a run around the lake from a speed profile. Points every `sample_s` seconds from the
 * start to the end of the last phase, except inside `gap` phases. Heart rate follows speed with
 * a one-minute lag; cadence follows speed.
 */
export function generateLakeRun(options: SyntheticOptions): SyntheticRun {
  const sample = options.sample_s ?? 1;
  const random = createPrng(options.seed ?? 1);
  const sigma = options.gps_sigma_m ?? 0;
  const tau = options.gps_tau_s ?? 300;
  const noiseEast = createGaussMarkov(random, sigma, tau);
  const noiseNorth = createGaussMarkov(random, sigma, tau);
  const eleNoise = createGaussMarkov(random, options.ele_sigma_m ?? 0, 30);
  const total = trueDistance(options.phases);
  const legs = buildLegs(total, options.lap_m ?? 2500);
  const points: TrackPoint[] = [];
  let hr = 95;
  let leg = 0;
  let s = 0;
  let phaseStart = 0;
  for (const phase of options.phases) {
    const speed = phase.kind === 'stop' ? 0 : phase.speed_mps;
    const steps = Math.round(phase.duration_s / sample);
    for (let k = phaseStart === 0 && points.length === 0 ? 0 : 1; k <= steps; k++) {
      const elapsed = k * sample;
      const dist = s + speed * elapsed;
      const targetHr = speed === 0 ? 100 : 95 + 22 * speed;
      hr += (targetHr - hr) * (1 - Math.exp(-sample / 60));
      const east = noiseEast(sample);
      const north = noiseNorth(sample);
      const eleJitter = eleNoise(sample);
      if (phase.kind === 'gap' && k < steps) continue;
      while (leg + 1 < legs.length && (legs[leg + 1] as Leg).start_m <= dist) leg++;
      const current = legs[leg] as Leg;
      let pos = geodesicDirect(current.lat, current.lon, current.azi, dist - current.start_m);
      if (sigma > 0) {
        const offset = Math.hypot(east, north);
        const bearing = (Math.atan2(east, north) * 180) / Math.PI;
        pos = geodesicDirect(pos.lat, pos.lon, bearing, offset);
      }
      const point: TrackPoint = {
        t: options.start_t + (phaseStart + elapsed) * 1000,
        lat: Math.round(pos.lat * 1e7) / 1e7,
        lon: Math.round(pos.lon * 1e7) / 1e7,
        ele: Math.round((shoreElevation(dist) + eleJitter) * 10) / 10,
        hr: Math.round(hr),
        cad: speed === 0 ? 0 : Math.round(150 + 8 * speed),
      };
      if (options.device_distance) point.distance_m = Math.round(dist * 100) / 100;
      points.push(point);
    }
    s += speed * phase.duration_s;
    phaseStart += phase.duration_s;
  }
  return { points, distance_m: total, ascent_m: shoreAscent(total) };
}

/** A steady 10 km with a 3-minute bottle stop and a 40 s recording gap (tunnel under a road). */
export const TEN_K_WITH_STOP: readonly Phase[] = [
  { kind: 'run', duration_s: 600, speed_mps: 3.0 },
  { kind: 'run', duration_s: 900, speed_mps: 3.4 },
  { kind: 'stop', duration_s: 180 },
  { kind: 'run', duration_s: 400, speed_mps: 3.3 },
  { kind: 'gap', duration_s: 40, speed_mps: 3.3 },
  { kind: 'run', duration_s: 700, speed_mps: 3.6 },
  { kind: 'run', duration_s: 356, speed_mps: 3.1 },
];

/** A long run of `hours` at an even `speedMps` with a one-minute stop every hour (benchmarks, demo). */
export function longRunPhases(hours: number, speedMps = 3.2): Phase[] {
  const phases: Phase[] = [];
  for (let h = 0; h < hours; h++) {
    phases.push({ kind: 'run', duration_s: 3540, speed_mps: speedMps }, { kind: 'stop', duration_s: 60 });
  }
  return phases;
}
