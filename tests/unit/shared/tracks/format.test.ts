import { describe, expect, it } from 'vitest';
import { formatDuration, formatPace, paceKmToMile, paceMileToKm } from '../../../../shared/tracks/format.ts';

describe('formatPace', () => {
  it.each<[number | null, string]>([
    [300, '5:00'],
    [482.8032, '8:03'], // 5:00/km in s/mi (REFERENCES.md §1 derived checks)
    [59.6, '1:00'],
    [0, '0:00'],
    [3600, '1:00:00'],
    [null, ''],
    [Number.NaN, ''],
    [Number.POSITIVE_INFINITY, ''],
    [-5, ''],
  ])('%s s → "%s"', (seconds, text) => {
    expect(formatPace(seconds)).toBe(text);
  });
});

describe('formatDuration', () => {
  it.each<[number | null, string]>([
    [754.4, '12:34'],
    [3725, '1:02:05'],
    [10800, '3:00:00'],
    [null, ''],
  ])('%s s → "%s"', (seconds, text) => {
    expect(formatDuration(seconds)).toBe(text);
  });
});

describe('pace conversion (international mile 1609.344 m)', () => {
  it('turns 5:00/km into 482.8032 s/mi and 7:00/mi into 260.9759 s/km (REFERENCES.md §1)', () => {
    expect(paceKmToMile(300)).toBeCloseTo(482.8032, 6);
    expect(paceMileToKm(420)).toBeCloseTo(260.9759, 4);
  });
});
