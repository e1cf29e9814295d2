import { describe, expect, it } from 'vitest';
import { geodesicDistance } from '../../../../shared/tracks/geodesy.ts';
import {
  ACCELERATION_DENSITY,
  arcFactors,
  bendGainFactors,
  curveFactors,
  findManoeuvres,
  findStopEdges,
  hermiteLength,
  localDistance,
  measureJitter,
  measureWander,
  metresPerDegree,
  MIN_CORRECTED_EXCESS,
  shouldSmooth,
  smoothedStepNoiseVariance,
  smoothPositions,
  smoothPositionsThroughTurns,
  smootherWeights,
  stepWithoutNoise,
} from '../../../../shared/tracks/position-smoother.ts';
import { createPrng } from '../../../../shared/tracks/synthetic.ts';

function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** A straight run north-east at `speed` m/s, 1 s apart, with white noise of `sigma` m per axis. */
function straight(n: number, speed: number, sigma: number, seed = 1) {
  const random = createPrng(seed);
  const scale = metresPerDegree(46);
  const t = Float64Array.from({ length: n }, (_, i) => i * 1000);
  const lat = Float64Array.from(
    { length: n },
    (_, i) => 46 + (i * speed * Math.SQRT1_2 + sigma * gaussian(random)) / scale.north,
  );
  const lon = Float64Array.from({ length: n }, (_, i) => 7 + (i * speed * Math.SQRT1_2 + sigma * gaussian(random)) / scale.east);
  return { t, lat, lon, segment: new Uint8Array(n) };
}

describe('localDistance', () => {
  // REFERENCES.md §2.4(a): 100 m at azimuth 45° from (lat0, 0°) on WGS-84, GeographicLib 2.0.
  it.each([
    [0, 0.000639486, 0.000635205],
    [45, 45.000636274, 0.000896821],
    [70, 70.000633814, 0.001851774],
  ])('agrees with the geodesic within 1 mm over 100 m at latitude %d°', (lat0, lat2, lon2) => {
    expect(Math.abs(localDistance(lat0, 0, lat2, lon2) - 100)).toBeLessThan(0.001);
    expect(Math.abs(localDistance(lat0, 0, lat2, lon2) - geodesicDistance(lat0, 0, lat2, lon2))).toBeLessThan(0.001);
  });
});

describe('measureJitter', () => {
  it.each([0.2, 0.5, 1.5])('finds white noise of %f m per axis within 10 %%', (sigma) => {
    const track = straight(4000, 3.2, sigma, 3);
    const jitter = measureJitter(track.t, track.lat, track.lon, track.segment);
    expect(jitter.median_interval_s).toBe(1);
    expect(Math.abs(jitter.sigma_m / sigma - 1)).toBeLessThan(0.1);
    expect(shouldSmooth(jitter)).toBe(true);
  });

  it('calls a clean track clean and a sparse track sparse', () => {
    const clean = straight(600, 3.2, 0);
    expect(shouldSmooth(measureJitter(clean.t, clean.lat, clean.lon, clean.segment))).toBe(false);
    const sparse = straight(600, 3.2, 1);
    const t5 = sparse.t.map((x) => x * 5);
    const jitter = measureJitter(t5, sparse.lat, sparse.lon, sparse.segment);
    expect(jitter.median_interval_s).toBe(5);
    expect(shouldSmooth(jitter)).toBe(false);
  });

  it('says nothing about tracks too short to measure', () => {
    expect(measureJitter([0], [46], [7], [0]).sigma_m).toBe(0);
    const short = straight(8, 3, 1);
    expect(measureJitter(short.t, short.lat, short.lon, short.segment).sigma_m).toBe(0);
  });
});

