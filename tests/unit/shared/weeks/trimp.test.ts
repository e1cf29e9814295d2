import { describe, expect, it } from 'vitest';
import {
  heartRateReserveFraction,
  TRIMP_COEFFICIENTS,
  trimpOfSeries,
  trimpOfSession,
  trimpWeight,
  type Sex,
} from '../../../../shared/weeks/trimp.ts';

/** Samples every `stepS` seconds holding each heart rate for its minutes, e.g. [[30, 120], [30, 170]]. */
function series(blocks: Array<[minutes: number, hr: number]>, stepS = 60): { t: number[]; hr: number[] } {
  const t = [0];
  const hr = [blocks[0]![1]];
  for (const [minutes, bpm] of blocks) {
    for (let s = stepS; s <= minutes * 60; s += stepS) {
      t.push(t[t.length - 1]! + stepS * 1000);
      hr.push(bpm);
    }
  }
  return { t, hr };
}

describe('coefficients', () => {
  it('are Banister’s: men a = 0.64, b = 1.92; women a = 0.86, b = 1.67 (REFERENCES.md §6)', () => {
    expect(TRIMP_COEFFICIENTS).toEqual({ male: { a: 0.64, b: 1.92 }, female: { a: 0.86, b: 1.67 } });
  });
});

describe('trimpWeight (REFERENCES.md §6, weighting factor at x = 0.5 / 0.75 / 1.0)', () => {
  it.each<[number, Sex, number]>([
    [0.5, 'male', 1.671486],
    [0.75, 'male', 2.701245],
    [1.0, 'male', 4.365413],
    [0.5, 'female', 1.98214],
    [0.75, 'female', 3.009209],
    [1.0, 'female', 4.568464],
    [0.692308, 'male', 2.418007], // 60 min @150, rest 60, max 190
    [0.692308, 'female', 2.732812],
  ])('x = %f, %s → %f', (x, sex, expected) => {
    expect(trimpWeight(x, sex)).toBeCloseTo(expected, 5);
  });
});

describe('heartRateReserveFraction', () => {
  it.each<[number, number, number, number | null, string]>([
    [150, 60, 190, 0.692308, 'REFERENCES.md §6: 150 with rest 60, max 190 is 69.2308 % HRR'],
    [60, 60, 190, 0, 'at resting → 0'],
    [45, 60, 190, 0, 'below resting → 0'],
    [190, 60, 190, 1, 'at max → 1'],
    [205, 60, 190, 1, 'above max is clamped to 1'],
    [Number.NaN, 60, 190, null, 'unknown heart rate'],
    [150, 190, 190, null, 'max = rest'],
    [150, 200, 190, null, 'max < rest'],
    [150, Number.NaN, 190, null, 'unknown rest'],
    [150, 60, Number.POSITIVE_INFINITY, null, 'infinite max'],
    [150, -5, 190, null, 'negative rest'],
  ])('%f bpm, rest %f, max %f → %s (%s)', (hr, rest, max, expected) => {
    const x = heartRateReserveFraction(hr, rest, max);
    if (expected === null) expect(x).toBeNull();
    else expect(x).toBeCloseTo(expected, 6);
  });
});

describe('trimpOfSession', () => {
  it.each<[number, number, number, number, Sex, number, string]>([
    [60, 150, 60, 190, 'male', 100.4403, 'REFERENCES.md §6: man, 60 min @150, rest 60, max 190'],
    [60, 150, 60, 190, 'female', 113.5168, 'REFERENCES.md §6: woman, same session'],
    [45, 150, 60, 190, 'male', 75.3302, 'REFERENCES.md §6 cross-check (third party 75.36)'],
    [60, 155, 55, 190, 'male', 117.9399, 'REFERENCES.md §6 cross-check (third party ≈118)'],
    [60, 140, 50, 200, 'male', 72.9104, 'REFERENCES.md §6 cross-check (third party ≈72)'],
    [60, 185, 50, 200, 'male', 194.5515, 'REFERENCES.md §6 cross-check (third party ≈194)'],
    [60, 145, 60, 190, 'male', 88.1076, 'REFERENCES.md §6: mean-HR value of the 30 @120 + 30 @170 session'],
    [30, 170, 50, 190, 'female', 92.5411, 'heart_rate.py extra case'],
    [120, 140, 50, 185, 'male', 184.148, 'heart_rate.py extra case'],
    [0, 150, 60, 190, 'male', 0, 'zero minutes'],
    [60, 60, 60, 190, 'male', 0, 'at resting heart rate'],
    [60, 50, 60, 190, 'female', 0, 'below resting heart rate'],
    [60, 210, 60, 190, 'male', 60 * 4.365413, 'above max: clamped to x = 1'],
  ])('%f min @%f (rest %f, max %f, %s) → %f — %s', (minutes, avg, rest, max, sex, expected) => {
    const result = trimpOfSession(minutes, avg, rest, max, sex);
    expect(result?.trimp).toBeCloseTo(expected, 3);
    expect(result?.coefficients).toBe(sex);
    expect(result?.sex_assumed).toBe(false);
  });

  it('uses the men’s coefficients when the sex is unknown, and says so', () => {
    expect(trimpOfSession(60, 150, 60, 190, null)).toEqual({
      trimp: expect.closeTo(100.4403, 4),
      minutes: 60,
      coefficients: 'male',
      sex_assumed: true,
    });
  });

  it.each<[string, number, number, number, number]>([
    ['max = rest', 60, 150, 60, 60],
    ['max < rest', 60, 150, 190, 60],
    ['negative minutes', -1, 150, 60, 190],
    ['NaN minutes', Number.NaN, 150, 60, 190],
    ['unknown mean heart rate', 60, Number.NaN, 60, 190],
  ])('invalid: %s → null', (_label, minutes, avg, rest, max) => {
    expect(trimpOfSession(minutes, avg, rest, max, 'male')).toBeNull();
  });
});

