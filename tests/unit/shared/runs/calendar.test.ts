import { describe, expect, it } from 'vitest';
import { formatYearMonth, monthBounds, monthWeeks, parseYearMonth, shiftMonth } from '../../../../shared/runs/calendar.ts';

describe('monthBounds', () => {
  it.each([
    [
      { year: 2026, month: 10 },
      { from: '2026-10-01', to: '2026-10-31' },
    ],
    [
      { year: 2024, month: 2 },
      { from: '2024-02-01', to: '2024-02-29' },
    ], // leap year
    [
      { year: 2026, month: 2 },
      { from: '2026-02-01', to: '2026-02-28' },
    ],
  ])('%o → %o', (ym, bounds) => {
    expect(monthBounds(ym)).toEqual(bounds);
  });
});

describe('shiftMonth', () => {
  it.each([
    [{ year: 2026, month: 12 }, 1, { year: 2027, month: 1 }],
    [{ year: 2026, month: 1 }, -1, { year: 2025, month: 12 }],
    [{ year: 2026, month: 5 }, -17, { year: 2024, month: 12 }],
    [{ year: 2026, month: 5 }, 0, { year: 2026, month: 5 }],
  ])('%o %i → %o', (ym, delta, expected) => {
    expect(shiftMonth(ym, delta)).toEqual(expected);
  });
});

describe('parseYearMonth / formatYearMonth', () => {
  it.each<[string | null, { year: number; month: number } | null]>([
    ['2026-10', { year: 2026, month: 10 }],
    ['2026-13', null],
    ['2026-00', null],
    ['2026-1', null],
    ['', null],
    [null, null],
  ])('%s → %o', (text, ym) => {
    expect(parseYearMonth(text)).toEqual(ym);
  });

  it('pads the month', () => {
    expect(formatYearMonth({ year: 2026, month: 3 })).toBe('2026-03');
  });
});

describe('monthWeeks', () => {
  it('starts weeks on Monday and leaves days of other months empty (October 2026 starts on a Thursday)', () => {
    const weeks = monthWeeks({ year: 2026, month: 10 });
    expect(weeks).toHaveLength(5);
    expect(weeks[0]).toEqual([null, null, null, '2026-10-01', '2026-10-02', '2026-10-03', '2026-10-04']);
    expect(weeks[4]).toEqual(['2026-10-26', '2026-10-27', '2026-10-28', '2026-10-29', '2026-10-30', '2026-10-31', null]);
  });

  it('fits February 2027 (28 days from a Monday) in four weeks', () => {
    const weeks = monthWeeks({ year: 2027, month: 2 });
    expect(weeks).toHaveLength(4);
    expect(weeks[0]![0]).toBe('2027-02-01');
    expect(weeks[3]![6]).toBe('2027-02-28');
  });

  it('needs six weeks for August 2026 (31 days from a Saturday)', () => {
    expect(monthWeeks({ year: 2026, month: 8 })).toHaveLength(6);
  });
});
