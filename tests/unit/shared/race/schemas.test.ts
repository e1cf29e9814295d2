import { describe, expect, it } from 'vitest';
import type { ZodError } from 'zod';
import { toFieldErrors, toFieldIssues } from '../../../../shared/api/field-issues.ts';
import { parseClockTime } from '../../../../shared/race/clock-time.ts';
import { describeDistance, HALF_MARATHON_M, MARATHON_M, MILE_M } from '../../../../shared/race/distances.ts';
import { checkNegativeSplit, checkRaceDistance, checkRaceResult, checkRaceTime } from '../../../../shared/race/limits.ts';
import {
  EquivalentsQuerySchema,
  PaceFormSchema,
  PacesQuerySchema,
  RaceResultFormSchema,
} from '../../../../shared/race/schemas.ts';

function errorsOf(result: { success: boolean; error?: ZodError }) {
  return result.success ? {} : toFieldErrors(toFieldIssues(result.error!));
}

describe('parseClockTime', () => {
  it.each<[string, number | null]>([
    ['1:25:00', 5100],
    ['3:00:00', 10800],
    ['19:56', 1196],
    ['90:00', 5400],
    ['4:05.3', 245.3],
    [' 0:59 ', 59],
    ['0:00', 0],
    ['100:00:00', 360000],
    ['', null],
    ['5100', null],
    ['1:5', null],
    ['1:60', null],
    ['1:60:00', null],
    ['1:2:3', null],
    ['a:bc', null],
    ['-1:00', null],
  ])('"%s" → %s', (text, seconds) => {
    expect(parseClockTime(text)).toBe(seconds);
  });
});

describe('limits', () => {
  it.each<[number, string | null]>([
    [MARATHON_M, null],
    [250_000, null],
    [0.5, null],
    [0, 'The distance must be more than 0 m.'],
    [-5000, 'The distance must be more than 0 m.'],
    [250_001, 'Distances up to 250 km (250000 m) are supported.'],
    [Number.NaN, 'The distance must be a number of metres, e.g. 21097.5 for a half marathon.'],
  ])('distance %s m → %s', (d, message) => {
    expect(checkRaceDistance(d)).toBe(message);
  });

  it.each<[number, string | null]>([
    [5100, null],
    [360_000, null],
    [0, 'The time must be more than 0 seconds.'],
    [-1, 'The time must be more than 0 seconds.'],
    [360_001, 'Times up to 100 hours are supported.'],
    [Number.POSITIVE_INFINITY, 'The time must be a number of seconds, e.g. 5100 for 1:25:00.'],
  ])('time %s s → %s', (t, message) => {
    expect(checkRaceTime(t)).toBe(message);
  });

  it.each<[string, number, number, RegExp | null]>([
    ['half 1:25:00', HALF_MARATHON_M, 5100, null],
    ['exactly 1:00 per km', 1000, 60, null],
    ['exactly 30:00 per km', 1000, 1800, null],
    ['marathon in a minute', MARATHON_M, 60, /faster than 1:00 per km/],
    ['5K in 10 hours', 5000, 36_000, /slower than 30:00 per km/],
    ['zero distance first', 0, 0, /distance must be more than 0/],
  ])('%s', (_name, d, t, message) => {
    const problem = checkRaceResult(d, t);
    if (message === null) expect(problem).toBeNull();
    else expect(problem).toMatch(message);
  });

  it.each<[number, number, RegExp | null]>([
    [0, 10800, null],
    [1080, 10800, null],
    [1081, 10800, /at most a tenth of the goal time/],
    [-1, 10800, /use 0 for even pacing/],
    [Number.NaN, 10800, /must be a number of seconds/],
  ])('negative split %s s on a %s s goal', (n, goal, message) => {
    const problem = checkNegativeSplit(n, goal);
    if (message === null) expect(problem).toBeNull();
    else expect(problem).toMatch(message);
  });
});

describe('EquivalentsQuerySchema (query strings of GET /api/tools/equivalents)', () => {
  it('reads numbers from text', () => {
    expect(EquivalentsQuerySchema.parse({ distance_m: '21097.5', time_s: '5100' })).toEqual({
      distance_m: 21097.5,
      time_s: 5100,
    });
  });

  it.each<[string, Record<string, unknown>, Record<string, RegExp>]>([
    ['both missing', {}, { distance_m: /Give the race distance/, time_s: /Give the race time/ }],
    ['blank values', { distance_m: '', time_s: ' ' }, { distance_m: /Give the race distance/, time_s: /Give the race time/ }],
    ['not numbers', { distance_m: 'far', time_s: '1:25:00' }, { distance_m: /number of metres/, time_s: /number of seconds/ }],
    ['zero', { distance_m: '0', time_s: '0' }, { distance_m: /more than 0 m/, time_s: /more than 0 seconds/ }],
    ['negative', { distance_m: '-5000', time_s: '-1200' }, { distance_m: /more than 0 m/, time_s: /more than 0 seconds/ }],
    ['absurdly long', { distance_m: '1e9', time_s: '1e9' }, { distance_m: /250 km/, time_s: /100 hours/ }],
    ['absurdly fast', { distance_m: '42195', time_s: '60' }, { time_s: /faster than 1:00 per km/ }],
    ['repeated parameter', { distance_m: ['5000', '10000'], time_s: '1200' }, { distance_m: /number of metres/ }],
  ])('%s → 400-style field errors', (_name, query, expected) => {
    const errors = errorsOf(EquivalentsQuerySchema.safeParse(query));
    expect(Object.keys(errors).sort()).toEqual(Object.keys(expected).sort());
    for (const [field, message] of Object.entries(expected)) expect(errors[field]).toMatch(message);
  });
});

