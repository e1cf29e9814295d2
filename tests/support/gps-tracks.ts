/**
 * Test-only generator of GPS tracks whose true path and times are known exactly (issue #14).
 *
 * Routes are built from WGS-84 geodesic lines and geodesic circle arcs (GeographicLib's direct
 * problem), so the true distance at any point is known to well under a millimetre. The runner
 * follows constant-speed phases (sharp pace changes, as reps are run); phases can be stops (points
 * recorded, no progress), auto-pauses (nothing recorded, no progress) and recording gaps (nothing
 * recorded, the runner keeps going). GPS error is a first-order Gauss–Markov (AR(1)) process per
 * axis (correlated noise, as consumer receivers show) plus optional white jitter, from a seeded
 * PRNG, so every track is reproducible.
 */
import { geodesicDirect, geodesicInverse } from '../../shared/tracks/geodesy.ts';
import { METRES_PER_KM, METRES_PER_MILE } from '../../shared/units.ts';
import { metresPerDegree } from '../../shared/tracks/position-smoother.ts';
import { createPrng } from '../../shared/tracks/synthetic.ts';
import type { SplitUnit, TrackPoint } from '../../shared/tracks/types.ts';

export type RouteKind = 'lake' | 'track' | 'out-and-back' | 'streets';

export type GpsPhase =
  | { kind: 'run'; duration_s: number; speed_mps: number }
  | { kind: 'stop'; duration_s: number }
  | { kind: 'pause'; duration_s: number }
  | { kind: 'gap'; duration_s: number; speed_mps: number };

export interface GpsNoise {
  /** Standard deviation of the correlated error per axis, m. */
  sigma_m: number;
  /** Its correlation time, s. */
  tau_s: number;
  /** Standard deviation of additional white jitter per axis, m. */
  white_m?: number;
}

export interface GpsTrackOptions {
  start_t: number;
  route: RouteKind;
  phases: readonly GpsPhase[];
  sample_s: number;
  noise: GpsNoise;
  seed: number;
  /** Latitude of the start (default 46.2, open water far from any real place). */
  lat?: number;
}

type Leg =
  | { kind: 'line'; lat: number; lon: number; azi: number; start_m: number; length_m: number }
  | {
      kind: 'arc';
      lat: number;
      lon: number;
      from_azi: number;
      sign: number;
      radius_m: number;
      start_m: number;
      length_m: number;
    };

interface Cursor {
  lat: number;
  lon: number;
  azi: number;
  s: number;
}

function line(c: Cursor, length: number, legs: Leg[]): void {
  legs.push({ kind: 'line', lat: c.lat, lon: c.lon, azi: c.azi, start_m: c.s, length_m: length });
  const end = geodesicDirect(c.lat, c.lon, c.azi, length);
  c.lat = end.lat;
  c.lon = end.lon;
  c.azi = end.azi;
  c.s += length;
}

/** A circular arc of `radius` turning `degrees` (positive = left, counter-clockwise). */
function arc(c: Cursor, radius: number, degrees: number, legs: Leg[]): void {
  const sign = degrees > 0 ? -1 : 1; // azimuths grow clockwise
  const toCentre = c.azi + sign * 90;
  const centre = geodesicDirect(c.lat, c.lon, toCentre, radius);
  const fromAzi = centre.azi + 180; // azimuth from the centre back to the cursor
  const length = (Math.abs(degrees) * Math.PI * radius) / 180;
  legs.push({
    kind: 'arc',
    lat: centre.lat,
    lon: centre.lon,
    from_azi: fromAzi,
    sign,
    radius_m: radius,
    start_m: c.s,
    length_m: length,
  });
  const endAzi = fromAzi + sign * Math.abs(degrees);
  const end = geodesicDirect(centre.lat, centre.lon, endAzi, radius);
  c.lat = end.lat;
  c.lon = end.lon;
  // `end.azi` points away from the centre; the heading is a quarter turn from it.
  c.azi = end.azi + sign * 90;
  c.s += length;
}

