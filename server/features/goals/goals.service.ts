import type { GoalRaceInput, RaceResultInput } from '../../../shared/goals/schemas.ts';
import { goalRaceTenseProblem, raceResultTenseProblem } from '../../../shared/goals/tense.ts';
import { todayIn } from '../../../shared/runs/local-time.ts';
import { ValidationError } from '../../lib/errors.ts';
import { insertRaceResult, upsertGoalRace } from './goals.repository.ts';

type Runner = { id: string; time_zone: string };

function refuseDate(problem: string | null): void {
  if (problem) throw new ValidationError(problem, [{ field: 'date', message: problem }]);
}

/** Sets the runner's goal race; a date already past in their time zone is refused in words. */
export async function setGoalRace(runner: Runner, input: GoalRaceInput, now = new Date()) {
  refuseDate(goalRaceTenseProblem(input.date, todayIn(runner.time_zone, now.getTime())));
  return upsertGoalRace(runner.id, input);
}

/** Adds a race result; a date still to come in the runner's time zone is refused in words. */
export async function addRaceResult(runner: Runner, input: RaceResultInput, now = new Date()) {
  refuseDate(raceResultTenseProblem(input.date, todayIn(runner.time_zone, now.getTime())));
  return insertRaceResult(runner.id, input);
}