/**
 * Rauch, Tung & Striebel (1965) show their smoother gives the maximum-likelihood estimate of all
 * states of the linear Gaussian model. So the smoother must equal the batch least-squares solution
 * of that model, solved here directly from the normal equations: prior x₀ ~ N([z₀, 0], diag(r, 100)),
 * dynamics xₖ₊₁ − F xₖ ~ N(0, Q) with Q = q[[Δt³/3, Δt²/2], [Δt²/2, Δt]] (Bar-Shalom et al. 2001,
 * §6.2.2), measurements zₖ − xₖ ~ N(0, r).
 */
function batchSmooth(t: number[], z: number[], r: number, q: number | number[], measured?: boolean[]): number[] {
  return batchStates(t, z, r, q, measured).map(([position]) => position);
}

/** The batch solution's states [position, velocity]; `measured[k]` false leaves point k without a measurement. */
function batchStates(
  t: number[],
  z: number[],
  r: number,
  qAll: number | number[],
  measured?: boolean[],
): Array<[number, number]> {
  const n = z.length;
  const m = 2 * n;
  const A = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  const b = new Array<number>(m).fill(0);
  A[0]![0]! += 1 / r;
  b[0]! += z[0]! / r;
  A[1]![1]! += 1 / 100;
  for (let k = 1; k < n; k++) {
    if (measured?.[k] !== false) {
      A[2 * k]![2 * k]! += 1 / r;
      b[2 * k]! += z[k]! / r;
    }
    const dt = (t[k]! - t[k - 1]!) / 1000;
    // The step into point k may have its own density (time-varying Qₖ; RTS 1965 hold for any Qₖ).
    const q = typeof qAll === 'number' ? qAll : qAll[k]!;
    const q00 = (q * dt ** 3) / 3;
    const q01 = (q * dt ** 2) / 2;
    const q11 = q * dt;
    const det = q00 * q11 - q01 * q01;
    const W = [
      [q11 / det, -q01 / det],
      [-q01 / det, q00 / det],
    ];
    // residual e = x_k − F x_{k−1} = G·[x_{k−1}, x_k] with G = [[-1, -dt, 1, 0], [0, -1, 0, 1]].
    const G = [
      [-1, -dt, 1, 0],
      [0, -1, 0, 1],
    ];
    const idx = [2 * k - 2, 2 * k - 1, 2 * k, 2 * k + 1];
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        let v = 0;
        for (let a = 0; a < 2; a++) for (let c = 0; c < 2; c++) v += G[a]![i]! * W[a]![c]! * G[c]![j]!;
        A[idx[i]!]![idx[j]!]! += v;
      }
  }
  // Gaussian elimination.
  for (let c = 0; c < m; c++) {
    for (let row = c + 1; row < m; row++) {
      const f = A[row]![c]! / A[c]![c]!;
      if (f === 0) continue;
      for (let j = c; j < m; j++) A[row]![j]! -= f * A[c]![j]!;
      b[row]! -= f * b[c]!;
    }
  }
  const x = new Array<number>(m).fill(0);
  for (let row = m - 1; row >= 0; row--) {
    let s = b[row]!;
    for (let j = row + 1; j < m; j++) s -= A[row]![j]! * x[j]!;
    x[row] = s / A[row]![row]!;
  }
  return Array.from({ length: n }, (_, k): [number, number] => [x[2 * k]!, x[2 * k + 1]!]);
}

