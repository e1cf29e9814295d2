import { describe, expect, it } from 'vitest';
import { CLIMB_UNIT, climbIn, formatFileSize } from '../../../shared/units.ts';

describe('formatFileSize', () => {
  it.each([
    [1024 ** 3, '1 GB'],
    [1.5 * 1024 ** 3, '1.5 GB'],
    [50 * 1024 ** 2, '50 MB'],
    [1024 ** 2 - 1, '1024 KB'],
    [800 * 1024, '800 KB'],
    [1000, '1000 bytes'],
    [0, '0 bytes'],
  ])('%d bytes reads "%s"', (bytes, words) => {
    expect(formatFileSize(bytes)).toBe(words);
  });
});

describe('climb in the unit that goes with the distances', () => {
  it('is feet with miles and metres with kilometres, rounded to whole units', () => {
    // International foot = 0.3048 m exactly (1959 international yard and pound agreement): 541 m = 1774.9 ft.
    expect(climbIn(541, 'mi')).toBe(1775);
    expect(climbIn(541, 'km')).toBe(541);
    expect(climbIn(0.3048 * 1000, 'mi')).toBe(1000);
    expect(CLIMB_UNIT).toEqual({ mi: 'ft', km: 'm' });
  });
});
