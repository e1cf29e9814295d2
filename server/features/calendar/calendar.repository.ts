import { db, type Db } from '../../lib/db.ts';

export async function replaceCalendarFeed(userId: string, tokenHash: string, trx: Db = db): Promise<void> {
  await trx('calendar_feeds')
    .insert({ user_id: userId, token_hash: tokenHash, created_at: new Date() })
    .onConflict('user_id')
    .merge();
}

export async function deleteCalendarFeed(userId: string, trx: Db = db): Promise<void> {
  await trx('calendar_feeds').where({ user_id: userId }).delete();
}

/** When the user's current feed address was made, or undefined when the feed is off. */
export async function findCalendarFeedCreatedAt(userId: string, trx: Db = db): Promise<Date | undefined> {
  const row = await trx('calendar_feeds').where({ user_id: userId }).first<{ created_at: Date } | undefined>('created_at');
  return row?.created_at;
}

export async function findFeedOwner(tokenHash: string, trx: Db = db) {
  return trx('calendar_feeds')
    .join('users', 'users.id', 'calendar_feeds.user_id')
    .where('calendar_feeds.token_hash', tokenHash)
    .first<{ id: string; name: string; role: string; unit: 'mi' | 'km' } | undefined>(
      'users.id',
      'users.name',
      'users.role',
      'users.unit',
    );
}

/** The runners of every squad the coach leads now. */
export async function findSquadRunnerIds(coachId: string, trx: Db = db): Promise<string[]> {
  const rows = await trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .where('squads.coach_id', coachId)
    .distinct<{ runner_id: string }[]>('squad_members.runner_id');
  return rows.map((r) => r.runner_id);
}

/** Plans of these runners between two dates, with the runner's name and how many fuel intakes each plan's fuel plan has. */
export async function listFeedPlans(runnerIds: readonly string[], from: string, to: string, trx: Db = db) {
  if (runnerIds.length === 0) return [];
  return trx('session_plans')
    .join('users', 'users.id', 'session_plans.runner_id')
    .leftJoin('fuel_plans', 'fuel_plans.plan_id', 'session_plans.id')
    .whereIn('session_plans.runner_id', runnerIds)
    .andWhere('session_plans.date', '>=', from)
    .andWhere('session_plans.date', '<=', to)
    .orderBy([{ column: 'session_plans.date' }, { column: 'session_plans.id' }])
    .limit(5000)
    .select<
      Array<{
        id: string;
        runner_id: string;
        runner_name: string;
        date: string;
        title: string;
        notes: string;
        items: unknown;
        sequence: number;
        created_at: Date;
        updated_at: Date;
        fuel_schedule: unknown;
      }>
    >(
      'session_plans.id',
      'session_plans.runner_id',
      'users.name as runner_name',
      'session_plans.date',
      'session_plans.title',
      'session_plans.notes',
      'session_plans.items',
      'session_plans.sequence',
      'session_plans.created_at',
      'session_plans.updated_at',
      'fuel_plans.schedule as fuel_schedule',
    );
}