/** One lap of each route, appended to `legs`. */
function lap(kind: RouteKind, c: Cursor, legs: Leg[]): void {
  switch (kind) {
    case 'track':
      // A 400 m track: two 84.39 m straights and two bends of 36.80 m radius (lane 1 is 36.5 m + 0.3 m).
      line(c, 84.39, legs);
      arc(c, 36.8, 180, legs);
      line(c, 84.39, legs);
      arc(c, 36.8, 180, legs);
      break;
    case 'out-and-back':
      // Turn round at each end on a 6 m radius (a path's turning circle; see the README for tighter turns).
      line(c, 1500, legs);
      arc(c, 6, 180, legs);
      line(c, 1500, legs);
      arc(c, 6, -180, legs);
      break;
    case 'streets':
      // City blocks: 200 m streets and right-angle corners of 12 m radius.
      for (let k = 0; k < 4; k++) {
        line(c, 200, legs);
        arc(c, 12, -90, legs);
      }
      break;
    case 'lake':
      for (let k = 0; k < 8; k++) {
        line(c, 250, legs);
        arc(c, 60, 45, legs);
      }
      break;
  }
}

export function buildRoute(kind: RouteKind, totalM: number, lat: number): Leg[] {
  const legs: Leg[] = [];
  const c: Cursor = { lat, lon: -31.4, azi: 20, s: 0 };
  while (c.s < totalM + 10) lap(kind, c, legs);
  return legs;
}

function positionOnLeg(leg: Leg, s: number): { lat: number; lon: number } {
  const along = s - leg.start_m;
  if (leg.kind === 'line') return geodesicDirect(leg.lat, leg.lon, leg.azi, along);
  const degrees = (along / leg.radius_m) * (180 / Math.PI);
  return geodesicDirect(leg.lat, leg.lon, leg.from_azi + leg.sign * degrees, leg.radius_m);
}

