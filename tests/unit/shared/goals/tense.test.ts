import { describe, expect, it } from 'vitest';
import {
  GOAL_RACE_IN_THE_PAST,
  RACE_RESULT_IN_THE_FUTURE,
  goalRaceTenseProblem,
  raceResultTenseProblem,
} from '../../../../shared/goals/tense.ts';

describe('dates in the right tense', () => {
  const today = '2026-12-05';

  it.each([
    ['2020-06-14', GOAL_RACE_IN_THE_PAST],
    ['2026-12-04', GOAL_RACE_IN_THE_PAST],
    ['2026-12-05', null], // race morning
    ['2027-04-18', null],
  ])('a goal race on %s: %s', (date, expected) => {
    expect(goalRaceTenseProblem(date, today)).toBe(expected);
  });

  it.each([
    ['2030-06-14', RACE_RESULT_IN_THE_FUTURE],
    ['2026-12-06', RACE_RESULT_IN_THE_FUTURE],
    ['2026-12-05', null], // typed in the evening of the race
    ['2026-05-01', null],
  ])('a race result on %s: %s', (date, expected) => {
    expect(raceResultTenseProblem(date, today)).toBe(expected);
  });

  it('compares calendar dates across month and year ends', () => {
    expect(goalRaceTenseProblem('2026-12-31', '2027-01-01')).toBe(GOAL_RACE_IN_THE_PAST);
    expect(raceResultTenseProblem('2027-01-01', '2026-12-31')).toBe(RACE_RESULT_IN_THE_FUTURE);
  });
});
