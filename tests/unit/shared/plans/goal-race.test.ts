import { describe, expect, it } from 'vitest';
import { daysToRace, taperWeek, taperWeeks } from '../../../../shared/plans/goal-race.ts';

describe('daysToRace (calendar days, no time zones)', () => {
  it.each<[string, string, number]>([
    ['2026-12-01', '2027-04-18', 138],
    ['2027-04-18', '2027-04-18', 0],
    ['2027-04-19', '2027-04-18', -1],
    ['2027-03-27', '2027-03-28', 1], // across the European clock change
    ['2028-02-28', '2028-03-01', 2], // leap year
  ])('%s to %s is %s days', (today, race, days) => {
    expect(daysToRace(today, race)).toBe(days);
  });

  it.each([['2026-02-30'], ['18 Apr 2027'], ['']])('is NaN for the malformed date %j', (bad) => {
    expect(daysToRace(bad, '2027-04-18')).toBeNaN();
    expect(daysToRace('2027-04-18', bad)).toBeNaN();
  });
});

describe('taperWeeks (common practice)', () => {
  it.each<[number, number]>([
    [42_195, 3],
    [100_000, 3],
    [41_800, 3], // within 1 % of a marathon
    [21_097.5, 2],
    [30_000, 2],
    [10_000, 1],
    [5000, 1],
  ])('%s m tapers for %s weeks', (distance, weeks) => {
    expect(taperWeeks(distance)).toBe(weeks);
  });
});

describe('taperWeek', () => {
  const race = '2027-04-18';
  it.each<[string, number, { week: number; of: number } | null]>([
    ['2027-03-27', 42_195, null], // 22 days out: not yet
    ['2027-03-28', 42_195, { week: 1, of: 3 }], // 21 days out
    ['2027-04-03', 42_195, { week: 1, of: 3 }], // 15
    ['2027-04-04', 42_195, { week: 2, of: 3 }], // 14
    ['2027-04-11', 42_195, { week: 3, of: 3 }], // 7
    ['2027-04-17', 42_195, { week: 3, of: 3 }], // 1
    ['2027-04-18', 42_195, null], // race day
    ['2027-04-20', 42_195, null], // after
    ['2027-04-04', 21_097.5, { week: 1, of: 2 }],
    ['2027-04-03', 21_097.5, null],
    ['2027-04-11', 10_000, { week: 1, of: 1 }],
    ['2027-04-10', 10_000, null],
    ['not a date', 42_195, null],
  ])('on %s before a %s m race: %j', (today, distance, expected) => {
    expect(taperWeek(today, race, distance)).toEqual(expected);
  });
});