describe('smoothPositions', () => {
  it('equals the batch maximum-likelihood solution of the same model (Rauch, Tung & Striebel 1965)', () => {
    const random = createPrng(9);
    const t = [0, 1000, 2000, 3000, 5000, 6000, 7000, 8500, 9500, 10500, 11500, 12500];
    const north = t.map((ms) => 3 * (ms / 1000) + 0.8 * gaussian(random));
    const scale = metresPerDegree(46);
    const lat = north.map((y) => 46 + y / scale.north);
    const lon = t.map(() => 7);
    const sigma = 0.8;
    const q = 0.05;
    const smooth = smoothPositions(t, lat, lon, new Uint8Array(t.length), sigma, q);
    const expected = batchSmooth(t, north, sigma * sigma, q);
    smooth.lat.forEach((value, k) => expect((value - 46) * scale.north).toBeCloseTo(expected[k]!, 6));
  });

  it('with a process noise per step, still equals the batch solution of that model (time-varying Qₖ)', () => {
    const random = createPrng(10);
    const t = [0, 1000, 2000, 3000, 4000, 5000, 6000, 7000, 8000, 9000, 10000, 11000];
    const north = t.map((ms) => 3 * (ms / 1000) + 0.8 * gaussian(random));
    const scale = metresPerDegree(46);
    const lat = north.map((y) => 46 + y / scale.north);
    const lon = t.map(() => 7);
    const qSteps = Float64Array.from(t, (_, k) => (k >= 4 && k <= 7 ? 1.5 : 0.05));
    const smooth = smoothPositions(t, lat, lon, new Uint8Array(t.length), 0.8, 0.05, qSteps);
    const expected = batchSmooth(t, north, 0.64, Array.from(qSteps));
    smooth.lat.forEach((value, k) => expect((value - 46) * scale.north).toBeCloseTo(expected[k]!, 6));
  });

  it('leaves a straight run at constant speed where it is and shortens a noisy one', () => {
    const clean = straight(300, 3.5, 0);
    const same = smoothPositions(clean.t, clean.lat, clean.lon, clean.segment, 0.5);
    // Within 1 cm: only the first seconds move, while the filter learns the speed (its prior is 0 ± 10 m/s).
    expect(same.lat).toHaveLength(clean.lat.length);
    same.lat.forEach((v, i) => expect(Math.abs(v - clean.lat[i]!) * metresPerDegree(46).north).toBeLessThan(0.01));
    const noisy = straight(1200, 3.5, 0.5, 4);
    const length = (lat: ArrayLike<number>, lon: ArrayLike<number>) => {
      let s = 0;
      for (let i = 1; i < lat.length; i++) s += localDistance(lat[i - 1]!, lon[i - 1]!, lat[i]!, lon[i]!);
      return s;
    };
    const truth = 1199 * 3.5;
    const smoothed = smoothPositions(noisy.t, noisy.lat, noisy.lon, noisy.segment, 0.5);
    expect(length(noisy.lat, noisy.lon) / truth - 1).toBeGreaterThan(0.01);
    expect(Math.abs(length(smoothed.lat, smoothed.lon) / truth - 1)).toBeLessThan(0.002);
  });

  it('restarts at segment starts and long gaps rather than smoothing across them', () => {
    const track = straight(40, 3, 0.5, 5);
    const segment = new Uint8Array(40);
    segment[20] = 1;
    const smooth = smoothPositions(track.t, track.lat, track.lon, segment, 0.5);
    // Moving the second segment far away changes nothing in the first.
    const moved = Float64Array.from(track.lat, (v, i) => (i >= 20 ? v + 0.01 : v));
    const again = smoothPositions(track.t, moved, track.lon, segment, 0.5);
    for (let i = 0; i < 20; i++) expect(again.lat[i]).toBe(smooth.lat[i]);
  });
});

/**
 * An out-and-back in metres: `straightM` north at `speed`, round a turnaround of `radius` m (to the
 * right), `straightM` back; 1 s points with white noise of `sigma` m per axis. Returns the track and
 * the true distance at each point.
 */
function outAndBack(straightM: number, radius: number, speed: number, sigma: number, seed: number) {
  const random = createPrng(seed);
  const scale = metresPerDegree(46);
  const turnM = Math.PI * radius;
  const total = 2 * straightM + turnM;
  const n = Math.floor(total / speed) + 1;
  const t = new Float64Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  const along = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = i * speed;
    let x: number;
    let y: number;
    if (s <= straightM) [x, y] = [0, s];
    else if (s <= straightM + turnM) {
      const a = (s - straightM) / radius;
      [x, y] = [radius - radius * Math.cos(a), straightM + radius * Math.sin(a)];
    } else [x, y] = [2 * radius, straightM - (s - straightM - turnM)];
    t[i] = i * 1000;
    along[i] = s;
    lat[i] = 46 + (y + sigma * gaussian(random)) / scale.north;
    lon[i] = 7 + (x + sigma * gaussian(random)) / scale.east;
  }
  return { t, lat, lon, segment: new Uint8Array(n), along, turn_from_m: straightM, turn_to_m: straightM + turnM };
}