describe('PacesQuerySchema', () => {
  it('defaults to miles and even pacing', () => {
    expect(PacesQuerySchema.parse({ distance_m: '42195', time_s: '10800' })).toEqual({
      distance_m: 42195,
      time_s: 10800,
      unit: 'mi',
      negative_split_s: 0,
    });
  });

  it.each<[string, Record<string, unknown>, Record<string, RegExp>]>([
    ['a unit that is neither', { distance_m: '5000', time_s: '1200', unit: 'yd' }, { unit: /mi or km/ }],
    ['a negative split below 0', { distance_m: '5000', time_s: '1200', negative_split_s: '-5' }, { negative_split_s: /use 0/ }],
    [
      'too big a negative split',
      { distance_m: '5000', time_s: '1200', negative_split_s: '200' },
      { negative_split_s: /a tenth/ },
    ],
    [
      'a split that is not a number',
      { distance_m: '5000', time_s: '1200', negative_split_s: 'x' },
      { negative_split_s: /number of seconds/ },
    ],
  ])('%s', (_name, query, expected) => {
    const errors = errorsOf(PacesQuerySchema.safeParse(query));
    expect(Object.keys(errors)).toEqual(Object.keys(expected));
    for (const [field, message] of Object.entries(expected)) expect(errors[field]).toMatch(message);
  });
});

describe('RaceResultFormSchema and PaceFormSchema (the Tools page forms)', () => {
  it.each<[string, Record<string, unknown>, { distance_m: number; time_s: number }]>([
    ['half in 1:25:00', { distance: 'half', time: '1:25:00' }, { distance_m: HALF_MARATHON_M, time_s: 5100 }],
    ['mile in 6:00', { distance: 'mile', time: '6:00' }, { distance_m: MILE_M, time_s: 360 }],
    [
      'custom 30 km',
      { distance: 'custom', custom_distance: '30', custom_unit: 'km', time: '2:15:00' },
      { distance_m: 30000, time_s: 8100 },
    ],
    [
      'custom 50 mi',
      { distance: 'custom', custom_distance: '50', custom_unit: 'mi', time: '9:00:00' },
      { distance_m: 50 * MILE_M, time_s: 32400 },
    ],
    ['comma decimal', { distance: 'custom', custom_distance: '12,5', time: '55:00' }, { distance_m: 12500, time_s: 3300 }],
  ])('%s', (_name, input, expected) => {
    expect(RaceResultFormSchema.parse(input)).toEqual(expected);
  });

  it.each<[string, Record<string, unknown>, Record<string, RegExp>]>([
    ['time not as h:mm:ss', { distance: '5k', time: '20 min' }, { time: /h:mm:ss/ }],
    ['custom without a distance', { distance: 'custom', time: '20:00' }, { custom_distance: /Enter the distance in km/ }],
    ['custom over 250 km', { distance: 'custom', custom_distance: '300', time: '60:00:00' }, { custom_distance: /250 km/ }],
    ['a marathon in 1:00', { distance: 'marathon', time: '1:00' }, { time: /faster than 1:00 per km/ }],
    ['a 5K in 0:00', { distance: '5k', time: '0:00' }, { time: /more than 0 seconds/ }],
    ['an unknown distance', { distance: 'ultra', time: '1:00:00' }, { distance: /Pick a distance/ }],
  ])('result form: %s', (_name, input, expected) => {
    const errors = errorsOf(RaceResultFormSchema.safeParse(input));
    expect(Object.keys(errors)).toEqual(Object.keys(expected));
    for (const [field, message] of Object.entries(expected)) expect(errors[field]).toMatch(message);
  });

  it('pace form: marathon 3:00:00 per km with a 2:00 negative split', () => {
    expect(PaceFormSchema.parse({ distance: 'marathon', time: '3:00:00', unit: 'km', negative_split: '2:00' })).toEqual({
      distance_m: MARATHON_M,
      time_s: 10800,
      unit: 'km',
      negative_split_s: 120,
    });
  });

  it('pace form: a blank negative split is even pacing', () => {
    expect(PaceFormSchema.parse({ distance: '10k', time: '45:00', unit: 'mi', negative_split: ' ' }).negative_split_s).toBe(0);
  });

  it.each<[string, Record<string, unknown>, Record<string, RegExp>]>([
    ['split not as m:ss', { distance: '10k', time: '45:00', unit: 'mi', negative_split: '90' }, { negative_split: /m:ss/ }],
    ['split over a tenth', { distance: '10k', time: '45:00', unit: 'mi', negative_split: '5:00' }, { negative_split: /a tenth/ }],
    ['no unit', { distance: '10k', time: '45:00' }, { unit: /mi or km/ }],
  ])('pace form: %s', (_name, input, expected) => {
    const errors = errorsOf(PaceFormSchema.safeParse(input));
    expect(Object.keys(errors)).toEqual(Object.keys(expected));
    for (const [field, message] of Object.entries(expected)) expect(errors[field]).toMatch(message);
  });
});

describe('describeDistance', () => {
  it.each<[number, string]>([
    [MARATHON_M, 'Marathon'],
    [HALF_MARATHON_M, 'Half marathon'],
    [MILE_M, 'Mile'],
    [5000, '5K'],
    [12500, '12.5 km'],
    [80467.2, '80.467 km'],
  ])('%s m → %s', (d, label) => {
    expect(describeDistance(d)).toBe(label);
  });
});