describe('trimpOfSeries', () => {
  it('sums interval by interval: 30 min @120 + 30 min @170 → 103.9692, not the 88.1076 of the mean HR (REFERENCES.md §6)', () => {
    const { t, hr } = series([
      [30, 120],
      [30, 170],
    ]);
    const result = trimpOfSeries(t, hr, null, 60, 190, 'male');
    expect(result?.trimp).toBeCloseTo(103.9692, 4);
    expect(result?.minutes).toBeCloseTo(60, 9);
    expect(trimpOfSession(60, 145, 60, 190, 'male')?.trimp).toBeCloseTo(88.1076, 4);
  });

  it.each<[string, Array<[number, number]>, number, Sex, number, number]>([
    ['constant 150 for 60 min, 1 s samples = session value (REFERENCES.md §6, man)', [[60, 150]], 1, 'male', 100.4403, 60],
    ['constant 150 for 60 min, woman (REFERENCES.md §6)', [[60, 150]], 5, 'female', 113.5168, 60],
    ['45 min @150 (REFERENCES.md §6 cross-check)', [[45, 150]], 60, 'male', 75.3302, 45],
    ['at resting all through → 0', [[30, 60]], 60, 'male', 0, 30],
    ['above max is clamped to x = 1', [[10, 200]], 60, 'male', 10 * 4.365413, 10],
  ])('%s', (_label, blocks, stepS, sex, expected, minutes) => {
    const { t, hr } = series(blocks, stepS);
    const result = trimpOfSeries(t, hr, null, 60, 190, sex);
    expect(result?.trimp).toBeCloseTo(expected, 4);
    expect(result?.minutes).toBeCloseTo(minutes, 9);
  });

  it('leaves out stopped intervals and counts only moving minutes', () => {
    const { t, hr } = series([[60, 150]]);
    const moving = t.map((_, i) => (i > 15 && i <= 30 ? 0 : 1)); // minutes 16–30 stopped
    const result = trimpOfSeries(t, hr, moving, 60, 190, 'male');
    expect(result?.minutes).toBeCloseTo(45, 9);
    expect(result?.trimp).toBeCloseTo(75.3302, 4);
  });

  it('takes the heart rate at the end of each interval, else at its start, else skips the interval', () => {
    const t = [0, 60_000, 120_000, 180_000, 240_000];
    const hr = [150, Number.NaN, Number.NaN, 150, 150];
    // interval 1 uses hr[0]; interval 2 has neither end; intervals 3 and 4 use their end
    const result = trimpOfSeries(t, hr, null, 60, 190, 'male');
    expect(result?.minutes).toBe(3);
    expect(result?.trimp).toBeCloseTo((3 * 100.4403) / 60, 4);
  });

  it('ignores repeated or backwards timestamps', () => {
    const result = trimpOfSeries([0, 60_000, 60_000, 30_000, 90_000], [150, 150, 150, 150, 150], null, 60, 190, 'male');
    expect(result?.minutes).toBe(2);
  });

  it('uses the men’s coefficients when the sex is unknown, and says so', () => {
    const { t, hr } = series([[60, 150]]);
    const result = trimpOfSeries(t, hr, null, 60, 190, null);
    expect(result).toMatchObject({ coefficients: 'male', sex_assumed: true });
    expect(result?.trimp).toBeCloseTo(100.4403, 4);
  });

  it.each<[string, number[], number[], number[] | null, number, number]>([
    ['empty series', [], [], null, 60, 190],
    ['one sample', [0], [150], null, 60, 190],
    ['no heart rate at all', [0, 60_000], [Number.NaN, Number.NaN], null, 60, 190],
  ])('%s → TRIMP 0 over 0 minutes', (_label, t, hr, moving, rest, max) => {
    expect(trimpOfSeries(t, hr, moving, rest, max, 'female')).toEqual({
      trimp: 0,
      minutes: 0,
      coefficients: 'female',
      sex_assumed: false,
    });
  });

  it.each<[string, number[], number[], number[] | null, number, number]>([
    ['max = rest', [0, 60_000], [150, 150], null, 150, 150],
    ['max < rest', [0, 60_000], [150, 150], null, 190, 60],
    ['hr length differs', [0, 60_000], [150], null, 60, 190],
    ['moving length differs', [0, 60_000], [150, 150], [1], 60, 190],
  ])('invalid: %s → null', (_label, t, hr, moving, rest, max) => {
    expect(trimpOfSeries(t, hr, moving, rest, max, 'male')).toBeNull();
  });

  it('accepts typed arrays', () => {
    const { t, hr } = series([[60, 150]]);
    const result = trimpOfSeries(Float64Array.from(t), Float64Array.from(hr), new Uint8Array(t.length).fill(1), 60, 190, 'male');
    expect(result?.trimp).toBeCloseTo(100.4403, 4);
  });
});
