// What other features read of goals: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { GoalRace, RaceResult } from '../../../shared/goals/schemas.ts';
import type { Db, GoalRaceRow, RaceResultRow } from '../../lib/db.ts';
import * as goals from './goals.repository.ts';

export function toGoalRace(row: GoalRaceRow): GoalRace {
  return {
    name: row.name,
    date: row.date,
    distance_m: row.distance_m,
    goal_time_s: row.goal_time_s,
    updated_at: row.updated_at.toISOString(),
  };
}

export function toRaceResult(row: RaceResultRow): RaceResult {
  return { id: row.id, name: row.name, date: row.date, distance_m: row.distance_m, time_s: row.time_s };
}

export function findGoalRace(userId: string, trx?: Db): Promise<GoalRaceRow | undefined> {
  return goals.findGoalRace(userId, trx);
}

/** The goal races of several runners at once; a replica may serve it. */
export function findGoalRacesOf(userIds: readonly string[], trx?: Db): Promise<GoalRaceRow[]> {
  return goals.findGoalRacesOf(userIds, trx);
}

export function listRaceResults(userId: string, trx?: Db): Promise<RaceResultRow[]> {
  return goals.listRaceResults(userId, trx);
}

/** The race results of several runners at once; a replica may serve it. */
export function listRaceResultsOf(userIds: readonly string[], trx?: Db): Promise<RaceResultRow[]> {
  return goals.listRaceResultsOf(userIds, trx);
}
