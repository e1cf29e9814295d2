import { describe, expect, it } from 'vitest';
import { acuteChronicRatio, type DailyLoad } from '../../../../shared/weeks/load.ts';
import { addDays } from '../../../../shared/weeks/weeks.ts';

const END = '2026-10-18'; // a Sunday

/** Daily loads for whole weeks ending on `end`, each week's load spread evenly over its 7 days. */
function fromWeeks(weekly: number[], end = END): DailyLoad[] {
  const days = weekly.flatMap((w) => Array.from({ length: 7 }, () => w / 7));
  return days.map((load, i) => ({ date: addDays(end, i - days.length + 1), load }));
}

/** `count` daily entries of `load` ending on `end`. */
function daily(count: number, load: number, end = END): DailyLoad[] {
  return Array.from({ length: count }, (_, i) => ({ date: addDays(end, i - count + 1), load }));
}

describe('acuteChronicRatio: REFERENCES.md §8 worked table (coupled column)', () => {
  it.each<[number[], number, string]>([
    [[40, 40, 40, 40, 40], 1.0, 'steady'],
    [[40, 40, 40, 40, 50], 1.1765, 'uncoupled would be 1.2500'],
    [[40, 40, 40, 40, 60], 1.3333, 'uncoupled would be 1.5000: coupled keeps it under the spike'],
    [[40, 40, 40, 40, 80], 1.6, 'uncoupled would be 2.0000'],
    [[50, 50, 50, 50, 30], 0.6667, 'uncoupled would be 0.6000'],
  ])('weekly %j → %f (%s)', (weekly, expected) => {
    const result = acuteChronicRatio(fromWeeks(weekly), END);
    expect(result.ratio).toBeCloseTo(expected, 4);
    expect(result.window).toBe('coupled');
    expect(result.reason).toBeNull();
  });

  it('reports the acute week and the mean chronic week (40, 40, 40, 40, 60 → 60 and 45)', () => {
    const result = acuteChronicRatio(fromWeeks([40, 40, 40, 40, 60]), END);
    expect(result.acute_load).toBeCloseTo(60, 9);
    expect(result.chronic_load).toBeCloseTo(45, 9);
    expect(result.end_date).toBe(END);
  });
});

describe('acuteChronicRatio: hand-computed tables', () => {
  it.each<[string, DailyLoad[], number | null, number | null, number | null]>([
    // 21 days at 10, then 7 at 20: acute 140, chronic (210 + 140) / 4 = 87.5, ratio 1.6
    ['3 weeks at 10/day then 1 at 20/day', [...daily(28, 10, addDays(END, -7)), ...daily(7, 20)], 1.6, 140, 87.5],
    // exactly 28 days of history: enough
    ['exactly 28 days', daily(28, 5), 1, 35, 35],
    // exactly 1.5: three weeks of 50, acute 90 → 90 · 4 / 240
    ['exactly 1.5', fromWeeks([50, 50, 50, 90]), 1.5, 90, 60],
    // all load in the acute week: the coupled ceiling of 4
    ['all load in the last 7 days', [...daily(21, 0, addDays(END, -7)), ...daily(7, 10)], 4, 70, 17.5],
    // rest days left out of the list still count as 0 once history reaches back 28 days
    [
      'sparse list with an entry on the first day of the window',
      [
        { date: addDays(END, -27), load: 0 },
        { date: addDays(END, -20), load: 100 },
        { date: addDays(END, -3), load: 100 },
      ],
      2,
      100,
      50,
    ],
    // several entries on one day add up; entries older than 28 days or after the end are ignored
    [
      'double days, older and later entries',
      [
        { date: addDays(END, -40), load: 999 },
        { date: addDays(END, -27), load: 30 },
        { date: END, load: 10 },
        { date: END, load: 20 },
        { date: addDays(END, 1), load: 999 },
      ],
      2,
      30,
      15,
    ],
  ])('%s → ratio %s', (_label, loads, ratio, acute, chronic) => {
    const result = acuteChronicRatio(loads, END);
    if (ratio === null) expect(result.ratio).toBeNull();
    else expect(result.ratio).toBeCloseTo(ratio, 12);
    expect(result.acute_load).toBeCloseTo(acute ?? Number.NaN, 9);
    expect(result.chronic_load).toBeCloseTo(chronic ?? Number.NaN, 9);
  });

  it('gives exactly 1.5, not a hair above, for whole-number loads (one run of 50 a week for 3 weeks, then 90)', () => {
    const loads = [
      ...daily(28, 0),
      ...[-27, -20, -13].map((d) => ({ date: addDays(END, d), load: 50 })),
      { date: END, load: 90 },
    ];
    expect(acuteChronicRatio(loads, END).ratio).toBe(1.5);
  });
});

describe('acuteChronicRatio: no ratio', () => {
  it.each<[string, DailyLoad[], string]>([
    ['27 days of history', daily(27, 10), 'not enough history'],
    ['no entries', [], 'not enough history'],
    ['only entries after the end date', [{ date: addDays(END, 1), load: 10 }], 'not enough history'],
    ['28 days of rest', daily(28, 0), 'no load in the last 28 days'],
    ['load only before the window', [...daily(7, 10, addDays(END, -28)), ...daily(28, 0)], 'no load in the last 28 days'],
  ])('%s → null, %s', (_label, loads, reason) => {
    const result = acuteChronicRatio(loads, END);
    expect(result.ratio).toBeNull();
    expect(result.reason).toBe(reason);
  });

  it('keeps the loads null when history is short, and 0 when the window is empty', () => {
    expect(acuteChronicRatio(daily(27, 10), END)).toMatchObject({ acute_load: null, chronic_load: null });
    expect(acuteChronicRatio(daily(28, 0), END)).toMatchObject({ acute_load: 0, chronic_load: 0 });
  });
});

describe('acuteChronicRatio: invalid input', () => {
  it.each<[string, DailyLoad[], string]>([
    ['negative load', [...daily(27, 10), { date: END, load: -1 }], END],
    ['NaN load', [{ date: END, load: Number.NaN }], END],
    ['infinite load', [{ date: END, load: Number.POSITIVE_INFINITY }], END],
    ['invalid entry date', [{ date: '2026-02-30', load: 1 }], END],
    ['invalid end date', daily(28, 1), '2026-10-32'],
  ])('%s throws RangeError', (_label, loads, end) => {
    expect(() => acuteChronicRatio(loads, end)).toThrow(RangeError);
  });
});
