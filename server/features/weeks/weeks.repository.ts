import { db, type Db, type NoteConcern, readDb } from '../../lib/db.ts';
import { RUN_LIST_COLUMNS, type RunListRow } from '../runs/index.ts';
import { bumpWeekInputs } from '../week-cache/index.ts';

/** The run's TRIMP stored at import (`details.trimp.trimp`), null without heart rate. */
const TRIMP = "(details->'trimp'->>'trimp')::float8 as trimp";

/** What the load, the trend and the week totals read of a run. */
export interface RunLoadRow {
  user_id: string;
  local_date: string;
  distance_m: number;
  trimp: number | null;
}

/** Several runners' runs between two local dates (inclusive), light rows, in the order they started. */
export async function listRunLoadsOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = readDb(),
): Promise<RunLoadRow[]> {
  if (runnerIds.length === 0) return [];
  return (
    trx('runs')
      .whereIn('user_id', runnerIds)
      .andWhere('local_date', '>=', from)
      .andWhere('local_date', '<=', to)
      // Rides and hikes stay out of running totals, loads and the week review (issue #14).
      .andWhere('activity_kind', 'run')
      .orderBy('started_at')
      .select<RunLoadRow[]>('user_id', 'local_date', 'distance_m', trx.raw(TRIMP))
  );
}

/** Several runners' runs between two local dates (inclusive) as list items, in the order they started. */
export async function listRunItemsOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = readDb(),
): Promise<Array<RunListRow & { user_id: string; trimp: number | null }>> {
  if (runnerIds.length === 0) return [];
  return (
    trx('runs')
      .whereIn('user_id', runnerIds)
      .andWhere('local_date', '>=', from)
      .andWhere('local_date', '<=', to)
      // Rides and hikes stay out of running totals, loads and the week review (issue #14).
      .andWhere('activity_kind', 'run')
      .orderBy('started_at')
      .select(...RUN_LIST_COLUMNS, 'user_id', trx.raw(TRIMP))
  );
}

/** Each runner's latest upload time (runners without runs are left out). */
export async function lastUploadsOf(runnerIds: readonly string[], trx: Db = readDb()): Promise<Map<string, Date>> {
  if (runnerIds.length === 0) return new Map();
  // One backward step on runs (user_id, created_at) per runner, rather than reading all their runs.
  const { rows } = await trx.raw<{ rows: Array<{ user_id: string; last: Date | null }> }>(
    'select r.id as user_id, (select max(created_at) from runs where runs.user_id = r.id) as last from unnest(?::uuid[]) as r(id)',
    [runnerIds as string[]],
  );
  return new Map(rows.flatMap((r) => (r.last ? [[r.user_id, r.last] as const] : [])));
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
