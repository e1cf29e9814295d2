import {
  db,
  type Db,
  type DayMarkRow,
  type FuelPlanRow,
  type LibrarySessionRow,
  type PlanBatchRow,
  type PlanChangeRow,
  type SessionPlanRow,
  readDb,
} from '../../lib/db.ts';
import { bumpWeekInputs } from '../week-cache/index.ts';
import type { DayMark, LibrarySession, PlanChange } from '../../../shared/plans/prescribe-schemas.ts';
import { formatShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';

// ---------------------------------------------------------------------------------------------
// The record of changes
// ---------------------------------------------------------------------------------------------

export function toPlanChange(row: PlanChangeRow): PlanChange {
  return {
    id: row.id,
    plan_id: row.plan_id,
    kind: row.kind,
    summary: row.summary,
    actor_id: row.actor_id,
    actor_name: row.actor_name,
    created_at: row.created_at.toISOString(),
  };
}

export async function insertPlanChanges(
  changes: Array<Omit<PlanChangeRow, 'id' | 'created_at' | 'noticed_at'> & { noticed: boolean }>,
  trx: Db = db,
): Promise<void> {
  if (changes.length === 0) return;
  const now = new Date();
  await trx('plan_changes').insert(
    changes.map(({ noticed, ...c }) => ({ ...c, created_at: now, noticed_at: noticed ? now : null })),
  );
}

export async function listPlanChanges(planId: string, trx: Db = db): Promise<PlanChangeRow[]> {
  return trx('plan_changes')
    .where({ plan_id: planId })
    .orderBy([{ column: 'created_at', order: 'desc' }, { column: 'id' }])
    .limit(50);
}

/** Coaches' changes nobody has been told about yet, oldest first. */
export async function listUnnoticedChanges(trx: Db = db): Promise<PlanChangeRow[]> {
  return trx('plan_changes').whereNull('noticed_at').orderBy('created_at');
}

/**
 * Runners whose unnoticed changes form a finished burst: the last change before `quietSince`, or
 * the first before `longestSince`; the longest-waiting first, at most `limit`.
 */
export async function findRunnersWithFinishedBursts(
  quietSince: Date,
  longestSince: Date,
  limit: number,
  trx: Db = db,
): Promise<string[]> {
  const rows = await trx('plan_changes')
    .whereNull('noticed_at')
    .groupBy('runner_id')
    .havingRaw('max(created_at) <= ? or min(created_at) <= ?', [quietSince, longestSince])
    .orderByRaw('min(created_at)')
    .limit(limit)
    .select<Array<{ runner_id: string }>>('runner_id');
  return rows.map((r) => r.runner_id);
}

/** The runner's unnoticed changes in order, locked; rows another process holds are skipped (SKIP LOCKED). */
export async function lockUnnoticedChangesOf(runnerId: string, trx: Db): Promise<PlanChangeRow[]> {
  return trx('plan_changes')
    .where({ runner_id: runnerId })
    .whereNull('noticed_at')
    .orderBy([{ column: 'created_at' }, { column: 'id' }])
    .forUpdate()
    .skipLocked()
    .select<PlanChangeRow[]>('*');
}

export async function markChangesNoticed(ids: readonly string[], at: Date, trx: Db = db): Promise<void> {
  if (ids.length === 0) return;
  await trx('plan_changes').whereIn('id', ids).whereNull('noticed_at').update({ noticed_at: at });
}

// ---------------------------------------------------------------------------------------------
// Session library
// ---------------------------------------------------------------------------------------------

export function toLibrarySession(row: LibrarySessionRow): LibrarySession {
  const parts = row.items as PlanItem[];
  return {
    id: row.id,
    name: row.name,
    title: row.title,
    notes: row.notes,
    text: formatShorthand(parts),
    parts,
    has_fuel_plan: row.fuel_plan !== null,
    updated_at: row.updated_at.toISOString(),
  };
}

export async function listLibrary(ownerId: string, trx: Db = db): Promise<LibrarySessionRow[]> {
  return trx('library_sessions').where({ owner_id: ownerId }).orderByRaw('lower(name), id');
}

export async function countLibrary(ownerId: string, trx: Db = db): Promise<number> {
  const [row] = await trx('library_sessions').where({ owner_id: ownerId }).count<{ count: string }[]>('* as count');
  return Number(row?.count ?? 0);
}

export async function findLibrarySession(ownerId: string, id: string, trx: Db = db): Promise<LibrarySessionRow | undefined> {
  return trx('library_sessions').where({ owner_id: ownerId, id }).first();
}

export async function insertLibrarySession(
  values: { owner_id: string; name: string; title: string; notes: string; items: PlanItem[]; fuel_plan: unknown },
  trx: Db = db,
): Promise<LibrarySessionRow> {
  const [row] = await trx('library_sessions')
    .insert({
      ...values,
      items: JSON.stringify(values.items),
      fuel_plan: values.fuel_plan === null ? null : JSON.stringify(values.fuel_plan),
    })
    .returning('*');
  return row as LibrarySessionRow;
}

export async function updateLibrarySession(
  ownerId: string,
  id: string,
  changes: { name?: string | undefined; title?: string | undefined; notes?: string | undefined; items?: PlanItem[] | undefined },
  trx: Db = db,
): Promise<LibrarySessionRow | undefined> {
  const { items, ...given } = changes;
  const rest = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
  const [row] = await trx('library_sessions')
    .where({ owner_id: ownerId, id })
    .update({ ...rest, ...(items ? { items: JSON.stringify(items) } : {}), updated_at: new Date() })
    .returning('*');
  return row as LibrarySessionRow | undefined;
}

export async function deleteLibrarySession(ownerId: string, id: string, trx: Db = db): Promise<boolean> {
  return (await trx('library_sessions').where({ owner_id: ownerId, id }).delete()) > 0;
}

// ---------------------------------------------------------------------------------------------
// Fuel plans travelling with sessions (library ↔ session, and back on undo)
// ---------------------------------------------------------------------------------------------

/** The columns of a fuel plan that make it up, without who owns it: copied as they are. */
export type FuelPlanCopy = Omit<
  FuelPlanRow,
  'id' | 'runner_id' | 'author_id' | 'plan_id' | 'goal_race_user_id' | 'created_at' | 'updated_at'
>;

export async function findFuelPlanCopy(planId: string, trx: Db = db): Promise<FuelPlanCopy | null> {
  const row = await trx('fuel_plans').where({ plan_id: planId }).first();
  if (!row) return null;
  const { id, runner_id, author_id, plan_id, goal_race_user_id, created_at, updated_at, ...copy } = row;
  void [id, runner_id, author_id, plan_id, goal_race_user_id, created_at, updated_at];
  return copy;
}

export async function insertFuelPlanCopy(
  planId: string,
  runnerId: string,
  authorId: string,
  copy: FuelPlanCopy,
  trx: Db = db,
): Promise<void> {
  await trx('fuel_plans').insert({
    ...copy,
    targets: JSON.stringify(copy.targets),
    intakes: JSON.stringify(copy.intakes),
    schedule: JSON.stringify(copy.schedule),
    plan_id: planId,
    runner_id: runnerId,
    author_id: authorId,
  });
  await bumpWeekInputs([runnerId], trx);
}

// ---------------------------------------------------------------------------------------------
// Batches (undo)
// ---------------------------------------------------------------------------------------------

/** A session a "replace" removed, whole, with its fuel plan: enough to put it back under its own id. */
export interface ReplacedPlan {
  row: Omit<SessionPlanRow, 'created_at' | 'updated_at'> & { created_at: string; updated_at: string };
  fuel_plan: FuelPlanCopy | null;
  fuel_author_id: string | null;
}

export async function insertBatch(
  values: { actor_id: string; kind: PlanBatchRow['kind']; created_ids: string[]; replaced: ReplacedPlan[] },
  trx: Db = db,
): Promise<string> {
  const [row] = await trx('plan_batches')
    .insert({ ...values, created_ids: JSON.stringify(values.created_ids), replaced: JSON.stringify(values.replaced) })
    .returning('id');
  return (row as { id: string }).id;
}

export async function findBatch(actorId: string, id: string, trx: Db = db): Promise<PlanBatchRow | undefined> {
  return trx('plan_batches').where({ actor_id: actorId, id }).forUpdate().first();
}

export async function deleteBatch(id: string, trx: Db = db): Promise<void> {
  await trx('plan_batches').where({ id }).delete();
}

export async function findFuelAuthor(planId: string, trx: Db = db): Promise<string | null> {
  const row = await trx('fuel_plans').where({ plan_id: planId }).first('author_id');
  return row?.author_id ?? null;
}

/** Puts a replaced session back with its own id, times and fuel plan. */
export async function restorePlan(replaced: ReplacedPlan, trx: Db = db): Promise<void> {
  const { row } = replaced;
  await trx('session_plans').insert({
    ...row,
    items: JSON.stringify(row.items),
    created_at: new Date(row.created_at),
    updated_at: new Date(row.updated_at),
  });
  await bumpWeekInputs([row.runner_id], trx);
  if (replaced.fuel_plan) {
    await insertFuelPlanCopy(
      row.id,
      row.runner_id,
      replaced.fuel_author_id ?? row.author_id ?? row.runner_id,
      replaced.fuel_plan,
      trx,
    );
  }
}

export async function deletePlans(ids: readonly string[], trx: Db = db): Promise<number> {
  if (ids.length === 0) return 0;
  const gone: Array<{ runner_id: string }> = await trx('session_plans').whereIn('id', ids).delete().returning('runner_id');
  await bumpWeekInputs(
    gone.map((r) => r.runner_id),
    trx,
  );
  return gone.length;
}

// ---------------------------------------------------------------------------------------------
// Day marks
// ---------------------------------------------------------------------------------------------

export function toDayMark(row: DayMarkRow): DayMark {
  return {
    runner_id: row.runner_id,
    date: row.date,
    kind: row.kind,
    minutes: row.minutes,
    note: row.note,
    author_id: row.author_id,
    updated_at: row.updated_at.toISOString(),
  };
}

export async function upsertDayMark(values: Omit<DayMarkRow, 'updated_at'>, trx: Db = db): Promise<DayMarkRow> {
  const [row] = await trx('day_marks')
    .insert({ ...values, updated_at: new Date() })
    .onConflict(['runner_id', 'date'])
    .merge()
    .returning('*');
  await bumpWeekInputs([values.runner_id], trx);
  return row as DayMarkRow;
}

export async function deleteDayMark(runnerId: string, date: string, trx: Db = db): Promise<boolean> {
  const deleted = (await trx('day_marks').where({ runner_id: runnerId, date }).delete()) > 0;
  if (deleted) await bumpWeekInputs([runnerId], trx);
  return deleted;
}

export async function listDayMarksOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = readDb(),
): Promise<DayMarkRow[]> {
  if (runnerIds.length === 0) return [];
  return trx('day_marks').whereIn('runner_id', runnerIds).andWhere('date', '>=', from).andWhere('date', '<=', to).orderBy('date');
}

/** Of `runnerIds`, those in one of the coach's squads now. */
export async function findRunnersCoachedBy(coachId: string, runnerIds: readonly string[], trx: Db = db): Promise<string[]> {
  if (runnerIds.length === 0) return [];
  const rows = await trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .where('squads.coach_id', coachId)
    .whereIn('squad_members.runner_id', runnerIds)
    .distinct<{ runner_id: string }[]>('squad_members.runner_id');
  return rows.map((r) => r.runner_id);
}
