import { describe, expect, it } from 'vitest';
import { expandParts, resolveTargets } from '../../../../shared/plans/expand.ts';
import { checkRunAgainstPlan } from '../../../../shared/plans/plan-check.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../../shared/plans/types.ts';
import { addDays, mondayOf, parseIsoDate, plannedVolume, weekDates } from '../../../../shared/plans/weeks.ts';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';
import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import { generateLakeRun } from '../../../../shared/tracks/synthetic.ts';

const START = Date.UTC(2026, 9, 3, 12);

function items(text: string): PlanItem[] {
  const result = parseShorthand(text);
  if (!result.ok) throw new Error(result.error.message);
  return result.items;
}

describe('parseIsoDate', () => {
  it.each<[string | null, string | null]>([
    ['2026-12-07', '2026-12-07'],
    ['2028-02-29', '2028-02-29'],
    ['2027-02-29', null],
    ['2026-13-01', null],
    ['2026-12-7', null],
    ['', null],
    [null, null],
  ])('%j → %j', (text, expected) => {
    expect(parseIsoDate(text)).toBe(expected);
  });
});

describe('addDays, mondayOf and weekDates', () => {
  it.each<[string, number, string]>([
    ['2026-12-31', 1, '2027-01-01'],
    ['2027-03-01', -1, '2027-02-28'],
    ['2027-03-27', 2, '2027-03-29'], // across a clock change
  ])('%s + %s days = %s', (date, days, expected) => {
    expect(addDays(date, days)).toBe(expected);
  });

  it.each<[string, string]>([
    ['2026-12-07', '2026-12-07'], // a Monday
    ['2026-12-13', '2026-12-07'], // Sunday belongs to the week before it
    ['2026-12-09', '2026-12-07'],
    ['2027-01-01', '2026-12-28'], // across the year
  ])('the Monday of %s is %s', (date, monday) => {
    expect(mondayOf(date)).toBe(monday);
  });

  it('gives Monday to Sunday', () => {
    expect(weekDates('2026-12-28')).toEqual([
      '2026-12-28',
      '2026-12-29',
      '2026-12-30',
      '2026-12-31',
      '2027-01-01',
      '2027-01-02',
      '2027-01-03',
    ]);
  });
});

describe('plannedVolume', () => {
  it.each<[string, number, number]>([
    ['45 min easy', 0, 2700],
    ['10 km easy', 10_000, 0],
    // Shorthand writes recoveries between reps: six reps, five jogs (no jog after the last rep).
    ['2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down', 4 * 1609.344 + 6 * 800 + 5 * 400, 0],
    ['15 min warm-up, 6 x 3 min @ 4:05-4:13/km w/ 2 min jog, 10 min cool-down', 0, 900 + 6 * 180 + 5 * 120 + 600],
    // A recovery after the last rep counts when it is written as its own part.
    ['6 x 800 m @ 2:55-3:00 w/ 400 m jog, 400 m jog', 6 * 800 + 6 * 400, 0],
    ['1 mi warm-up, 20 min tempo', 1609.344, 1200],
  ])('%s → %s m and %s s', (text, metres, seconds) => {
    const volume = plannedVolume(items(text));
    expect(volume.distance_m).toBeCloseTo(metres, 6);
    expect(volume.duration_s).toBe(seconds);
  });

  it('agrees with the plan check: the planned amounts of its rows add up to the weekly planned volume', () => {
    for (const text of [
      '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down',
      '15 min warm-up, 6 x 3 min @ 4:05-4:13/km w/ 2 min jog, 10 min cool-down',
      '2 km warm-up, 4 x 1 km @ 3:40-3:45/km w/ 90 s jog',
      '3 x 2 km @ 3:50-3:55/km w/ 400 m jog, 400 m jog, 1 km easy',
    ]) {
      const planned = items(text);
      const parts = resolveTargets(expandParts(planned), {});
      // The plan's own amounts as the run: every row gets its planned distance or time.
      const phases = parts.map((p) => ({
        kind: 'run' as const,
        duration_s: p.amount.type === 'distance' ? p.amount.distance_m / 3.5 : p.amount.duration_s,
        speed_mps: 3.5,
      }));
      const series = analyseTrack(
        cleanTrack([generateLakeRun({ start_t: START, phases, seed: 4, gps_sigma_m: 0 }).points]),
      ).series;
      const rows = checkRunAgainstPlan(parts, series, []).parts;
      const volume = plannedVolume(planned);
      const sum = (key: 'distance_m' | 'duration_s') => rows.reduce((total, row) => total + (row.planned[key] ?? 0), 0);
      expect(sum('distance_m'), text).toBeCloseTo(volume.distance_m, 6);
      expect(sum('duration_s'), text).toBeCloseTo(volume.duration_s, 6);
    }
  });

  it('is zero for no items', () => {
    expect(plannedVolume([])).toEqual({ distance_m: 0, duration_s: 0 });
  });
});
