import { db, type Db, type NoteConcern, preparedStatement, readDb, type UserRow } from '../../lib/db.ts';
import { bumpWeekInputs } from '../week-cache/index.ts';

const weekRunner = preparedStatement<UserRow & { coach_ids: string[]; inputs_counter: string; read_note_ids: string[] }>(
  'week-runner',
  `select u.*, coalesce(c.counter, 0)::text as inputs_counter,
          array(select distinct s.coach_id from squad_members m join squads s on s.id = m.squad_id
                where m.runner_id = u.id and s.coach_id is not null) as coach_ids,
          array(select r.note_id::text from note_reads r
                where r.user_id = ?::uuid and r.note_id = any(?::uuid[])) as read_note_ids
   from users u left join week_input_counters c on c.runner_id = u.id
   where u.id = ?`,
);

const squadRunners = preparedStatement<UserRow & { inputs_counter: string }>(
  'squad-runners',
  `select u.*, coalesce(c.counter, 0)::text as inputs_counter
   from squad_members m join users u on u.id = m.runner_id
   left join week_input_counters c on c.runner_id = u.id
   where m.squad_id = ?
   order by u.name, u.id`,
);

/**
 * A runner's row, the coaches of their squads now (the access rule's input), their input counter
 * (`week_input_counters`, read before any of the week's data) and which of `noteIds` the reader has opened (the
 * read markers of a kept week review), in one prepared query; undefined when there is no such user.
 */
export async function findWeekRunner(
  runnerId: string,
  reader: { id: string; noteIds: readonly string[] },
  trx: Db = readDb(),
): Promise<{ runner: UserRow; coachIds: string[]; counter: string; readNoteIds: string[] } | undefined> {
  // A Postgres array literal of ids (uuids: no quoting needed), so the statement's text never changes.
  const [row] = await weekRunner([reader.id, `{${reader.noteIds.join(',')}}`, runnerId], trx);
  if (!row) return undefined;
  const { coach_ids: coachIds, inputs_counter: counter, read_note_ids: readNoteIds, ...runner } = row;
  return { runner, coachIds, counter, readNoteIds };
}

/**
 * A squad's runners (full rows, by name) with their input counters, in one prepared query: the squad overview
 * reads them before any of the weeks' data. Who may read the squad is checked before (squadCoachedBy).
 */
export async function listSquadRunners(
  squadId: string,
  trx: Db = readDb(),
): Promise<Array<{ runner: UserRow; counter: string }>> {
  const rows = await squadRunners([squadId], trx);
  return rows.map(({ inputs_counter: counter, ...runner }) => ({ runner, counter }));
}

/** Reviews of several runners' weeks (each runner's own week start is among `weekStarts`). */
export async function findWeekReviewsOf(runnerIds: readonly string[], weekStarts: readonly string[], trx: Db = readDb()) {
  if (runnerIds.length === 0) return [];
  return trx('week_reviews')
    .join('users', 'users.id', 'week_reviews.coach_id')
    .whereIn('week_reviews.runner_id', runnerIds)
    .whereIn('week_reviews.week_start', [...new Set(weekStarts)])
    .select<Array<{ runner_id: string; week_start: string; coach_id: string; coach_name: string; reviewed_at: Date }>>(
      'week_reviews.runner_id',
      'week_reviews.week_start',
      'week_reviews.coach_id',
      'users.name as coach_name',
      'week_reviews.reviewed_at',
    )
    .orderBy('week_reviews.reviewed_at');
}

export async function listWeekNotes(runnerId: string, weekStart: string, trx: Db = readDb()) {
  return trx('week_notes')
    .join('users', 'users.id', 'week_notes.author_id')
    .where('week_notes.runner_id', runnerId)
    .andWhere('week_notes.week_start', weekStart)
    .orderBy('week_notes.created_at')
    .select<
      Array<{
        id: string;
        text: string;
        created_at: Date;
        concern: NoteConcern | null;
        author_id: string;
        author_name: string;
        author_role: string;
      }>
    >(
      'week_notes.id',
      'week_notes.text',
      'week_notes.concern',
      'week_notes.created_at',
      'week_notes.author_id',
      'users.name as author_name',
      'users.role as author_role',
    );
}

export async function insertWeekNote(
  runnerId: string,
  weekStart: string,
  authorId: string,
  text: string,
  concern: NoteConcern | null = null,
  trx: Db = db,
) {
  const [row] = await trx('week_notes')
    .insert({ runner_id: runnerId, week_start: weekStart, author_id: authorId, text, concern })
    .returning('id');
  await bumpWeekInputs([runnerId], trx);
  return (row as { id: string }).id;
}

export async function upsertWeekReview(runnerId: string, weekStart: string, coachId: string, trx: Db = db): Promise<void> {
  await trx('week_reviews')
    .insert({ runner_id: runnerId, week_start: weekStart, coach_id: coachId })
    .onConflict(['runner_id', 'week_start', 'coach_id'])
    .merge();
  await bumpWeekInputs([runnerId], trx);
}

export async function deleteWeekReview(runnerId: string, weekStart: string, coachId: string, trx: Db = db): Promise<void> {
  await trx('week_reviews').where({ runner_id: runnerId, week_start: weekStart, coach_id: coachId }).delete();
  await bumpWeekInputs([runnerId], trx);
}
