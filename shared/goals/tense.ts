/**
 * Dates in the right tense: a goal race is still to come, a race result has been run. Both are calendar
 * dates (`YYYY-MM-DD`) compared with today in the runner's time zone, which the caller passes in (this
 * module reads no clock). Today itself is allowed for both: race morning, and the result typed that evening.
 */

export const GOAL_RACE_IN_THE_PAST =
  'A goal race is one still to come: pick today or a later date. A race you have already run goes under race results.';
export const RACE_RESULT_IN_THE_FUTURE =
  'A race result is a race already run: pick today or an earlier date. A race still to come can be your goal race.';

/** The sentence refusing a goal race dated before `today`, or null when the date is today or later. */
export function goalRaceTenseProblem(date: string, today: string): string | null {
  return date < today ? GOAL_RACE_IN_THE_PAST : null;
}

/** The sentence refusing a race result dated after `today`, or null when the date is today or earlier. */
export function raceResultTenseProblem(date: string, today: string): string | null {
  return date > today ? RACE_RESULT_IN_THE_FUTURE : null;
}
