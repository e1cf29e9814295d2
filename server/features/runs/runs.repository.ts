import {
  db,
  type Db,
  type RunFastestSectionRow,
  type RunLapRow,
  type RunRow,
  type RunSplitRow,
  type RunTrackRow,
  type SourceFileRow,
  readDb,
} from '../../lib/db.ts';
import { bumpWeekInputs } from '../week-cache/index.ts';
import type { Knex } from 'knex';
import { insertRowsByColumns } from '../../lib/insert-by-columns.ts';
import type { ListRunsQuery, RunListOrder, RunListSort } from '../../../shared/runs/schemas.ts';

import { RUN_LIST_COLUMNS, type RunListRow } from './run-list.ts';

export async function findSourceFileBySha(userId: string, sha256: string, trx: Db = db): Promise<SourceFileRow | undefined> {
  return trx('source_files').where({ user_id: userId, sha256 }).first();
}

export async function findFirstRunOfSourceFile(sourceFileId: string, trx: Db = db): Promise<RunRow | undefined> {
  return trx('runs').where({ source_file_id: sourceFileId }).orderBy('activity_index').first();
}

/** The activity indexes of a stored file that have a run. */
export async function findActivityIndexesOfSourceFile(sourceFileId: string, trx: Db = db): Promise<number[]> {
  const rows: Array<{ activity_index: number }> = await trx('runs')
    .where({ source_file_id: sourceFileId })
    .select('activity_index');
  return rows.map((r) => r.activity_index);
}

/**
 * Serialises one runner's imports from the same-run check to the commit (a transaction-scoped
 * advisory lock keyed by the user id, released at commit or rollback): another upload of the same run
 * waits here and then sees this one's run. Taken before the storage lock (`lockStorageOf`), always in
 * that order.
 */
export async function lockRunsOf(userId: string, trx: Knex.Transaction): Promise<void> {
  await trx.raw("select pg_advisory_xact_lock(hashtextextended('pacewright-runs:' || ?, 0))", [userId]);
}

/** The runner's runs starting within `windowMs` of `startT` (ms): the candidates for the same run twice. */
export async function findRunsStartingNear(
  userId: string,
  startT: number,
  windowMs: number,
  trx: Db = db,
): Promise<Array<Pick<RunRow, 'id' | 'started_at' | 'distance_m'>>> {
  return trx('runs')
    .where({ user_id: userId })
    .whereBetween('started_at', [new Date(startT - windowMs), new Date(startT + windowMs)])
    .select('id', 'started_at', 'distance_m');
}

export async function insertSourceFile(row: Omit<SourceFileRow, 'id' | 'created_at'>, trx: Db): Promise<SourceFileRow> {
  const [inserted] = await trx('source_files').insert(row).returning('*');
  return inserted as SourceFileRow;
}

export interface RunChildren {
  /** The blob may still be being compressed: it is awaited for the run's last statement. */
  /** No layout: plain columns (the column's default). */
  track: { columns: string[]; point_count: number; data_layout?: RunTrackRow['data_layout']; data: Buffer | Promise<Buffer> };
  splits: Omit<RunSplitRow, 'run_id'>[];
  laps: Omit<RunLapRow, 'run_id'>[];
  fastest: Omit<RunFastestSectionRow, 'run_id'>[];
}

/**
 * Inserts a run with all its parts; call inside a transaction so a run is stored whole or not at all.
 * `mark` is told when each statement has answered (runs.service.ts logs the steps).
 */
export async function insertRunWhole(
  run: Omit<RunRow, 'id' | 'created_at'>,
  children: RunChildren,
  trx: Db,
  mark: (step: string) => void = () => undefined,
): Promise<RunRow> {
  const row = await insertRunRows(run, children, trx, mark);
  // Last: the track's blob is compressed meanwhile (runs.service.ts starts it when the compute thread answers).
  await insertRunTrack(row.id, children.track, trx, mark);
  return row;
}

/**
 * A run's row (with the id given, else a new one), the week inputs it feeds, and its splits, laps and fastest
 * sections; not its track (insertRunTrack). Inside the transaction that stores the track too.
 */
