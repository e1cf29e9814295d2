import { db, type Db, type RunRow } from '../../lib/db.ts';

export async function listRunsBetween(runnerId: string, from: string, to: string, trx: Db = db): Promise<RunRow[]> {
  return trx('runs')
    .where({ user_id: runnerId })
    .andWhere('local_date', '>=', from)
    .andWhere('local_date', '<=', to)
    .orderBy('started_at');
}

export async function lastUploadOf(runnerId: string, trx: Db = db): Promise<Date | null> {
  const row = await trx('runs').where({ user_id: runnerId }).max({ last: 'created_at' }).first();
  return (row?.last as Date | null) ?? null;
}

export async function weeklyDistances(runnerId: string, from: string, to: string, trx: Db = db) {
  return trx('runs')
    .where({ user_id: runnerId })
    .andWhere('local_date', '>=', from)
    .andWhere('local_date', '<=', to)
    .select<Array<{ local_date: string; distance_m: number }>>('local_date', 'distance_m');
}

export async function listWeekNotes(runnerId: string, weekStart: string, trx: Db = db) {
  return trx('week_notes')
    .join('users', 'users.id', 'week_notes.author_id')
    .where('week_notes.runner_id', runnerId)
    .andWhere('week_notes.week_start', weekStart)
    .orderBy('week_notes.created_at')
    .select<Array<{ id: string; text: string; created_at: Date; author_id: string; author_name: string; author_role: string }>>(
      'week_notes.id',
      'week_notes.text',
      'week_notes.created_at',
      'week_notes.author_id',
      'users.name as author_name',
      'users.role as author_role',
    );
}

export async function insertWeekNote(runnerId: string, weekStart: string, authorId: string, text: string, trx: Db = db) {
  const [row] = await trx('week_notes')
    .insert({ runner_id: runnerId, week_start: weekStart, author_id: authorId, text })
    .returning('id');
  return (row as { id: string }).id;
}

export async function findWeekReviews(runnerId: string, weekStart: string, trx: Db = db) {
  return trx('week_reviews')
    .join('users', 'users.id', 'week_reviews.coach_id')
    .where('week_reviews.runner_id', runnerId)
    .andWhere('week_reviews.week_start', weekStart)
    .select<Array<{ coach_id: string; coach_name: string; reviewed_at: Date }>>(
      'week_reviews.coach_id',
      'users.name as coach_name',
      'week_reviews.reviewed_at',
    );
}

export async function upsertWeekReview(runnerId: string, weekStart: string, coachId: string, trx: Db = db): Promise<void> {
  await trx('week_reviews')
    .insert({ runner_id: runnerId, week_start: weekStart, coach_id: coachId })
    .onConflict(['runner_id', 'week_start', 'coach_id'])
    .merge();
}

export async function deleteWeekReview(runnerId: string, weekStart: string, coachId: string, trx: Db = db): Promise<void> {
  await trx('week_reviews').where({ runner_id: runnerId, week_start: weekStart, coach_id: coachId }).delete();
}
