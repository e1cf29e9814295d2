/**
 * Issue #14: exact splits on real-world GPS. Generated tracks with exactly known truth (geodesic
 * routes: a lake loop, a 400 m track, an out-and-back, city blocks; reps with sharp pace changes,
 * stops, auto-pauses and recording gaps) go through the real import path (GPX text → parser →
 * analysis). The smoother is checked against its published source in position-smoother.test.ts:
 * the Kalman filter + Rauch–Tung–Striebel smoother (Rauch, Tung & Striebel 1965) against the batch
 * maximum-likelihood solution of its model, and the curve between samples against the model's own
 * interpolation (Barfoot, Tong & Särkkä 2014). Results and limits: shared/tracks/README.md.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NO_NOISE, noise, trackOptions } from '../../../support/gps-track-arbitraries.ts';
import { measureTrack } from '../../../support/gps-track-check.ts';

// A fixed seed: the same generated tracks on every run, so a failure can be replayed.
const SEED = 14;
/** Margin over a track's own wander floor for 1–3 m of wander, s, and what each stop, pause or gap adds (README). */
const WANDER_MARGIN_S = 4;
const WANDER_MARGIN_PER_EVENT_S = 1.5;

describe('splits of generated 1 s GPX tracks against their exact truth (fast-check)', () => {
  it('clean tracks: every full split within 0.6 s, the total within 1 % (100 tracks)', () => {
    fc.assert(
      fc.property(trackOptions(NO_NOISE, fc.constant(1)), (options) => {
        const errors = measureTrack(options);
        expect(errors.smoothed).toBe(false);
        expect(errors.worst_elapsed_s).toBeLessThan(0.6);
        expect(errors.worst_moving_s).toBeLessThan(0.6);
        expect(Math.abs(errors.total_error)).toBeLessThan(0.01);
      }),
      { numRuns: 100, seed: SEED },
    );
  }, 120_000);

  it('noisy tracks (0.3–1 m wander per axis over 20–120 s, white jitter to 0.3 m): every full split within 4.5 s, the total within 1 % (200 tracks)', () => {
    let smoothed = 0;
    fc.assert(
      fc.property(trackOptions(noise(0.3, 1), fc.constant(1)), (options) => {
        const errors = measureTrack(options);
        if (errors.smoothed) smoothed++;
        expect(errors.worst_elapsed_s).toBeLessThan(4.5);
        expect(errors.worst_moving_s).toBeLessThan(4.5);
        expect(Math.abs(errors.total_error)).toBeLessThan(0.01);
      }),
      { numRuns: 200, seed: SEED },
    );
    // The smoother is what holds these: it ran on most of them (the faintest jitter is left alone).
    expect(smoothed).toBeGreaterThan(150);
  }, 300_000);

  it("white jitter alone (0.3–1 m per axis, no wander: every error is the method's): every full split within 4.5 s, the total within 1 % (200 tracks)", () => {
    // With no wander the floor is zero (tests/support/gps-wander-floor.ts), so this isolates the method
    // at stops (the smoother crept on into them), steady bends (the smoother's gain H(ω) < 1),
    // turnarounds (the window's chord is their diameter) and short files (a wander read from sampling
    // error): shared/tracks/README.md, "White jitter alone". Measured worst 2.91 s (seeds 15, 16: 3.75, 3.37 s).
    const white = fc.record({
      sigma_m: fc.constant(0),
      tau_s: fc.constant(60),
      white_m: fc.double({ min: 0.3, max: 1, noNaN: true }),
    });
    let withEvents = 0;
    const routes = new Set<string>();
    fc.assert(
      fc.property(trackOptions(white, fc.constant(1)), (options) => {
        const errors = measureTrack(options);
        expect(errors.smoothed).toBe(true);
        expect(errors.worst_elapsed_s).toBeLessThan(4.5);
        expect(errors.worst_moving_s).toBeLessThan(4.5);
        expect(Math.abs(errors.total_error)).toBeLessThan(0.01);
        routes.add(options.route);
        if (options.phases.some((phase) => phase.kind !== 'run')) withEvents++;
      }),
      { numRuns: 200, seed: SEED },
    );
    // Every route and many stops, pauses and gaps were in the set.
    expect(routes.size).toBe(4);
    expect(withEvents).toBeGreaterThan(100);
  }, 300_000);

  it("heavier wander (1–3 m per axis over 20–120 s): every full split within the wander floor of its own track + 4 s (+ 1.5 s per stop, pause or gap), the total within 1 % of the floor's, no bias (200 tracks)", () => {
    // 4.5 s cannot be met here by any method that has only positions: the slow wander moves like a
    // runner and no estimator removes it (shared/tracks/README.md, "The wander"). What it leaves is
    // computed for each track from its truth and its generated wander alone (tests/support/gps-wander-floor.ts:
    // the along-track wander at both ends of a split and the sideways wander times the turn, d·θ, inside
    // it). The method must stay within a margin of that floor. The margin is measured (README,
    // "Turnarounds and corners"): on 800 tracks of four seeds, tracks without events stay within 3.6 s
    // of their floor, and each stop, pause or gap adds at most 1.4 s (its edges: moving time at a stop,
    // the smoother's ends at a gap). The smoother without its turn handling is 4.2 s over on this seed.
    const totals: number[] = [];
    fc.assert(
      fc.property(trackOptions(noise(1, 3), fc.constant(1)), (options) => {
        const errors = measureTrack(options);
        expect(errors.smoothed).toBe(true);
        const events = options.phases.filter((phase) => phase.kind !== 'run').length;
        const margin = WANDER_MARGIN_S + WANDER_MARGIN_PER_EVENT_S * events;
        expect(errors.worst_elapsed_s).toBeLessThan(errors.floor_elapsed_s + margin);
        expect(errors.worst_moving_s).toBeLessThan(errors.floor_moving_s + margin);
        // The wander held at the ends of a stretch changes the length itself (up to 1.5 % here): the
        // total is judged against the truth moved by that change.
        expect(Math.abs(errors.total_error - errors.floor_total)).toBeLessThan(0.01);
        totals.push(errors.total_error);
      }),
      { numRuns: 200, seed: SEED },
    );
    // What must go is the length the wander adds, which the issue wants well under 0.5 %: the smoother
    // leaves the slow part of the wander in the path, and the step correction (`stepWithoutNoise`)
    // takes out the length it adds.
    const mean = totals.reduce((a, b) => a + b, 0) / totals.length;
    expect(Math.abs(mean)).toBeLessThan(0.001);
  }, 300_000);
});

describe('splits of generated 5 s GPX tracks (fast-check)', () => {
  it('clean and noisy (to 2 m of wander) 5 s tracks: the total within 1 % (200 tracks)', () => {
    fc.assert(
      fc.property(trackOptions(fc.oneof(NO_NOISE, noise(0.3, 2)), fc.constant(5)), (options) => {
        const errors = measureTrack(options);
        expect(Math.abs(errors.total_error)).toBeLessThan(0.01);
        // Measured along the curve through the points: never shorter than the straight chords.
        expect(errors.total_error).toBeGreaterThanOrEqual(errors.raw_error - 1e-9);
      }),
      { numRuns: 200, seed: SEED },
    );
  }, 300_000);
});