export async function insertRunRows(
  run: Omit<RunRow, 'id' | 'created_at'> & { id?: string },
  children: Omit<RunChildren, 'track'>,
  trx: Db,
  mark: (step: string) => void = () => undefined,
): Promise<RunRow> {
  const [row] = await trx('runs').insert(run).returning('*');
  const runId = (row as RunRow).id;
  mark('run row');
  // Feeds the runner's assembled weeks (server/features/week-cache).
  await bumpWeekInputs([run.user_id], trx);
  mark('week inputs bumped');
  // One statement, one round trip for all three: each table's rows go as one array per column, so a long
  // track's splits never pass PostgreSQL's 65 535 parameters per statement (lib/insert-by-columns.ts).
  await insertRowsByColumns(trx, [
    { table: 'run_splits', rows: children.splits.map((s) => ({ run_id: runId, ...s })) },
    { table: 'run_laps', rows: children.laps.map((l) => ({ run_id: runId, ...l })) },
    { table: 'run_fastest_sections', rows: children.fastest.map((f) => ({ run_id: runId, ...f })) },
  ]);
  mark('splits, laps, fastest sections');
  return row as RunRow;
}

/**
 * A run's track row, once its blob is compressed. It may go in before the run's own row, in the same transaction:
 * run_tracks' reference to runs is checked at commit (DEFERRABLE INITIALLY DEFERRED, migration
 * 20261206000200), so a track is stored while its run is still being analysed (runs.service.ts).
 */
export async function insertRunTrack(
  runId: string,
  track: RunChildren['track'],
  trx: Db,
  mark: (step: string) => void = () => undefined,
): Promise<void> {
  const blob = await track.data;
  mark('gzip awaited');
  await trx('run_tracks').insert({ run_id: runId, ...track, data: blob });
  mark('track row');
}

export async function findRunById(id: string, trx: Db = readDb()): Promise<RunRow | undefined> {
  return trx('runs').where({ id }).first();
}

export async function findRunParts(runId: string, trx: Db = db) {
  const [splits, laps, fastest] = await Promise.all([
    trx('run_splits').where({ run_id: runId }).orderBy(['unit', 'split_index']),
    trx('run_laps').where({ run_id: runId }).orderBy('lap_index'),
    trx('run_fastest_sections').where({ run_id: runId }).orderBy('distance_m'),
  ]);
  return { splits, laps, fastest };
}

/** Dates arrive from `json_agg` as ISO text; non-finite numbers as the strings "NaN" and "±Infinity". */
function fromJsonRow<T>(row: Record<string, unknown>, dates: readonly string[], texts: readonly string[]): T {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) {
    if (typeof value !== 'string' || texts.includes(key)) out[key] = value;
    else out[key] = dates.includes(key) ? new Date(value) : Number(value);
  }
  return out as T;
}

/**
 * A run with its splits, device laps and fastest sections, read in one round trip (the run page), in
 * the orders `findRunParts` gives.
 */
export async function findRunWithParts(id: string, trx: Db = readDb()) {
  const row = (await trx('runs')
    .where({ id })
    .first(
      'runs.*',
      trx.raw(
        "(select coalesce(json_agg(s order by s.unit, s.split_index), '[]') from run_splits s where s.run_id = runs.id) as parts_splits",
      ),
      trx.raw("(select coalesce(json_agg(l order by l.lap_index), '[]') from run_laps l where l.run_id = runs.id) as parts_laps"),
      trx.raw(
        "(select coalesce(json_agg(f order by f.distance_m), '[]') from run_fastest_sections f where f.run_id = runs.id) as parts_fastest",
      ),
      trx.raw('(select u.time_zone from users u where u.id = runs.user_id) as owner_time_zone'),
    )) as
    | (RunRow & {
        owner_time_zone: string;
        parts_splits: Array<Record<string, unknown>>;
        parts_laps: Array<Record<string, unknown>>;
        parts_fastest: Array<Record<string, unknown>>;
      })
    | undefined;
  if (!row) return undefined;
  const { parts_splits: splits, parts_laps: laps, parts_fastest: fastest, owner_time_zone: ownerTimeZone, ...run } = row;
  return {
    run: run as RunRow,
    ownerTimeZone,
    parts: {
      splits: splits.map((r) => fromJsonRow<RunSplitRow>(r, ['start_at', 'end_at'], ['run_id', 'unit'])),
      laps: laps.map((r) => fromJsonRow<RunLapRow>(r, ['start_at'], ['run_id'])),
      fastest: fastest.map((r) => fromJsonRow<RunFastestSectionRow>(r, ['start_at', 'end_at'], ['run_id'])),
    },
  };
}