/** Length of a path through points [from, to], m. */
function pathLength(lat: ArrayLike<number>, lon: ArrayLike<number>, from: number, to: number): number {
  let s = 0;
  for (let i = from + 1; i <= to; i++) s += localDistance(lat[i - 1]!, lon[i - 1]!, lat[i]!, lon[i]!);
  return s;
}

describe('smoothPositionsThroughTurns (process noise raised at turnarounds and tight corners)', () => {
  it('keeps the metres of a 6 m turnaround that one process noise for the whole run cuts off', () => {
    // 60 m either side of a 6 m turnaround at 3 m/s (0.5 rad/s), 0.7 m of white jitter per axis.
    let cutOne = 0;
    let cutTurns = 0;
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const track = outAndBack(150, 6, 3, 0.7, seed);
      const from = Math.round((track.turn_from_m - 60) / 3);
      const to = Math.round((track.turn_to_m + 60) / 3);
      const truth = track.along[to]! - track.along[from]!;
      const one = smoothPositions(track.t, track.lat, track.lon, track.segment, 0.7);
      const turns = smoothPositionsThroughTurns(track.t, track.lat, track.lon, track.segment, 0.7);
      cutOne += truth - pathLength(one.lat, one.lon, from, to);
      cutTurns += truth - pathLength(turns.lat, turns.lon, from, to);
    }
    // Mean over six noise draws: the single-level smoother cuts about 4 m off the turn (measured 3.1–4.6 m
    // per draw); the manoeuvre's process noise gives most of them back (0.2–1.6 m left).
    expect(cutOne / 6).toBeGreaterThan(3);
    expect(Math.abs(cutTurns / 6)).toBeLessThan(1.5);
    expect(Math.abs(cutTurns)).toBeLessThan(cutOne / 3);
  });

  it('finds the turnaround and nothing on the straights either side', () => {
    const track = outAndBack(150, 6, 3, 0.7, 7);
    const first = smoothPositions(track.t, track.lat, track.lon, track.segment, 0.7);
    const marks = findManoeuvres(track.t, first.east_mps, first.north_mps, track.segment);
    expect(marks).not.toBeNull();
    const marked = [...marks!.keys()].filter((i) => marks![i]);
    const turnStart = track.turn_from_m / 3;
    const turnEnd = track.turn_to_m / 3;
    // Within the window and margin of the turn (at most TURN_WINDOW_S / 2 + TURN_MARGIN_S + the
    // first pass's spread of the turn, a few seconds), never out on the straights.
    expect(Math.min(...marked)).toBeGreaterThan(turnStart - 12);
    expect(Math.max(...marked)).toBeLessThan(turnEnd + 12);
    expect(marked.length).toBeLessThan(turnEnd - turnStart + 24);
  });

  it('changes nothing where the run has no sharp turn (a straight, a 400 m track bend)', () => {
    const line = straight(600, 3.5, 0.7, 8);
    const plain = smoothPositions(line.t, line.lat, line.lon, line.segment, 0.7);
    const turns = smoothPositionsThroughTurns(line.t, line.lat, line.lon, line.segment, 0.7);
    expect(turns.lat).toEqual(plain.lat);
    expect(turns.lon).toEqual(plain.lon);
    // A bend of 36.8 m radius at 5 m/s (0.136 rad/s, 47° in the 6 s window): not a manoeuvre.
    const random = createPrng(9);
    const scale = metresPerDegree(46);
    const n = 60;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1000);
    const angle = (i: number) => (i * 5) / 36.8;
    const lat = Float64Array.from(
      { length: n },
      (_, i) => 46 + (36.8 * Math.sin(angle(i)) + 0.7 * gaussian(random)) / scale.north,
    );
    const lon = Float64Array.from(
      { length: n },
      (_, i) => 7 + (36.8 * (1 - Math.cos(angle(i))) + 0.7 * gaussian(random)) / scale.east,
    );
    const segment = new Uint8Array(n);
    const bendPlain = smoothPositions(t, lat, lon, segment, 0.7);
    expect(findManoeuvres(t, bendPlain.east_mps, bendPlain.north_mps, segment)).toBeNull();
    expect(smoothPositionsThroughTurns(t, lat, lon, segment, 0.7).lat).toEqual(bendPlain.lat);
  });
});

