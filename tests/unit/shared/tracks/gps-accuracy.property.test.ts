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

  it('heavier wander (1–3 m per axis over 20–120 s): the distance is not biased, mean total error within ±0.1 % (100 tracks)', () => {
    // Splits are not held to 4.5 s here (shared/tracks/README.md, "The wander": the worst is 14 s).
    // What must go is the length the wander adds, which the issue wants well under 0.5 %: the smoother
    // leaves the slow part of the wander in the path (it cannot be told from the runner's own moves),
    // and the step correction (`stepWithoutNoise`) takes out the length it adds.
    const totals: number[] = [];
    fc.assert(
      fc.property(trackOptions(noise(1, 3), fc.constant(1)), (options) => {
        const errors = measureTrack(options);
        expect(errors.smoothed).toBe(true);
        totals.push(errors.total_error);
      }),
      { numRuns: 100, seed: SEED },
    );
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