export async function findSplits(runId: string, unit: 'mi' | 'km', trx: Db = db): Promise<RunSplitRow[]> {
  return trx('run_splits').where({ run_id: runId, unit }).orderBy('split_index');
}

/** A run's device laps, in order. */
export async function findRunLaps(runId: string, trx: Db = db): Promise<RunLapRow[]> {
  return trx('run_laps').where({ run_id: runId }).orderBy('lap_index');
}

export async function findRunTrack(runId: string, trx: Db = readDb()) {
  return trx('run_tracks').where({ run_id: runId }).first();
}

export async function findSourceFileById(id: string, trx: Db = db): Promise<SourceFileRow | undefined> {
  return trx('source_files').where({ id }).first();
}

/**
 * The SQL each list sort orders by (fixed strings, never user input). Pace is null when it has no
 * meaning (no distance or no moving time), like `pace_s_per_km`; those runs come last either way.
 */
const RUN_LIST_ORDER_BY: Record<RunListSort, string> = {
  date: 'started_at',
  distance: 'distance_m',
  duration: 'moving_s',
  pace: 'case when distance_m > 0 and moving_s > 0 then moving_s / distance_m end',
};

/**
 * `id` breaks ties so that every run has one place in the order and paging never repeats or skips one.
 * Only pace can be null; the other columns get no `nulls last`, which keeps the date order able to
 * read the (user_id, started_at) index backwards.
 */
function runListOrderBy(sort: RunListSort, order: RunListOrder): string {
  const direction = order === 'asc' ? 'asc' : 'desc';
  const nulls = sort === 'pace' ? ' nulls last' : '';
  return `${RUN_LIST_ORDER_BY[sort]} ${direction}${nulls}, id ${direction}`;
}

/** What a sort key is in SQL, to read a cursor's key back exactly. */
const RUN_LIST_KEY_TYPE: Record<RunListSort, string> = {
  date: 'timestamptz',
  distance: 'float8',
  duration: 'float8',
  pace: 'float8',
};

/**
 * The runs after `after` in the list's order (keyset: no offset, so a deep page costs what the first does; the
 * date order reads the (user_id, started_at, id) index). Pace may be null and sorts last in both directions.
 */
function whereAfter(q: Knex.QueryBuilder, after: RunListAfter): void {
  const expr = RUN_LIST_ORDER_BY[after.sort];
  const cmp = after.order === 'asc' ? '>' : '<';
  if (after.key === null) {
    q.andWhereRaw(`(${expr}) is null and id ${cmp} ?::uuid`, [after.id]);
    return;
  }
  const key = `?::${RUN_LIST_KEY_TYPE[after.sort]}`;
  if (after.sort === 'pace') {
    q.andWhere((w) =>
      w.whereRaw(`(${expr}, id) ${cmp} (${key}, ?::uuid)`, [after.key, after.id]).orWhereRaw(`(${expr}) is null`),
    );
  } else {
    q.andWhereRaw(`(${expr}, id) ${cmp} (${key}, ?::uuid)`, [after.key, after.id]);
  }
}

export interface RunListAfter {
  sort: RunListSort;
  order: RunListOrder;
  key: string | null;
  id: string;
}

/**
 * One page of the runner's runs, by offset (`page`) or after a cursor (`after`), with the total and the place
 * of the run after the page (null when the page is the last): one row more is read to know.
 */