function gaussian(random: () => number): number {
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

const speedOf = (p: GpsPhase): number => (p.kind === 'run' || p.kind === 'gap' ? p.speed_mps : 0);

export function gpsTrueDistance(phases: readonly GpsPhase[]): number {
  return phases.reduce((sum, p) => sum + speedOf(p) * p.duration_s, 0);
}

/** Exact time (ms) at which the runner has covered `distanceM`; NaN beyond the end. */
export function gpsTrueTimeAt(options: GpsTrackOptions, distanceM: number): number {
  let t = options.start_t;
  let s = 0;
  for (const phase of options.phases) {
    const v = speedOf(phase);
    if (v > 0 && s + v * phase.duration_s >= distanceM) return t + ((distanceM - s) / v) * 1000;
    s += v * phase.duration_s;
    t += phase.duration_s * 1000;
  }
  return distanceM <= s ? t : Number.NaN;
}

/** True moving seconds between two times (ms): all but stops and auto-pauses. */
export function gpsTrueMovingSeconds(options: GpsTrackOptions, fromT: number, toT: number): number {
  let t = options.start_t;
  let moving = 0;
  for (const phase of options.phases) {
    const end = t + phase.duration_s * 1000;
    if (speedOf(phase) > 0) moving += Math.max(0, Math.min(end, toT) - Math.max(t, fromT));
    t = end;
  }
  return moving / 1000;
}

/** True elapsed seconds of every full split (mile or km). */
export function gpsTrueFullSplits(options: GpsTrackOptions, unit: SplitUnit): { elapsed_s: number; moving_s: number }[] {
  const unitM = unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM;
  const total = gpsTrueDistance(options.phases);
  const out: { elapsed_s: number; moving_s: number }[] = [];
  let prev = options.start_t;
  for (let k = 1; k * unitM <= total; k++) {
    const at = gpsTrueTimeAt(options, k * unitM);
    out.push({ elapsed_s: (at - prev) / 1000, moving_s: gpsTrueMovingSeconds(options, prev, at) });
    prev = at;
  }
  return out;
}

/**
 * The recorded points: one every `sample_s` seconds except during gaps and auto-pauses, rounded
 * to 1e-7° as GPX files are. An auto-pause starts a new segment (as devices write one).
 */
export function generateGpsTrack(options: GpsTrackOptions): GpsTrack {
  const random = createPrng(options.seed);
  const total = gpsTrueDistance(options.phases);
  const legs = buildRoute(options.route, total, options.lat ?? 46.2);
  const { sigma_m: sigma, tau_s: tau } = options.noise;
  const white = options.noise.white_m ?? 0;
  let east = sigma * gaussian(random);
  let north = sigma * gaussian(random);
  const step = (dt: number): void => {
    const rho = Math.exp(-dt / tau);
    const k = sigma * Math.sqrt(1 - rho * rho);
    east = rho * east + k * gaussian(random);
    north = rho * north + k * gaussian(random);
  };
  const segments: TrackPoint[][] = [[]];
  const errors: GpsPointError[] = [];
  const recordablePhases: GpsPhase[] = [];
  let lastTrue: { lat: number; lon: number } | null = null;
  let lastT = 0;
  let leg = 0;
  let s = 0;
  let elapsed = 0;
  // The device's clock: one point every `sample_s` seconds, on one grid across pace changes and
  // stops (a receiver does not know the runner changed pace); after a gap or auto-pause the first
  // point is at its end, and the grid goes on from there. Each point is placed where the runner truly
  // is at its time, so the truth is exact at every sampling interval.
  let next = 0;
  const record = (phase: GpsPhase, at: number, dist: number): void => {
    step(at - lastT);
    while (leg + 1 < legs.length && legs[leg + 1]!.start_m <= dist) leg++;
    const truth = positionOnLeg(legs[leg]!, dist);
    if (phase.kind === 'gap' && lastTrue) {
      // The file knows only the chord from the last point before the gap (at most one interval before
      // its start) to the first after it: that stretch of time, taken from the phase before, and the
      // gap become one straight line at constant speed.
      const before = elapsed - lastT;
      const previous = recordablePhases.at(-1);
      if (before > 0 && previous)
        recordablePhases[recordablePhases.length - 1] = { ...previous, duration_s: previous.duration_s - before };
      const chord = geodesicInverse(lastTrue.lat, lastTrue.lon, truth.lat, truth.lon).s12;
      recordablePhases.push({ ...phase, duration_s: phase.duration_s + before, speed_mps: chord / (phase.duration_s + before) });
    }
    lastTrue = truth;
    lastT = at;
    const scale = metresPerDegree(truth.lat);
    const e = east + white * gaussian(random);
    const n = north + white * gaussian(random);
    errors.push({ at_s: at, distance_m: dist, lat: truth.lat, lon: truth.lon, wander_east_m: east, wander_north_m: north });
    segments.at(-1)!.push({
      t: options.start_t + at * 1000,
      lat: Math.round((truth.lat + n / scale.north) * 1e7) / 1e7,
      lon: Math.round((truth.lon + e / scale.east) * 1e7) / 1e7,
      hr: Math.round(110 + 12 * speedOf(phase)),
    });
  };
  for (const phase of options.phases) {
    const v = speedOf(phase);
    const end = elapsed + phase.duration_s;
    // A device that pauses writes where it paused: the segment ends with a point at the pause's start.
    if (phase.kind === 'pause' && lastT < elapsed) {
      const before = recordablePhases.at(-1);
      record({ kind: 'run', duration_s: 0, speed_mps: before ? speedOf(before) : 0 }, elapsed, s);
    }
    if (phase.kind === 'pause' && segments.at(-1)!.length > 0) segments.push([]);
    if (phase.kind === 'gap' || phase.kind === 'pause') {
      // Nothing recorded inside; the first point after it is at its end (a gap's end is on the far side).
      record(phase, end, s + v * phase.duration_s);
      next = end + options.sample_s;
    } else {
      // Small tolerance: grid times are sums of `sample_s`.
      for (; next <= end + 1e-9; next += options.sample_s) record(phase, next, s + v * (next - elapsed));
    }
    if (phase.kind !== 'gap' || !lastTrue) recordablePhases.push(phase);
    s += v * phase.duration_s;
    elapsed = end;
  }
  return {
    segments: segments.filter((seg) => seg.length > 0),
    distance_m: total,
    recordable: { ...options, phases: recordablePhases },
    errors,
  };
}

/** Where one recorded point truly is and the slow part of its error (the wander, without the white jitter). */
export interface GpsPointError {
  /** Seconds from the start. */
  at_s: number;
  /** True distance covered, m. */
  distance_m: number;
  /** True position, degrees. */
  lat: number;
  lon: number;
  /** The correlated (Gauss–Markov) error east and north, m. */
  wander_east_m: number;
  wander_north_m: number;
}

export interface GpsTrack {
  segments: TrackPoint[][];
  /** True distance run, m. */
  distance_m: number;
  /**
   * The profile as a file can know it: across a recording gap nothing is recorded, so the best any
   * method can measure is the straight line between the points either side; each gap's speed here
   * is that chord over its duration. Truths for splits are computed from this profile.
   */
  recordable: GpsTrackOptions;
  /** One entry per recorded point, in file order (segments concatenated). */
  errors: GpsPointError[];
}

/** Named noise levels, none to heavy (per axis): consumer receivers wander a few metres over tens of seconds. */
export const NOISE_LEVELS = {
  none: { sigma_m: 0, tau_s: 60 },
  light: { sigma_m: 1, tau_s: 60 },
  moderate: { sigma_m: 2, tau_s: 30 },
  heavy: { sigma_m: 3, tau_s: 30 },
} as const satisfies Record<string, GpsNoise>;