describe('stop edges and steady bends (white jitter alone, shared/tracks/README.md)', () => {
  it('findStopEdges marks both edges of a stop, and the smoothed path stops there instead of creeping on', () => {
    // 120 s at 4.5 m/s, 60 s standing, 120 s at 4.5 m/s; no noise, so only the smoother's own response shows.
    const scale = metresPerDegree(46);
    const n = 301;
    const along = (i: number) => 4.5 * (Math.min(i, 120) + Math.max(0, i - 180));
    const t = Float64Array.from({ length: n }, (_, i) => i * 1000);
    const lat = Float64Array.from({ length: n }, (_, i) => 46 + along(i) / scale.north);
    const lon = Float64Array.from({ length: n }, () => 7);
    const segment = new Uint8Array(n);
    const plain = smoothPositions(t, lat, lon, segment, 0.8);
    const marks = findStopEdges(t, plain.east_mps, plain.north_mps, segment)!;
    const marked = [...marks.keys()].filter((i) => marks[i]);
    expect(marked.some((i) => Math.abs(i - 120) <= 2)).toBe(true);
    expect(marked.some((i) => Math.abs(i - 180) <= 2)).toBe(true);
    expect(marked.every((i) => (i > 110 && i < 132) || (i > 168 && i < 190))).toBe(true);
    // Metres the smoothed path still covers in the first 3 s of the stop: one process noise keeps going.
    const sharp = smoothPositionsThroughTurns(t, lat, lon, segment, 0.8);
    const creep = (path: { lat: Float64Array }) =>
      Math.abs(((path.lat[123] as number) - (path.lat[120] as number)) * scale.north);
    expect(creep(plain)).toBeGreaterThan(2.5); // measured 3.43 m (1.30 m with the stop edges marked)
    expect(creep(sharp)).toBeLessThan(creep(plain) / 2);
  });

  it('bendGainFactors: the smoother draws a steady circle H(ω) = 1/(1 + (ω/ω_c)⁴) too small, and the factor gives it back', () => {
    const sigma = 0.75;
    const cutoff = (ACCELERATION_DENSITY / (sigma * sigma)) ** 0.25;
    // The gain against the smoother's own weights (a linear time-invariant filter: H(ω) = Σ w(m) cos ωm).
    const w = smootherWeights(1, sigma);
    const half = (w.length - 1) / 2;
    for (const omega of [0.05, 0.136, 0.2]) {
      let gain = 0;
      for (let m = -half; m <= half; m++) gain += (w[half + m] as number) * Math.cos(omega * m);
      expect(gain).toBeCloseTo(1 / (1 + (omega / cutoff) ** 4), 4);
    }
    // A 400 m track's bend radius (36.8 m) run round and round at 5 m/s, clean: the smoothed path away
    // from the ends is short by 1 − H; with the factors, within 0.02 % of the truth.
    const scale = metresPerDegree(46);
    const n = 400;
    const angle = (i: number) => (i * 5) / 36.8;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1000);
    const lat = Float64Array.from({ length: n }, (_, i) => 46 + (36.8 * Math.sin(angle(i))) / scale.north);
    const lon = Float64Array.from({ length: n }, (_, i) => 7 + (36.8 * (1 - Math.cos(angle(i)))) / scale.east);
    const segment = new Uint8Array(n);
    const smooth = smoothPositions(t, lat, lon, segment, sigma);
    const factors = bendGainFactors(t, smooth, segment, new Uint8Array(n).fill(1), sigma);
    let smoothed = 0;
    let corrected = 0;
    for (let i = 101; i < 300; i++) {
      const step = localDistance(smooth.lat[i - 1]!, smooth.lon[i - 1]!, smooth.lat[i]!, smooth.lon[i]!);
      smoothed += step;
      corrected += step * factors[i]!;
    }
    const truth = 199 * 2 * 36.8 * Math.sin(5 / 36.8 / 2);
    expect(smoothed / truth - 1).toBeLessThan(-0.003);
    expect(Math.abs(corrected / truth - 1)).toBeLessThan(0.0002);
    // On a straight the factor is 1.
    const line = straight(200, 3.5, 0, 2);
    const lineSmooth = smoothPositions(line.t, line.lat, line.lon, line.segment, sigma);
    expect(Math.max(...bendGainFactors(line.t, lineSmooth, line.segment, new Uint8Array(200).fill(1), sigma))).toBeCloseTo(1, 9);
  });
});

