/**
 * fast-check arbitraries for generated GPS tracks (issue #14): routes, sampling, noise and
 * session shapes (warm-up, reps with sharp pace changes, stops, auto-pauses, recording gaps).
 */
import fc from 'fast-check';
import type { GpsNoise, GpsPhase, GpsTrackOptions, RouteKind } from './gps-tracks.ts';

const START_T = Date.UTC(2026, 3, 12, 6, 0, 0);

const event: fc.Arbitrary<GpsPhase> = fc.oneof(
  fc.record({ kind: fc.constant('stop' as const), duration_s: fc.integer({ min: 20, max: 90 }) }),
  fc.record({ kind: fc.constant('pause' as const), duration_s: fc.integer({ min: 30, max: 120 }) }),
  fc.record({
    kind: fc.constant('gap' as const),
    duration_s: fc.integer({ min: 10, max: 40 }),
    speed_mps: fc.double({ min: 2.6, max: 3.6, noNaN: true }),
  }),
);

/** A session: warm-up, a block of reps with recoveries (sharp pace changes), events here and there, cool-down. */
export const sessionPhases: fc.Arbitrary<GpsPhase[]> = fc
  .record({
    warm: fc.integer({ min: 300, max: 900 }),
    easy: fc.double({ min: 2.5, max: 3.4, noNaN: true }),
    reps: fc.integer({ min: 0, max: 6 }),
    rep_s: fc.integer({ min: 60, max: 300 }),
    rep_speed: fc.double({ min: 3.8, max: 5.2, noNaN: true }),
    jog_s: fc.integer({ min: 60, max: 150 }),
    jog_speed: fc.double({ min: 2.0, max: 2.8, noNaN: true }),
    cool: fc.integer({ min: 300, max: 900 }),
    events: fc.array(fc.tuple(fc.integer({ min: 0, max: 20 }), event), { maxLength: 3 }),
  })
  .map((s) => {
    const phases: GpsPhase[] = [{ kind: 'run', duration_s: s.warm, speed_mps: s.easy }];
    for (let k = 0; k < s.reps; k++) {
      phases.push({ kind: 'run', duration_s: s.rep_s, speed_mps: s.rep_speed });
      phases.push({ kind: 'run', duration_s: s.jog_s, speed_mps: s.jog_speed });
    }
    phases.push({ kind: 'run', duration_s: s.cool, speed_mps: s.easy });
    // Events go between running phases, never first or last (a file starts and ends running).
    for (const [at, e] of s.events) phases.splice(1 + (at % (phases.length - 1)), 0, e);
    return phases;
  });

export const routeKind: fc.Arbitrary<RouteKind> = fc.constantFrom('lake', 'track', 'out-and-back', 'streets');

export function trackOptions(noise: fc.Arbitrary<GpsNoise>, sample: fc.Arbitrary<number>): fc.Arbitrary<GpsTrackOptions> {
  return fc.record({
    start_t: fc.constant(START_T),
    route: routeKind,
    phases: sessionPhases,
    sample_s: sample,
    noise,
    seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
    lat: fc.constantFrom(0.5, 46.2, 63.5),
  });
}

/** Consumer-receiver noise of up to `maxSigma` m per axis, correlation times 20–120 s, some white jitter. */
export function noise(minSigma: number, maxSigma: number): fc.Arbitrary<GpsNoise> {
  return fc.record({
    sigma_m: fc.double({ min: minSigma, max: maxSigma, noNaN: true }),
    tau_s: fc.constantFrom(20, 30, 60, 120),
    white_m: fc.double({ min: 0, max: 0.3, noNaN: true }),
  });
}

export const NO_NOISE: fc.Arbitrary<GpsNoise> = fc.constant({ sigma_m: 0, tau_s: 60 });
