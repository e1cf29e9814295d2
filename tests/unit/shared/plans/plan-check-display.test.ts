import { describe, expect, it } from 'vitest';
import {
  dateWindow,
  formatActualDistance,
  formatDifference,
  formatPaceRange,
  formatStops,
  formatPlannedDistance,
  formatTolerance,
} from '../../../../shared/plans/plan-check-display.ts';

describe('formatPlannedDistance / formatActualDistance', () => {
  it.each<[number, 'm' | 'km' | 'mi', string]>([
    [800, 'm', '800 m'],
    [2000, 'km', '2 km'],
    [2414.016, 'mi', '1.5 mi'],
    [3218.688, 'mi', '2 mi'],
  ])('planned %d in %s → "%s"', (metres, unit, text) => {
    expect(formatPlannedDistance(metres, unit)).toBe(text);
  });

  it.each<[number, 'm' | 'km' | 'mi', string]>([
    [806.4, 'm', '806 m'],
    [2012.3, 'km', '2.01 km'],
    [1609.344, 'mi', '1.00 mi'],
    [Number.NaN, 'km', '–'],
    [-1, 'm', '–'],
  ])('actual %d in %s → "%s"', (metres, unit, text) => {
    expect(formatActualDistance(metres, unit)).toBe(text);
  });
});

describe('formatPaceRange', () => {
  it('shows the range per km, and per mile converted from seconds per km', () => {
    expect(formatPaceRange(218.75, 225, 'km')).toBe('3:39–3:45 /km');
    expect(formatPaceRange(218.75, 225, 'mi')).toBe('5:52–6:02 /mi');
  });
  it('shows one pace when both ends round to the same', () => {
    expect(formatPaceRange(264.08, 264.08, 'mi')).toBe('7:05 /mi');
  });
  it('is empty without a pace target', () => {
    expect(formatPaceRange(undefined, undefined, 'km')).toBe('');
  });
});

describe('formatDifference', () => {
  it.each<[number | null, 'mi' | 'km', string]>([
    [0, 'km', '0'],
    [-0.3, 'km', '0'], // rounds to nothing: no "−0 s"
    [0.2, 'mi', '0'],
    [12.2, 'km', '+12 s'],
    [-8, 'km', '−8 s'],
    [10, 'mi', '+16 s'],
    [null, 'km', '–'],
    [Number.NaN, 'km', '–'],
  ])('%s s/km in %s → "%s"', (difference, unit, text) => {
    expect(formatDifference(difference, unit)).toBe(text);
  });
});

describe('formatTolerance', () => {
  it.each<[number, string]>([
    [0.02, '±2 %'],
    [0.005, '±0.5 %'],
    [0.025, '±2.5 %'],
    [0.1, '±10 %'],
  ])('%d → "%s"', (tolerance, text) => {
    expect(formatTolerance(tolerance)).toBe(text);
  });
});

describe('dateWindow', () => {
  it.each<[string, number, string, string]>([
    ['2026-10-03', 3, '2026-09-30', '2026-10-06'],
    ['2026-03-01', 3, '2026-02-26', '2026-03-04'],
    ['2028-03-01', 1, '2028-02-29', '2028-03-02'],
    ['2026-12-30', 3, '2026-12-27', '2027-01-02'],
  ])('%s ± %d days → %s … %s', (date, days, from, to) => {
    expect(dateWindow(date, days)).toEqual({ from, to });
  });
});

describe('formatStops', () => {
  it.each<[{ count: number; seconds: number } | undefined, string]>([
    [undefined, ''],
    [{ count: 0, seconds: 0 }, ''],
    [{ count: 1, seconds: 45.2 }, '1 stop, 0:45'],
    [{ count: 2, seconds: 120 }, '2 stops, 2:00'],
  ])('%j → "%s"', (stops, text) => {
    expect(formatStops(stops)).toBe(text);
  });
});
