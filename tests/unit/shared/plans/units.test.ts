import { describe, expect, it } from 'vitest';
import { distanceFromWritten, distanceToWritten, paceFromWritten, paceToWritten } from '../../../../shared/plans/units.ts';
import type { DistanceUnit, PacePer } from '../../../../shared/plans/types.ts';

describe('paceFromWritten (seconds as written → seconds per km; 1 mi = 1609.344 m exactly)', () => {
  it.each<[number, PacePer, number | null, number]>([
    [425, 'mi', null, 264.0827567], // 7:05/mi: 425 × 1000 / 1609.344
    [482.8032, 'mi', null, 300], // 5:00/km in s/mi (REFERENCES.md §1)
    [300, 'km', null, 300],
    [175, 'rep', 800, 218.75], // 2:55 for 800 m: 175 / 0.8
    [180, 'rep', 800, 225],
    [75, 'rep', 400, 187.5],
    [2700, 'rep', 10_000, 270], // 45:00 for 10 km
  ])('%s s per %s (rep %s m) → %s s/km', (written, per, distance, sPerKm) => {
    expect(paceFromWritten(written, per, distance)).toBeCloseTo(sPerKm, 6);
    expect(paceToWritten(sPerKm, per, distance)).toBeCloseTo(written, 6);
  });

  it.each<[string, number | null]>([
    ['no distance', null],
    ['a zero distance', 0],
  ])('gives NaN for a rep pace with %s', (_name, distance) => {
    expect(paceFromWritten(175, 'rep', distance)).toBeNaN();
  });
});

describe('distances as written', () => {
  it.each<[number, DistanceUnit, number]>([
    [2, 'mi', 3218.688],
    [0.5, 'mi', 804.672],
    [10, 'km', 10_000],
    [800, 'm', 800],
    [1.23456, 'km', 1235], // three decimals of the written unit
  ])('%s %s → %s m', (value, unit, metres) => {
    expect(distanceFromWritten(value, unit)).toBeCloseTo(metres, 9);
  });

  it.each<[number, DistanceUnit, number]>([
    [3218.688, 'mi', 2],
    [8046.9, 'mi', 5],
    [1234.5, 'km', 1.235],
    [800.0004, 'm', 800],
  ])('%s m in %s → %s', (metres, unit, value) => {
    expect(distanceToWritten(metres, unit)).toBe(value);
  });
});