export async function listRunsOf(
  userId: string,
  query: ListRunsQuery,
  after: RunListAfter | null,
  trx: Db = readDb(),
): Promise<{ rows: RunListRow[]; total: number; next: RunListAfter | null }> {
  const matching = () => {
    const q = trx('runs').where({ user_id: userId });
    if (query.from) q.andWhere('local_date', '>=', query.from);
    if (query.to) q.andWhere('local_date', '<=', query.to);
    return q;
  };
  // The total rides along on every row as a subquery (computed once): one round trip instead of two.
  const page = matching()
    .select(...RUN_LIST_COLUMNS, {
      total: matching().count('*'),
      list_key: trx.raw(`(${RUN_LIST_ORDER_BY[query.sort]})::text`),
    })
    .orderByRaw(runListOrderBy(query.sort, query.order))
    .limit(query.per_page + 1);
  if (after) whereAfter(page, after);
  else page.offset((query.page - 1) * query.per_page);
  const read = (await page) as Array<RunListRow & { total: string; list_key: string | null }>;
  const rows = read.slice(0, query.per_page);
  const last = rows.at(-1);
  const next =
    read.length > query.per_page && last ? { sort: query.sort, order: query.order, key: last.list_key, id: last.id } : null;
  if (rows.length > 0) return { rows, total: Number(read[0]!.total), next };
  // A page past the end has no row to carry the total.
  const [{ count }] = (await matching().count({ count: '*' })) as [{ count: string }];
  return { rows: [], total: Number(count), next: null };
}

export async function renameRun(
  id: string,
  changes: { name?: string; kind?: RunRow['activity_kind'] },
  trx: Db = db,
): Promise<RunRow | undefined> {
  const update: Partial<Pick<RunRow, 'name' | 'activity_kind'>> = {};
  if (changes.name !== undefined) update.name = changes.name;
  if (changes.kind !== undefined) update.activity_kind = changes.kind;
  const [row] = await trx('runs').where({ id }).update(update).returning('*');
  if (row) await bumpWeekInputs([(row as RunRow).user_id], trx);
  return row as RunRow | undefined;
}

/** Deletes the run; returns the source file row when no other run uses it any more (and deletes that row too). */
export async function deleteRunAndOrphanFile(run: RunRow, trx: Db): Promise<SourceFileRow | undefined> {
  await trx('runs').where({ id: run.id }).delete();
  await bumpWeekInputs([run.user_id], trx);
  const remaining = await trx('runs').where({ source_file_id: run.source_file_id }).first();
  if (remaining) return undefined;
  const [file] = await trx('source_files').where({ id: run.source_file_id }).delete().returning('*');
  return file as SourceFileRow | undefined;
}

// Several runners' runs as the week review and the squad overview read them (through run-reads.service.ts).

/** The run's TRIMP stored at import (`details.trimp.trimp`), null without heart rate. */
const TRIMP = "(details->'trimp'->>'trimp')::float8 as trimp";

/** What the load, the trend and the week totals read of a run. */
export interface RunLoadRow {
  user_id: string;
  local_date: string;
  distance_m: number;
  trimp: number | null;
}

/** Several runners' runs (not rides or hikes) between two local dates, inclusive, in the order they started. */
function runsOfRunnersBetween(runnerIds: readonly string[], from: string, to: string, trx: Db) {
  return (
    trx('runs')
      .whereIn('user_id', runnerIds)
      .andWhere('local_date', '>=', from)
      .andWhere('local_date', '<=', to)
      // Rides and hikes stay out of running totals, loads and the week review (issue #14).
      .andWhere('activity_kind', 'run')
      .orderBy('started_at')
  );
}

/** Several runners' runs between two local dates (inclusive), light rows, in the order they started. */
export async function listRunLoadsOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = readDb(),
): Promise<RunLoadRow[]> {
  if (runnerIds.length === 0) return [];
  return runsOfRunnersBetween(runnerIds, from, to, trx).select<RunLoadRow[]>(
    'user_id',
    'local_date',
    'distance_m',
    trx.raw(TRIMP),
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
  return runsOfRunnersBetween(runnerIds, from, to, trx).select(...RUN_LIST_COLUMNS, 'user_id', trx.raw(TRIMP));
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
