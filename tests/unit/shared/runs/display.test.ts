import { describe, expect, it } from 'vitest';
import {
  describeCleaning,
  describeDistanceMeasure,
  formatDistance,
  formatDistanceIn,
  formatLocalDate,
  formatPaceIn,
  formatShortDate,
  formatRunStart,
  pacePerUnit,
} from '../../../../shared/runs/display.ts';

const CLEAN = {
  input_points: 100,
  dropped_untimed: 0,
  dropped_backwards: 0,
  merged_duplicates: 0,
  dropped_no_position: 0,
  invalid_positions: 0,
};

describe('formatDistance', () => {
  it.each<[number | null, 'mi' | 'km', number | undefined, string]>([
    [1609.344, 'mi', undefined, '1.00'], // international mile (REFERENCES.md)
    [42195, 'km', 3, '42.195'],
    [42195, 'mi', undefined, '26.22'],
    [0, 'km', undefined, '0.00'],
    [null, 'km', undefined, ''],
    [Number.NaN, 'mi', undefined, ''],
    [-1, 'mi', undefined, ''],
  ])('%s m in %s (%s decimals) → "%s"', (metres, unit, decimals, text) => {
    expect(formatDistance(metres, unit, decimals)).toBe(text);
  });
});

describe('formatDistanceIn', () => {
  it.each<[number | null, 'mi' | 'km', string]>([
    [24_300, 'km', '24.3 km'],
    [24_300, 'mi', '15.1 mi'], // 24 300 / 1609.344 = 15.099… (international mile, REFERENCES.md)
    [42_195, 'mi', '26.2 mi'],
    [0, 'km', '0.0 km'],
    [null, 'km', ''],
    [Number.NaN, 'mi', ''],
  ])('%s m in %s → "%s"', (metres, unit, text) => {
    expect(formatDistanceIn(metres, unit)).toBe(text);
  });
});

describe('pacePerUnit', () => {
  it.each<[number | null, 'mi' | 'km', number | null]>([
    [300, 'km', 300],
    [300, 'mi', 482.8032],
    [null, 'mi', null],
    [Number.NaN, 'km', null],
  ])('%s s/km in %s → %s', (pace, unit, expected) => {
    const result = pacePerUnit(pace, unit);
    if (expected === null) expect(result).toBeNull();
    else expect(result).toBeCloseTo(expected, 6);
  });
});

describe('formatRunStart', () => {
  it.each<[string, string, string, string]>([
    ['2026-11-28', '06:30', 'America/Chicago', 'Sat 28 Nov 2026, 06:30 (America/Chicago)'],
    ['2024-02-29', '23:59', 'UTC', 'Thu 29 Feb 2024, 23:59 (UTC)'],
    ['2026-01-05', '00:00', 'Europe/Berlin', 'Mon 5 Jan 2026, 00:00 (Europe/Berlin)'],
    ['not a date', '06:30', 'UTC', 'not a date, 06:30 (UTC)'],
  ])('%s %s %s → "%s"', (date, time, zone, text) => {
    expect(formatRunStart(date, time, zone)).toBe(text);
  });
});

describe('formatLocalDate', () => {
  it.each([
    ['2026-10-03', '3 Oct 2026'],
    ['2026-12-31', '31 Dec 2026'],
    ['oops', 'oops'],
  ])('%s → "%s"', (date, text) => {
    expect(formatLocalDate(date)).toBe(text);
  });
});

describe('formatShortDate', () => {
  it.each([
    ['2026-10-03', '3 Oct'],
    ['2026-12-31', '31 Dec'],
    ['oops', 'oops'],
  ])('%s → "%s"', (date, text) => {
    expect(formatShortDate(date)).toBe(text);
  });
});

describe('describeCleaning', () => {
  it('says nothing when nothing was dropped or merged', () => {
    expect(describeCleaning(CLEAN)).toEqual([]);
  });

  it('names each kind with its count, singular and plural', () => {
    expect(describeCleaning({ ...CLEAN, dropped_backwards: 3, merged_duplicates: 1, invalid_positions: 2 })).toEqual([
      '3 points whose time went backwards were left out.',
      '1 point with the same time as the point before was merged into it.',
      '2 points had impossible coordinates; their positions were ignored.',
    ]);
    expect(describeCleaning({ ...CLEAN, dropped_untimed: 1, dropped_no_position: 4 })).toEqual([
      '1 point without a time was left out.',
      '4 points with neither a position nor a distance were left out.',
    ]);
  });
});

describe('describeDistanceMeasure', () => {
  const base = { source: 'geodesic' as const, median_interval_s: 1, jitter_m: 0.31 };
  it('says how much smoothing took off, in the unit shown', () => {
    expect(describeDistanceMeasure({ ...base, smoothed: true, raw_distance_m: 10_130, distance_m: 10_000 }, 'km')).toBe(
      'Noisy positions (0.31 m of jitter per point) were smoothed before measuring: the distance is 0.13 km (1.3 %) shorter than the point-to-point sum of 10.13 km.',
    );
  });
  it('names clean, sparse and device-measured runs', () => {
    expect(
      describeDistanceMeasure({ ...base, jitter_m: 0.01, smoothed: false, raw_distance_m: 5000, distance_m: 5000 }, 'mi'),
    ).toBe('Measured point to point, no smoothing (positions clean, 0.01 m of jitter per point).');
    expect(
      describeDistanceMeasure({ ...base, median_interval_s: 5, smoothed: false, raw_distance_m: 5000, distance_m: 5000 }, 'mi'),
    ).toBe('Measured point to point, no smoothing (points 5 s apart).');
    // A sparse track measured along the curve through its points says how much the curve added.
    expect(
      describeDistanceMeasure({ ...base, median_interval_s: 5, smoothed: false, raw_distance_m: 5000, distance_m: 5010 }, 'km'),
    ).toBe(
      'Measured along a smooth curve through the points, no smoothing (points 5 s apart): the distance is 0.01 km (0.2 %) longer than the point-to-point sum of 5.00 km.',
    );
    expect(describeDistanceMeasure({ ...base, source: 'device', smoothed: false, raw_distance_m: 1, distance_m: 1 }, 'mi')).toBe(
      'The watch’s own distance was used (no smoothing).',
    );
  });
});

describe('formatPaceIn', () => {
  it("shows a pace stored per km in the reader's unit, with the unit", () => {
    // 300 s/km × 1.609344 km/mi = 482.8 s/mi → 8:03 /mi (the 1959 international mile, 1609.344 m: shared/REFERENCES.md §1).
    expect(formatPaceIn(300, 'mi')).toBe('8:03 /mi');
    expect(formatPaceIn(300, 'km')).toBe('5:00 /km');
    // 4:27.4 per km rounds to the nearest second.
    expect(formatPaceIn(267.4, 'km')).toBe('4:27 /km');
  });

  it('gives nothing for a missing or unreadable pace, so callers show their own dash', () => {
    expect(formatPaceIn(null, 'km')).toBe('');
    expect(formatPaceIn(Number.NaN, 'mi')).toBe('');
    expect(formatPaceIn(-1, 'km')).toBe('');
  });
});
