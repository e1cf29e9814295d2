import { db, type Db, type RunRow, type RunSplitRow, type SessionPlanRow, type SourceFileRow } from '../../lib/db.ts';

export interface RunCursor {
  startedAt: Date;
  id: string;
}

/** One page of a user's runs, oldest first, after `cursor` (keyset paging: steady cost on any page). */
export async function pageRunsOf(
  userId: string,
  cursor: RunCursor | null,
  limit: number,
  trx: Db = db,
): Promise<Array<RunRow & { original_name: string }>> {
  const query = trx('runs')
    .join('source_files', 'source_files.id', 'runs.source_file_id')
    .where('runs.user_id', userId)
    .select('runs.*', 'source_files.original_name');
  if (cursor) query.andWhereRaw('(runs.started_at, runs.id) > (?, ?)', [cursor.startedAt, cursor.id]);
  return (await query.orderBy([{ column: 'runs.started_at' }, { column: 'runs.id' }]).limit(limit)) as Array<
    RunRow & { original_name: string }
  >;
}

export async function findSplitsOfRuns(runIds: readonly string[], unit: 'mi' | 'km', trx: Db = db): Promise<RunSplitRow[]> {
  if (runIds.length === 0) return [];
  return trx('run_splits')
    .whereIn('run_id', runIds)
    .andWhere({ unit })
    .orderBy([{ column: 'run_id' }, { column: 'split_index' }]);
}

/** One page of a user's original files, by id. */
export async function pageSourceFilesOf(
  userId: string,
  afterId: string | null,
  limit: number,
  trx: Db = db,
): Promise<SourceFileRow[]> {
  const query = trx('source_files').where({ user_id: userId });
  if (afterId) query.andWhere('id', '>', afterId);
  return query.orderBy('id').limit(limit);
}

export async function listPlansOfRunner(runnerId: string, trx: Db = db): Promise<SessionPlanRow[]> {
  return trx('session_plans')
    .where({ runner_id: runnerId })
    .orderBy([{ column: 'date' }, { column: 'created_at' }]);
}

/** Notes on the user's runs (by anyone) and notes the user wrote on other runners' runs. */
export async function listRunNotesFor(userId: string, trx: Db = db) {
  return trx('run_notes')
    .join('runs', 'runs.id', 'run_notes.run_id')
    .join('users', 'users.id', 'run_notes.author_id')
    .where('runs.user_id', userId)
    .orWhere('run_notes.author_id', userId)
    .orderBy('run_notes.created_at')
    .select(
      'run_notes.id',
      'run_notes.run_id',
      'runs.local_date as run_date',
      'run_notes.author_id',
      'users.name as author_name',
      'run_notes.text',
      'run_notes.created_at',
    );
}

/** Week notes about the user's weeks and the ones the user wrote about others. */
export async function listWeekNotesFor(userId: string, trx: Db = db) {
  return trx('week_notes')
    .join('users', 'users.id', 'week_notes.author_id')
    .where('week_notes.runner_id', userId)
    .orWhere('week_notes.author_id', userId)
    .orderBy('week_notes.created_at')
    .select(
      'week_notes.id',
      'week_notes.runner_id',
      'week_notes.week_start',
      'week_notes.author_id',
      'users.name as author_name',
      'week_notes.text',
      'week_notes.created_at',
    );
}

/** Rows of a table another feature may or may not have created yet (fuel). */
export async function listRowsIfTableExists(
  table: string,
  column: string,
  userId: string,
  trx: Db = db,
): Promise<Record<string, unknown>[] | null> {
  if (!(await trx.schema.hasTable(table))) return null;
  return trx(table).where(column, userId).orderBy('created_at');
}

/** Per-run rows of a table that may not exist yet (fuel taken, check-ins), for the user's runs. */
export async function listRunRowsIfTableExists(
  table: string,
  userId: string,
  trx: Db = db,
): Promise<Record<string, unknown>[] | null> {
  if (!(await trx.schema.hasTable(table))) return null;
  return trx(table)
    .join('runs', 'runs.id', `${table}.run_id`)
    .where('runs.user_id', userId)
    .orderBy('runs.started_at')
    .select(`${table}.*`);
}
