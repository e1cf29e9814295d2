import { describe, expect, it } from 'vitest';
import { addDays, dayOfWeek, daysBetween, isIsoDate, weekDates, weekStart } from '../../../../shared/weeks/weeks.ts';

describe('isIsoDate', () => {
  it.each<[string, boolean]>([
    ['2026-10-12', true],
    ['2028-02-29', true], // leap year
    ['2027-02-29', false],
    ['2026-13-01', false],
    ['2026-10-7', false],
    ['2026-10-12T00:00:00Z', false],
    ['', false],
  ])('%j → %s', (text, expected) => {
    expect(isIsoDate(text)).toBe(expected);
  });
});

describe('addDays', () => {
  it.each<[string, number, string]>([
    ['2026-12-31', 1, '2027-01-01'],
    ['2027-03-01', -1, '2027-02-28'],
    ['2028-02-28', 1, '2028-02-29'],
    ['2026-03-28', 2, '2026-03-30'], // across the European spring clock change
    ['2026-10-24', 2, '2026-10-26'], // across the autumn clock change
    ['2026-11-01', 1, '2026-11-02'], // US clock change
    ['2026-10-12', 0, '2026-10-12'],
    ['2026-10-12', -27, '2026-09-15'],
  ])('%s %+d → %s', (date, days, expected) => {
    expect(addDays(date, days)).toBe(expected);
  });

  it.each<[string, number]>([
    ['2026-02-30', 1],
    ['12/10/2026', 1],
    ['2026-10-12', 0.5],
  ])('invalid: %j %f throws', (date, days) => {
    expect(() => addDays(date, days)).toThrow(RangeError);
  });
});

describe('daysBetween and dayOfWeek', () => {
  it.each<[string, string, number]>([
    ['2026-10-12', '2026-10-18', 6],
    ['2026-10-18', '2026-10-12', -6],
    ['2026-12-31', '2027-01-01', 1],
    ['2026-03-01', '2026-04-01', 31], // spans a clock change
  ])('%s → %s is %d days', (from, to, expected) => {
    expect(daysBetween(from, to)).toBe(expected);
  });

  it.each<[string, number]>([
    ['2026-10-11', 0], // Sunday
    ['2026-10-12', 1],
    ['2026-10-17', 6],
  ])('%s is weekday %d', (date, expected) => {
    expect(dayOfWeek(date)).toBe(expected);
  });
});

describe('weekStart', () => {
  it.each<[string, number | undefined, string]>([
    ['2026-10-14', undefined, '2026-10-12'], // Wednesday → Monday (default)
    ['2026-10-12', undefined, '2026-10-12'], // a Monday is its own start
    ['2026-10-18', undefined, '2026-10-12'], // Sunday is the last day of a Monday week
    ['2026-10-18', 0, '2026-10-18'], // … and the first of a Sunday week
    ['2026-10-17', 0, '2026-10-11'],
    ['2026-10-14', 6, '2026-10-10'], // Saturday weeks
    ['2026-10-17', 6, '2026-10-17'],
    ['2027-01-01', 1, '2026-12-28'], // across a year end
    ['2026-03-01', 1, '2026-02-23'], // across a month end
  ])('%s, weeks from %s → %s', (date, startsOn, expected) => {
    expect(weekStart(date, startsOn)).toBe(expected);
  });

  it.each<[string, number]>([
    ['2026-10-14', 7],
    ['2026-10-14', -1],
    ['2026-10-14', 1.5],
    ['2026-10-32', 1],
  ])('invalid: %s, %f throws', (date, startsOn) => {
    expect(() => weekStart(date, startsOn)).toThrow(RangeError);
  });
});

describe('weekDates', () => {
  it('gives seven consecutive dates, across a month and a clock change', () => {
    expect(weekDates('2026-10-26')).toEqual([
      '2026-10-26',
      '2026-10-27',
      '2026-10-28',
      '2026-10-29',
      '2026-10-30',
      '2026-10-31',
      '2026-11-01',
    ]);
  });

  it('throws on an invalid start', () => {
    expect(() => weekDates('2026-10-xx')).toThrow(RangeError);
  });
});
