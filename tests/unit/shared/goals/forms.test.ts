import { describe, expect, it } from 'vitest';
import { toFieldErrors, toFieldIssues } from '../../../../shared/api/field-issues.ts';
import {
  distanceChoiceFor,
  formatRaceTime,
  goalRaceFormFor,
  GoalRaceFormSchema,
  raceResultFormFor,
  RaceResultFormSchema,
} from '../../../../shared/goals/forms.ts';
import { GOAL_RACE_IN_THE_PAST, RACE_RESULT_IN_THE_FUTURE } from '../../../../shared/goals/tense.ts';

const errorsOf = (result: { success: boolean; error?: unknown }) =>
  result.success ? {} : toFieldErrors(toFieldIssues(result.error as Parameters<typeof toFieldIssues>[0]));

describe('GoalRaceFormSchema', () => {
  it('turns a listed distance and h:mm:ss into metres and seconds', () => {
    expect(
      GoalRaceFormSchema.parse({
        name: ' Lakeside Marathon ',
        date: '2026-10-18',
        distance_m: 'marathon',
        goal_time_s: '3:05:00',
      }),
    ).toEqual({ name: 'Lakeside Marathon', date: '2026-10-18', distance_m: 42195, goal_time_s: 11100 });
    expect(
      GoalRaceFormSchema.parse({ name: 'H', date: '2026-10-18', distance_m: 'half', goal_time_s: '1:25:00' }).distance_m,
    ).toBe(21097.5);
  });

  it('takes a custom distance in metres', () => {
    expect(
      GoalRaceFormSchema.parse({
        name: '30 km',
        date: '2026-10-18',
        distance_m: 'custom',
        custom_distance_m: '30000',
        goal_time_s: '2:10:00',
      }).distance_m,
    ).toBe(30000);
  });

  it('puts each problem beside its field', () => {
    expect(
      errorsOf(
        GoalRaceFormSchema.safeParse({ name: '', date: '', distance_m: 'custom', custom_distance_m: 'far', goal_time_s: '3:5' }),
      ),
    ).toEqual({
      name: 'Name the race.',
      date: 'Use a date like 2026-10-18.',
      custom_distance_m: 'Enter the distance in metres, e.g. 30000.',
      goal_time_s: 'Enter the time as h:mm:ss, e.g. 3:05:00, or m:ss, e.g. 19:56.',
    });
    expect(
      errorsOf(
        GoalRaceFormSchema.safeParse({
          name: 'x',
          date: '2026-10-18',
          distance_m: 'custom',
          custom_distance_m: '100',
          goal_time_s: '1:00:00',
        }),
      ),
    ).toEqual({ custom_distance_m: 'Races start at 400 m.' });
    expect(
      errorsOf(GoalRaceFormSchema.safeParse({ name: 'x', date: '10000-01-01', distance_m: '5k', goal_time_s: '20:00' })),
    ).toEqual({
      date: 'Use a date like 2026-10-18.',
    });
  });

  it('refuses a goal faster than any human, but not because of a field it already refused', () => {
    expect(
      errorsOf(GoalRaceFormSchema.safeParse({ name: 'x', date: '2026-10-18', distance_m: '5k', goal_time_s: '5:00' })),
    ).toEqual({
      goal_time_s: 'That goal is faster than any human has run.',
    });
    expect(
      errorsOf(
        GoalRaceFormSchema.safeParse({
          name: 'x',
          date: '2026-10-18',
          distance_m: 'custom',
          custom_distance_m: '',
          goal_time_s: '1:00',
        }),
      ),
    ).toEqual({ custom_distance_m: 'Enter the distance in metres, e.g. 30000.' });
  });
});

describe('RaceResultFormSchema', () => {
  it('leaves out a blank name', () => {
    expect(RaceResultFormSchema.parse({ name: '  ', date: '2026-09-01', distance_m: '10k', time_s: '39:30' })).toEqual({
      date: '2026-09-01',
      distance_m: 10000,
      time_s: 2370,
    });
  });
  it('asks for a time', () => {
    expect(errorsOf(RaceResultFormSchema.safeParse({ date: '2026-09-01', distance_m: '10k' }))).toEqual({
      time_s: 'Enter the time as h:mm:ss, e.g. 3:05:00, or m:ss, e.g. 19:56.',
    });
  });
});

describe('distanceChoiceFor / formatRaceTime', () => {
  it.each<[number, string]>([
    [5000, '5k'],
    [21097.5, 'half'],
    [42195, 'marathon'],
    [30000, 'custom'],
  ])('%d m → %s', (metres, id) => {
    expect(distanceChoiceFor(metres)).toBe(id);
  });
  it.each<[number, string]>([
    [11100, '3:05:00'],
    [1196, '0:19:56'],
    [5099.6, '1:25:00'],
  ])('%d s → %s', (seconds, text) => {
    expect(formatRaceTime(seconds)).toBe(text);
  });
});

describe('the race forms with today (issue 17: dates in the right tense)', () => {
  const fields = { name: 'Lakeside Marathon', distance_m: 'marathon', goal_time_s: '3:05:00', time_s: '3:05:00' };

  it('refuses a goal race before today at the date field, and takes today', () => {
    const past = goalRaceFormFor('2026-12-05').safeParse({ ...fields, date: '2020-06-14' });
    expect(past.success).toBe(false);
    expect(past.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['date', GOAL_RACE_IN_THE_PAST]]);
    expect(goalRaceFormFor('2026-12-05').safeParse({ ...fields, date: '2026-12-05' }).success).toBe(true);
  });

  it('refuses a race result after today at the date field, and takes today', () => {
    const future = raceResultFormFor('2026-12-05').safeParse({ ...fields, date: '2030-06-14' });
    expect(future.success).toBe(false);
    expect(future.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['date', RACE_RESULT_IN_THE_FUTURE]]);
    expect(raceResultFormFor('2026-12-05').safeParse({ ...fields, date: '2026-12-05' }).success).toBe(true);
  });
});
