import { describe, expect, it } from 'vitest';
import {
  fillMissing,
  flatEquivalentFactor,
  hysteresisProfile,
  minettiRunningCost,
  smoothByTime,
  sumRisesAndFalls,
} from '../../../../shared/tracks/elevation.ts';
import { createGaussMarkov, createPrng } from '../../../../shared/tracks/synthetic.ts';

const f64 = (values: number[]): Float64Array => Float64Array.from(values);
const seconds = (n: number): Float64Array => Float64Array.from({ length: n }, (_, i) => i * 1000);

describe('Minetti et al. (2002) cost of running (J Appl Physiol 93:1039; values from REFERENCES.md §5, slope.py)', () => {
  it.each([
    [-0.2, 1.800032],
    [-0.1, 2.151706],
    [0, 3.6],
    [0.05, 4.685196],
    [0.1, 5.968214],
    [0.2, 9.006688],
    [0.45, 19.426015],
    [-0.45, 4.032305],
  ])('Cr(%f) = %f J/kg/m', (grade, cost) => {
    expect(minettiRunningCost(grade)).toBeCloseTo(cost, 5);
  });

  it.each([
    [0, 1],
    [0.1, 1.657837],
    [-0.1, 0.597696],
  ])('flat-equivalent factor f(%f) = %f', (grade, factor) => {
    expect(flatEquivalentFactor(grade)).toBeCloseTo(factor, 5);
  });

  it('clamps gradients outside ±45 %', () => {
    expect(minettiRunningCost(0.8)).toBe(minettiRunningCost(0.45));
    expect(minettiRunningCost(-3)).toBe(minettiRunningCost(-0.45));
  });
});

describe('hysteresisProfile', () => {
  it.each<[string, number[], number, number]>([
    ['counts a clean climb in full', [100, 101, 103, 106, 110], 10, 0],
    ['ignores wobble smaller than the threshold', [100, 102, 100, 102, 100, 102], 0, 0],
    ['counts up and down past the threshold', [100, 110, 100], 10, 10],
    ['does not count a small dip before a climb as descent', [100, 98, 110], 12, 0],
    ['leaves a flat profile flat', [50, 50, 50], 0, 0],
    ['handles one value', [50], 0, 0],
  ])('%s', (_label, values, gain, loss) => {
    const result = sumRisesAndFalls(hysteresisProfile(f64(values), 3));
    expect(result.gain).toBeCloseTo(gain, 9);
    expect(result.loss).toBeCloseTo(loss, 9);
  });

  it('keeps GPS altitude noise on a flat 1-hour loop (2 m jitter plus a 4 m drift over minutes) under 100 m of ascent', () => {
    const random = createPrng(42);
    const drift = createGaussMarkov(random, 4, 300);
    const n = 3600;
    const ele = Float64Array.from({ length: n }, () => 150 + drift(1) + 4 * (random() + random() + random() - 1.5));
    const raw = sumRisesAndFalls(ele).gain;
    const counted = sumRisesAndFalls(hysteresisProfile(smoothByTime(seconds(n), ele, 10), 3)).gain;
    expect(raw).toBeGreaterThan(1000);
    expect(counted).toBeLessThan(100);
  });
});

describe('fillMissing and smoothByTime', () => {
  it('interpolates gaps in time and repeats the ends', () => {
    const t = f64([0, 1000, 3000, 4000]);
    expect(Array.from(fillMissing(t, f64([Number.NaN, 10, Number.NaN, 40])) ?? [])).toEqual([10, 10, 30, 40]);
  });

  it('returns null when nothing is known', () => {
    expect(fillMissing(f64([0, 1]), f64([Number.NaN, Number.NaN]))).toBeNull();
  });

  it('averages over the centred time window', () => {
    const out = smoothByTime(seconds(5), f64([0, 0, 10, 0, 0]), 1);
    expect(Array.from(out)).toEqual([0, 10 / 3, 10 / 3, 10 / 3, 0]);
  });
});
