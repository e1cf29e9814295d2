import { db, preparedStatement, type Db, type SessionRow, type UserRow } from '../../lib/db.ts';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function insertSession(userId: string, expiresAt: Date, trx: Db = db): Promise<SessionRow> {
  const [row] = await trx('sessions').insert({ user_id: userId, expires_at: expiresAt }).returning('*');
  return row as SessionRow;
}

/**
 * The user of a live session, in the one query a request costs anyway (the user row is read on
 * every request so role changes and deletions apply at once; the join adds the session check).
 */
export async function findSessionUser(sessionId: string, userId: string, now: Date, trx: Db = db): Promise<UserRow | undefined> {
  return (await findSessionCaller(sessionId, userId, now, trx))?.user;
}

/** Every cookie request sends it, named (prepared): planning it cost more than running it. */
const sessionCaller = preparedStatement<UserRow & { inputs_counter: string }>(
  'authenticate-session',
  `select users.*, coalesce(week_input_counters.counter, 0)::text as inputs_counter
   from sessions join users on users.id = sessions.user_id
   left join week_input_counters on week_input_counters.runner_id = users.id
   where sessions.id = ? and sessions.user_id = ? and sessions.expires_at > ?
   limit 1`,
);

/**
 * The user of a live session and their input counter (`week_input_counters`, 0 before their first counted
 * write), in the one query every cookie request makes (ready answers check the counter, server/features/week-cache).
 */
export async function findSessionCaller(
  sessionId: string,
  userId: string,
  now: Date,
  trx: Db = db,
): Promise<{ user: UserRow; inputsCounter: string } | undefined> {
  if (!UUID.test(sessionId) || !UUID.test(userId)) return undefined;
  const [row] = await sessionCaller([sessionId, userId, now], trx);
  if (!row) return undefined;
  const { inputs_counter: inputsCounter, ...user } = row;
  return { user, inputsCounter };
}

export async function deleteSession(sessionId: string, trx: Db = db): Promise<void> {
  if (!UUID.test(sessionId)) return;
  await trx('sessions').where({ id: sessionId }).delete();
}

/** Ends every session of the user, except `keepId` when given (the one asking, after a password change). */
export async function deleteSessionsOf(userId: string, keepId: string | null = null, trx: Db = db): Promise<number> {
  const query = trx('sessions').where({ user_id: userId });
  if (keepId) query.whereNot({ id: keepId });
  return query.delete();
}

/** Drops the user's expired sessions and all but the newest `keep` live ones. */
export async function pruneSessionsOf(userId: string, keep: number, now: Date, trx: Db = db): Promise<void> {
  await trx('sessions').where({ user_id: userId }).andWhere('expires_at', '<=', now).delete();
  await trx('sessions')
    .where({ user_id: userId })
    .whereNotIn('id', trx('sessions').select('id').where({ user_id: userId }).orderBy('created_at', 'desc').limit(keep))
    .delete();
}
