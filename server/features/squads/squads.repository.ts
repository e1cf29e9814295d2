import type { Role } from '../../../shared/users/schemas.ts';
import { db, type Db, type SquadRow, readDb } from '../../lib/db.ts';

/** Ids of the coaches of every squad the runner belongs to now. */
export async function findCoachIdsOfRunner(runnerId: string, trx: Db = readDb()): Promise<string[]> {
  const rows = await trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .where('squad_members.runner_id', runnerId)
    .distinct('squads.coach_id');
  return rows.map((r) => r.coach_id).filter((id): id is string => typeof id === 'string');
}

export async function insertSquad(coachId: string, name: string, trx: Db = db) {
  const [row] = await trx('squads').insert({ coach_id: coachId, name }).returning('*');
  return row!;
}

/** Every squad with its coach's role, time zone and digest switch: the weekly digests' round (primary: no lag). */
export async function listSquadsWithCoach(trx: Db = db) {
  return trx('squads')
    .join('users', 'users.id', 'squads.coach_id')
    .orderBy('squads.created_at')
    .select<Array<{ id: string; name: string; coach_id: string; role: Role; time_zone: string; notify_on_digest: boolean }>>(
      'squads.id',
      'squads.name',
      'users.id as coach_id',
      'users.role',
      'users.time_zone',
      'users.notify_on_digest',
    );
}

export async function findSquadById(id: string, trx: Db = readDb()) {
  return trx('squads').where({ id }).first();
}

/** Squads the user coaches or belongs to. */
export async function listSquadsOfUser(userId: string, trx: Db = db): Promise<SquadRow[]> {
  return trx('squads')
    .where('coach_id', userId)
    .orWhereIn('id', trx('squad_members').where('runner_id', userId).select('squad_id'))
    .orderBy('created_at');
}

export async function listMembers(squadId: string, trx: Db = readDb()) {
  return trx('squad_members')
    .join('users', 'users.id', 'squad_members.runner_id')
    .where('squad_members.squad_id', squadId)
    .orderBy('users.name')
    .select<Array<{ id: string; name: string; email: string; joined_at: Date }>>(
      'users.id',
      'users.name',
      'users.email',
      'squad_members.joined_at',
    );
}

export async function isMember(squadId: string, runnerId: string, trx: Db = db): Promise<boolean> {
  return Boolean(await trx('squad_members').where({ squad_id: squadId, runner_id: runnerId }).first());
}

export async function addMember(squadId: string, runnerId: string, trx: Db = db): Promise<void> {
  await trx('squad_members').insert({ squad_id: squadId, runner_id: runnerId }).onConflict(['squad_id', 'runner_id']).ignore();
}

export async function removeMember(squadId: string, runnerId: string, trx: Db = db): Promise<boolean> {
  return (await trx('squad_members').where({ squad_id: squadId, runner_id: runnerId }).delete()) > 0;
}

/** The coaches who can read a runner's data now, with the squad that gives them access. */
export async function listCoachesOfRunner(runnerId: string, trx: Db = db) {
  return trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .join('users', 'users.id', 'squads.coach_id')
    .where('squad_members.runner_id', runnerId)
    .select<Array<{ squad_id: string; squad_name: string; coach_id: string; coach_name: string; coach_email: string }>>(
      'squads.id as squad_id',
      'squads.name as squad_name',
      'users.id as coach_id',
      'users.name as coach_name',
      'users.email as coach_email',
    );
}
