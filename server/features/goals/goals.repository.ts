import { db, type Db, type GoalRaceRow, type RaceResultRow, readDb } from '../../lib/db.ts';
import { bumpWeekInputs } from '../week-cache/index.ts';
import type { GoalRaceInput, RaceResultInput } from '../../../shared/goals/schemas.ts';

export async function findGoalRace(userId: string, trx: Db = db): Promise<GoalRaceRow | undefined> {
  return trx('goal_races').where({ user_id: userId }).first();
}

export async function findGoalRacesOf(userIds: readonly string[], trx: Db = readDb()): Promise<GoalRaceRow[]> {
  if (userIds.length === 0) return [];
  return trx('goal_races').whereIn('user_id', userIds);
}

export async function upsertGoalRace(userId: string, goal: GoalRaceInput, trx: Db = db): Promise<GoalRaceRow> {
  const [row] = await trx('goal_races')
    .insert({ user_id: userId, ...goal, updated_at: new Date() })
    .onConflict('user_id')
    .merge()
    .returning('*');
  await bumpWeekInputs([userId], trx);
  return row as GoalRaceRow;
}

export async function deleteGoalRace(userId: string, trx: Db = db): Promise<boolean> {
  const deleted = (await trx('goal_races').where({ user_id: userId }).delete()) > 0;
  if (deleted) await bumpWeekInputs([userId], trx);
  return deleted;
}

export async function listRaceResults(userId: string, trx: Db = db): Promise<RaceResultRow[]> {
  return trx('race_results').where({ user_id: userId }).orderBy('date', 'desc');
}

/** Race results of several runners, newest first (as `listRaceResults` gives one runner's). */
export async function listRaceResultsOf(userIds: readonly string[], trx: Db = readDb()): Promise<RaceResultRow[]> {
  if (userIds.length === 0) return [];
  return trx('race_results').whereIn('user_id', userIds).orderBy('date', 'desc');
}

export async function insertRaceResult(userId: string, result: RaceResultInput, trx: Db = db): Promise<RaceResultRow> {
  const [row] = await trx('race_results')
    .insert({
      user_id: userId,
      name: result.name ?? null,
      date: result.date,
      distance_m: result.distance_m,
      time_s: result.time_s,
    })
    .returning('*');
  await bumpWeekInputs([userId], trx);
  return row as RaceResultRow;
}

export async function deleteRaceResult(userId: string, id: string, trx: Db = db): Promise<boolean> {
  const deleted = (await trx('race_results').where({ user_id: userId, id }).delete()) > 0;
  if (deleted) await bumpWeekInputs([userId], trx);
  return deleted;
}
