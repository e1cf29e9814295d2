import { db, type Db } from '../../lib/db.ts';

/** Ids of the coaches of every squad the runner belongs to now. */
export async function findCoachIdsOfRunner(runnerId: string, trx: Db = db): Promise<string[]> {
  const rows = await trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .where('squad_members.runner_id', runnerId)
    .distinct('squads.coach_id');
  return rows.map((r) => r.coach_id).filter((id): id is string => typeof id === 'string');
}
