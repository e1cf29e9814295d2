import { db, type Db, readDb } from '../../lib/db.ts';

/** At most this many unread notes are listed in `GET /api/me/unread` (the count covers all of them). */
export const UNREAD_ITEMS_MAX = 100;

export interface UnreadNoteRow {
  kind: 'run-note' | 'week-note';
  id: string;
  run_id: string | null;
  week_start: string | null;
  runner_id: string;
  runner_time_zone: string;
  created_at: Date;
  author_name: string;
  excerpt: string;
}

/**
 * Notes `userId` has not opened, written by someone else about a runner whose data the user reads as
 * the runner or as a coach of one of the runner's squads now (admins read, but are not the other side).
 */
const UNREAD_SQL = `
  with runners as (
    select ?::uuid as id
    union
    select sm.runner_id from squad_members sm join squads s on s.id = sm.squad_id where s.coach_id = ?::uuid
  ), notes as (
    select 'run-note' as kind, n.id, n.run_id, null::date as week_start, r.user_id as runner_id, n.created_at, n.author_id, n.text
      from run_notes n join runs r on r.id = n.run_id
     where r.user_id in (select id from runners)
    union all
    select 'week-note', n.id, null, n.week_start, n.runner_id, n.created_at, n.author_id, n.text
      from week_notes n
     where n.runner_id in (select id from runners)
  )
  select kind, notes.id, run_id, to_char(week_start, 'YYYY-MM-DD') as week_start, runner_id, notes.created_at,
         u.name as author_name, left(notes.text, 140) as excerpt, ru.time_zone as runner_time_zone
    from notes join users u on u.id = notes.author_id join users ru on ru.id = notes.runner_id
   where author_id <> ?::uuid
     and not exists (select 1 from note_reads nr where nr.user_id = ?::uuid and nr.note_id = notes.id)`;

export async function listUnreadNotes(userId: string, limit = UNREAD_ITEMS_MAX, trx: Db = db) {
  const params = [userId, userId, userId, userId];
  const [{ rows }, { rows: counted }] = await Promise.all([
    trx.raw<{ rows: UnreadNoteRow[] }>(`${UNREAD_SQL} order by notes.created_at desc limit ?`, [...params, limit]),
    trx.raw<{ rows: Array<{ count: string }> }>(`select count(*) from (${UNREAD_SQL}) u`, params),
  ]);
  return { count: Number(counted[0]?.count ?? 0), items: rows };
}

/** Of `noteIds`, those `userId` has opened. */
export async function findReadNoteIds(userId: string, noteIds: readonly string[], trx: Db = readDb()): Promise<Set<string>> {
  if (noteIds.length === 0) return new Set();
  const rows = await trx('note_reads').where('user_id', userId).whereIn('note_id', noteIds).select('note_id');
  return new Set(rows.map((r) => r.note_id));
}

/** The note with `id` from either note table: whose data it is about and who wrote it. */
export async function findNoteById(id: string, trx: Db = db) {
  const run = await trx('run_notes')
    .join('runs', 'runs.id', 'run_notes.run_id')
    .where('run_notes.id', id)
    .first<{ id: string; author_id: string; runner_id: string } | undefined>(
      'run_notes.id',
      'run_notes.author_id',
      'runs.user_id as runner_id',
    );
  if (run) return run;
  return trx('week_notes')
    .where('id', id)
    .first<{ id: string; author_id: string; runner_id: string } | undefined>('id', 'author_id', 'runner_id');
}

export async function insertNoteReads(userId: string, noteIds: readonly string[], trx: Db = db): Promise<void> {
  if (noteIds.length === 0) return;
  await trx('note_reads')
    .insert(noteIds.map((note_id) => ({ note_id, user_id: userId })))
    .onConflict(['user_id', 'note_id'])
    .ignore();
}