describe('arcFactors', () => {
  it('gives back the arc a chord cuts on a circle and nothing on a straight', () => {
    // 1 s chords on a circle of 12 m radius at 4.4 m/s: central angle 0.3667 rad each.
    const radius = 12;
    const step = 4.4 / radius;
    const scale = metresPerDegree(46);
    const n = 12;
    const t = Array.from({ length: n }, (_, i) => i * 1000);
    const lat = t.map((_, i) => 46 + (radius * Math.sin(i * step)) / scale.north);
    const lon = t.map((_, i) => 7 + (radius * Math.cos(i * step)) / scale.east);
    const factors = arcFactors(t, lat, lon, new Uint8Array(n), new Uint8Array(n).fill(1));
    const expected = step / 2 / Math.sin(step / 2);
    for (let i = 2; i < n - 1; i++) expect(factors[i]).toBeCloseTo(expected, 5);
    expect(factors[1]).toBe(1);
    const line = straight(10, 3, 0);
    expect([...arcFactors(line.t, line.lat, line.lon, line.segment, new Uint8Array(10).fill(1))].every((f) => f === 1)).toBe(
      true,
    );
  });
});

describe('curveFactors and hermiteLength', () => {
  it('between two sample times the model estimate is the cubic Hermite curve of the smoothed states at both (Barfoot, Tong & Särkkä 2014)', () => {
    // Batch maximum-likelihood solution with one time (6.5 s) that has no measurement: its estimate is
    // the interpolation the model makes between 6 s and 7 s. It must equal the cubic Hermite curve
    // through the states at 6 s and 7 s, which is what curveFactors measures.
    const random = createPrng(21);
    const t = [0, 1000, 2000, 3000, 4000, 5000, 6000, 6500, 7000, 8000, 9000, 10000];
    const z = t.map((ms) => 2 * (ms / 1000) + 0.15 * (ms / 1000) ** 2 + 0.5 * gaussian(random));
    const measured = t.map((ms) => ms !== 6500);
    const states = batchStates(t, z, 0.25, 0.05, measured);
    const [p0, v0] = states[6]!;
    const [p1, v1] = states[8]!;
    const s = 0.5;
    const dt = 1;
    const hermite =
      (2 * s ** 3 - 3 * s ** 2 + 1) * p0 +
      (s ** 3 - 2 * s ** 2 + s) * dt * v0 +
      (-2 * s ** 3 + 3 * s ** 2) * p1 +
      (s ** 3 - s ** 2) * dt * v1;
    expect(states[7]![0]).toBeCloseTo(hermite, 9);
  });

  it('hermiteLength: a straight line at constant speed is its chord; a quarter circle is close to its arc', () => {
    expect(hermiteLength(5, 0, 0, 3, 0, 15, 0, 3, 0)).toBeCloseTo(15, 9);
    // Quarter circle of radius 10 m run in 5 s: arc 15.708 m; the cubic Hermite curve is within 0.1 %.
    const v = (Math.PI * 10) / 2 / 5;
    expect(hermiteLength(5, 10, 0, 0, v, 0, 10, -v, 0) / ((Math.PI * 10) / 2) - 1).toBeLessThan(0.001);
  });

  it('gives back the arc that 5 s chords cut on the bend of a 400 m track, and nothing on a straight', () => {
    // Clean 5 s points on a circle of 36.8 m radius at 3 m/s: each chord is 0.7 % short of its arc.
    const radius = 36.8;
    const speed = 3;
    const scale = metresPerDegree(46);
    const n = 30;
    const t = Array.from({ length: n }, (_, i) => i * 5000);
    const angle = (i: number) => (i * 5 * speed) / radius;
    const lat = t.map((_, i) => 46 + (radius * Math.sin(angle(i))) / scale.north);
    const lon = t.map((_, i) => 7 + (radius * Math.cos(angle(i))) / scale.east);
    const segment = new Uint8Array(n);
    const moving = new Uint8Array(n).fill(1);
    moving[0] = 0;
    const smooth = smoothPositions(t, lat, lon, segment, 0.05);
    const factors = curveFactors(t, smooth, segment, moving);
    let chords = 0;
    let curve = 0;
    // Away from the ends (where the curve has no neighbour on one side).
    for (let i = 5; i < n - 5; i++) {
      const chord = localDistance(smooth.lat[i - 1]!, smooth.lon[i - 1]!, smooth.lat[i]!, smooth.lon[i]!);
      chords += chord;
      curve += chord * factors[i]!;
    }
    const arc = (n - 10) * 5 * speed;
    expect(1 - chords / arc).toBeGreaterThan(0.006);
    expect(Math.abs(curve / arc - 1)).toBeLessThan(0.0005);
    const line = straight(40, 3, 0);
    const lineSmooth = smoothPositions(
      line.t.map((x) => x * 5),
      line.lat,
      line.lon,
      line.segment,
      0.05,
    );
    const lineFactors = curveFactors(
      line.t.map((x) => x * 5),
      lineSmooth,
      line.segment,
      new Uint8Array(40).fill(1),
    );
    for (let i = 1; i < 40; i++) expect(lineFactors[i]).toBeCloseTo(1, 6);
  });
});

