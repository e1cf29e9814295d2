import { describe, expect, it } from 'vitest';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';
import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import {
  createPrng,
  generateLakeRun,
  TEN_K_WITH_STOP,
  trueDistance,
  trueMovingSeconds,
  trueSplitBoundaries,
  type SyntheticOptions,
} from '../../../../shared/tracks/synthetic.ts';
import type { SplitUnit } from '../../../../shared/tracks/types.ts';

const START = Date.UTC(2024, 8, 14, 6, 30, 0);

function check(options: SyntheticOptions, unit: SplitUnit, maxSplitError: number, maxMovingError: number): void {
  const run = generateLakeRun(options);
  const analysis = analyseTrack(cleanTrack([run.points]));
  const truth = trueSplitBoundaries(options, unit);
  const splits = analysis.splits[unit];
  expect(splits).toHaveLength(truth.length - 1);
  expect(Math.abs(analysis.summary.distance_m - run.distance_m) / run.distance_m).toBeLessThan(0.005);
  splits.forEach((split, k) => {
    const expectedElapsed = ((truth[k + 1] as number) - (truth[k] as number)) / 1000;
    const expectedMoving = trueMovingSeconds(options, truth[k] as number, truth[k + 1] as number);
    const isPartial = k === splits.length - 1 && split.distance_m < (unit === 'km' ? 1000 : 1609.344);
    if (isPartial) {
      // The last split's length depends on the measured total, so compare its pace instead.
      const truePace =
        expectedMoving /
        (run.distance_m - Math.floor(run.distance_m / (unit === 'km' ? 1000 : 1609.344)) * (unit === 'km' ? 1000 : 1609.344));
      expect(Math.abs((split.moving_s / split.distance_m - truePace) / truePace)).toBeLessThan(0.01);
    } else {
      expect(Math.abs(split.elapsed_s - expectedElapsed)).toBeLessThan(maxSplitError);
      expect(Math.abs(split.moving_s - expectedMoving)).toBeLessThan(maxMovingError);
    }
  });
}

describe('splits of generated lake runs match the generator’s exact split times', () => {
  const exact: SyntheticOptions = { start_t: START, phases: TEN_K_WITH_STOP };
  const noisy: SyntheticOptions = { start_t: START, phases: TEN_K_WITH_STOP, gps_sigma_m: 1, ele_sigma_m: 1 };

  it.each<[string, SyntheticOptions, SplitUnit]>([
    ['exact positions, km', exact, 'km'],
    ['exact positions, miles', exact, 'mi'],
    ['1 m drifting GPS noise, km', noisy, 'km'],
    ['1 m drifting GPS noise, miles', noisy, 'mi'],
    ['1 m noise, another seed, km', { ...noisy, seed: 99 }, 'km'],
    ['2 s sampling, km', { ...noisy, sample_s: 2 }, 'km'],
  ])('%s: within 1 s per split, distance within 0.5 %%', (_label, options, unit) => {
    check(options, unit, 1, 1.5);
  });

  it('with 3 m of drifting noise keeps distance within 0.5 % and splits within 4 s (σ = 3 m is about 1 s of position error per boundary)', () => {
    check({ start_t: START, phases: TEN_K_WITH_STOP, gps_sigma_m: 3, seed: 5 }, 'km', 4, 4);
  });

  it('with device distance (TCX-like) splits exactly', () => {
    check({ start_t: START, phases: TEN_K_WITH_STOP, device_distance: true, gps_sigma_m: 3 }, 'km', 0.05, 1.5);
  });

  it('shows the 3-minute stop as stopped time and the 40 s tunnel gap as moving time', () => {
    const run = generateLakeRun(exact);
    const { summary } = analyseTrack(cleanTrack([run.points]));
    const total = TEN_K_WITH_STOP.reduce((s, p) => s + p.duration_s, 0);
    expect(summary.elapsed_s).toBe(total);
    expect(summary.moving_s).toBeCloseTo(total - 180, 0);
  });
});

describe('generator', () => {
  it('is deterministic for a seed', () => {
    const options: SyntheticOptions = { start_t: START, phases: TEN_K_WITH_STOP.slice(0, 2), gps_sigma_m: 2, seed: 3 };
    expect(generateLakeRun(options).points).toEqual(generateLakeRun(options).points);
  });

  it('knows its distance exactly: 9935.6 m for the 10 km profile', () => {
    expect(trueDistance(TEN_K_WITH_STOP)).toBeCloseTo(9935.6, 6);
  });

  it('draws uniform numbers in [0, 1) from its PRNG', () => {
    const random = createPrng(1);
    const values = Array.from({ length: 1000 }, random);
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThan(1);
    expect(values.reduce((a, b) => a + b, 0) / 1000).toBeCloseTo(0.5, 1);
  });

  it('writes no points inside a recording gap', () => {
    const { points } = generateLakeRun({ start_t: START, phases: TEN_K_WITH_STOP });
    const gaps = points.slice(1).filter((p, i) => p.t - points[i]!.t > 1000);
    expect(gaps).toHaveLength(1);
    expect(gaps[0]!.t - points[points.indexOf(gaps[0]!) - 1]!.t).toBe(40_000);
  });
});