/**
 * A run due north at `speed` m/s, 1 s apart, with the receiver's error as a first-order Gauss–Markov
 * wander (σ, τ) per axis plus white jitter (north only, so both axes are measured on one scale).
 */
function wandering(n: number, speed: number, sigma: number, tau: number, white: number, seed: number) {
  const random = createPrng(seed);
  const scale = metresPerDegree(46);
  const rho = Math.exp(-1 / tau);
  const k = sigma * Math.sqrt(1 - rho * rho);
  let east = sigma * gaussian(random);
  let north = sigma * gaussian(random);
  const t = new Float64Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  const northError = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    east = rho * east + k * gaussian(random);
    north = rho * north + k * gaussian(random);
    northError[i] = north + white * gaussian(random);
    t[i] = i * 1000;
    lat[i] = 46 + (i * speed + (northError[i] as number)) / scale.north;
    lon[i] = 7 + (east + white * gaussian(random)) / scale.east;
  }
  return { t, lat, lon, segment: new Uint8Array(n), northError };
}

describe('the wander and the length it adds', () => {
  it.each([
    [2, 30, 0],
    [3, 60, 0.3],
    [1, 120, 0.2],
  ])(
    'measureWander splits σ = %f m, τ = %f s, white %f m into its velocity noise 2σ²/τ within 15 %% and the white part within 0.05 m',
    (sigma, tau, white) => {
      const track = wandering(20_000, 3, sigma, tau, white, 11);
      const jitter = measureJitter(track.t, track.lat, track.lon, track.segment);
      const wander = measureWander(track.t, track.lat, track.lon, track.segment, jitter)!;
      const density = (2 * wander.sigma_m ** 2) / wander.tau_s;
      expect(Math.abs(density / ((2 * sigma ** 2) / tau) - 1)).toBeLessThan(0.15);
      expect(Math.abs(wander.white_m - white)).toBeLessThan(0.05);
    },
  );

  it('smoothedStepNoiseVariance predicts the error the smoother leaves in a step (against a simulation of the same noise, within 8 %)', () => {
    const sigma = 2.5;
    const tau = 30;
    const white = 0.2;
    const track = wandering(40_000, 0, sigma, tau, white, 5);
    // Noise only (the runner stands): every smoothed step is error.
    const filterSigma = 0.4;
    const smooth = smoothPositions(track.t, track.lat, track.lon, track.segment, filterSigma);
    const scale = metresPerDegree(46);
    let sum = 0;
    let count = 0;
    for (let i = 1000; i < 39_000; i++) {
      const step = ((smooth.lat[i] as number) - (smooth.lat[i - 1] as number)) * scale.north;
      sum += step * step;
      count++;
    }
    const predicted = smoothedStepNoiseVariance(1, filterSigma, { white_m: white, sigma_m: sigma, tau_s: tau });
    expect(Math.abs(predicted / (sum / count) - 1)).toBeLessThan(0.08);
  });

  it('stepWithoutNoise takes out the excess a noisy step gains on average, s²/(2ℓ) (Ranacher et al. 2016)', () => {
    const random = createPrng(3);
    const length = 2.5;
    const s = 0.3;
    let raw = 0;
    let corrected = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) {
      const measured = Math.hypot(length + s * gaussian(random), s * gaussian(random));
      raw += measured;
      corrected += stepWithoutNoise(measured, s * s);
    }
    // The raw mean is long by about s²/(2ℓ) = 0.72 %; the corrected one is within 0.05 %.
    expect(raw / n / length - 1).toBeCloseTo((s * s) / (2 * length * length), 3);
    expect(Math.abs(corrected / n / length - 1)).toBeLessThan(0.0005);
    expect(stepWithoutNoise(0.1, 0.09)).toBe(0);
  });

  it('a run with 2.5 m of slow wander: the smoothed length is long, the corrected length is not (straight, 2.5 m/s)', () => {
    const track = wandering(20_000, 2.5, 2.5, 30, 0, 21);
    const jitter = measureJitter(track.t, track.lat, track.lon, track.segment);
    const wander = measureWander(track.t, track.lat, track.lon, track.segment, jitter)!;
    const smooth = smoothPositions(track.t, track.lat, track.lon, track.segment, jitter.sigma_m);
    const noise = smoothedStepNoiseVariance(1, jitter.sigma_m, wander);
    // The correction is applied to this track: its excess is over the threshold.
    expect(noise / (2 * 2.5 * 2.5)).toBeGreaterThan(MIN_CORRECTED_EXCESS);
    let smoothed = 0;
    let corrected = 0;
    for (let i = 1; i < 20_000; i++) {
      const step = localDistance(
        smooth.lat[i - 1] as number,
        smooth.lon[i - 1] as number,
        smooth.lat[i] as number,
        smooth.lon[i] as number,
      );
      smoothed += step;
      corrected += stepWithoutNoise(step, noise);
    }
    // The truth is the distance run plus the wander's own net move along it (first to last point).
    const truth = 2.5 * 19_999 + (track.northError[19_999] as number) - (track.northError[0] as number);
    expect(smoothed / truth - 1).toBeGreaterThan(0.003);
    expect(Math.abs(corrected / truth - 1)).toBeLessThan(0.001);
  });
});
