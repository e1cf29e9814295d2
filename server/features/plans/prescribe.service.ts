import type { Actor } from '../../../shared/auth/permissions.ts';
import type {
  AssignInput,
  CopyWeekInput,
  CreateLibrarySessionInput,
  PutDayMarkInput,
  UpdateLibrarySessionInput,
} from '../../../shared/plans/prescribe-schemas.ts';
import { MAX_LIBRARY_SESSIONS } from '../../../shared/plans/prescribe-schemas.ts';
import { formatShorthand, normaliseItems } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { addDays } from '../../../shared/weeks/weeks.ts';
import { inTransaction, isUniqueViolation, type Db, type SessionPlanRow } from '../../lib/db.ts';
import { AppError, BadRequestError, ConflictError, ForbiddenError, NotFoundError } from '../../lib/errors.ts';
import { assertCanPlanFor, assertCanReadRunner } from '../squads/index.ts';
import { findUserById } from '../users/index.ts';
import { recordPlanChanges, type PlanChangeEntry } from './plan-changes.service.ts';
import { toPlan, type StoredPlan } from './plan-view.ts';
import { deletePlan, findPlanById, insertPlan, listPlans } from './plans.repository.ts';
import { parsePlanText } from './plans.service.ts';
import {
  countLibrary,
  deleteBatch,
  deleteDayMark,
  deleteLibrarySession,
  deletePlans,
  findBatch,
  findFuelAuthor,
  findFuelPlanCopy,
  findLibrarySession,
  insertBatch,
  insertFuelPlanCopy,
  insertLibrarySession,
  listDayMarksOf,
  listLibrary,
  listPlanChanges,
  restorePlan,
  toDayMark,
  toLibrarySession,
  toPlanChange,
  updateLibrarySession,
  upsertDayMark,
  findRunnersCoachedBy,
  type FuelPlanCopy,
  type ReplacedPlan,
} from './prescribe.repository.ts';

/** How long a batch (a copied week, an applied library session) can be undone. */
export const UNDO_HOURS = 24;
/** Longest range of day marks one request reads. */
export const MAX_DAY_MARK_RANGE_DAYS = 400;

/** One writer per runner at a time for multi-session writes, so two presses of "copy" cannot both see an empty week. */
async function lockRunners(runnerIds: readonly string[], trx: Db): Promise<void> {
  for (const id of [...runnerIds].sort()) await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [`plans:${id}`]);
}

async function replacedCopy(row: SessionPlanRow, trx: Db): Promise<ReplacedPlan> {
  const { created_at, updated_at, ...rest } = row as SessionPlanRow & { author_name?: unknown; updated_by_name?: unknown };
  delete (rest as { author_name?: unknown }).author_name;
  delete (rest as { updated_by_name?: unknown }).updated_by_name;
  return {
    row: { ...rest, created_at: created_at.toISOString(), updated_at: updated_at.toISOString() },
    fuel_plan: await findFuelPlanCopy(row.id, trx),
    fuel_author_id: await findFuelAuthor(row.id, trx),
  };
}

/**
 * Copies the seven days from `from_start` onto the seven days from `to_start`, weekday for weekday,
 * with each session's fuel plan. A target week that already has sessions is refused (409, with how
 * many) unless `mode` says to replace them or add beside them — so pressing twice never doubles.
 */
export async function copyWeek(actor: Actor, input: CopyWeekInput) {
  const runnerId = input.runner_id ?? actor.id;
  await assertCanPlanFor(actor, runnerId);
  const shift = Math.round((Date.parse(input.to_start) - Date.parse(input.from_start)) / 86_400_000);
  const toEnd = addDays(input.to_start, 6);
  return inTransaction(async (trx) => {
    await lockRunners([runnerId], trx);
    const source = await listPlans(runnerId, input.from_start, addDays(input.from_start, 6), trx);
    if (source.length === 0) throw new BadRequestError('That week has no sessions to copy.', 'nothing-to-copy');
    const existing = (await listPlans(runnerId, input.to_start, toEnd, trx)).filter(
      // With overlapping weeks a session can be both source and target; it is never replaced by itself.
      (p) => !source.some((s) => s.id === p.id),
    );
    if (existing.length > 0 && !input.mode) {
      throw new AppError(
        409,
        'week-has-sessions',
        `The week of ${input.to_start} already has ${existing.length} ${existing.length === 1 ? 'session' : 'sessions'}. ` +
          'Choose to replace them or to add the copies beside them.',
        { existing: existing.length },
      );
    }
    const replaced: ReplacedPlan[] = [];
    const entries: PlanChangeEntry[] = [];
    if (input.mode === 'replace') {
      for (const plan of existing) {
        replaced.push(await replacedCopy(plan, trx));
        await deletePlan(plan.id, trx);
        entries.push({ kind: 'deleted', before: plan });
      }
    }
    const copies: SessionPlanRow[] = [];
    for (const plan of source) {
      const copy = await insertPlan(
        {
          runnerId,
          authorId: actor.id,
          date: addDays(plan.date, shift),
          title: plan.title,
          notes: plan.notes,
          items: plan.items as PlanItem[],
        },
        trx,
      );
      const fuel = await findFuelPlanCopy(plan.id, trx);
      if (fuel) await insertFuelPlanCopy(copy.id, runnerId, actor.id, fuel, trx);
      copies.push(copy);
      entries.push({ kind: 'added', after: copy });
    }
    await recordPlanChanges(actor, entries, trx);
    const batchId = await insertBatch(
      { actor_id: actor.id, kind: 'copy-week', created_ids: copies.map((c) => c.id), replaced },
      trx,
    );
    return { plans: copies.map(toPlan), replaced: replaced.length, batch_id: batchId };
  });
}

/**
 * The runners among `runnerIds` that `actor` may not write for: themselves always may; a coach
 * may for runners in one of their squads now. An admin writes for nobody but themselves (403).
 */
async function assertCanPlanForAll(actor: Actor, runnerIds: readonly string[], trx: Db): Promise<void> {
  const others = runnerIds.filter((id) => id !== actor.id);
  if (others.length === 0) return;
  if (actor.role === 'admin') throw new ForbiddenError('Only the runner and their coaches write their plans.');
  const coached = actor.role === 'coach' ? new Set(await findRunnersCoachedBy(actor.id, others, trx)) : new Set<string>();
  const strangers = others.filter((id) => !coached.has(id));
  if (strangers.length > 0) {
    throw new NotFoundError(
      strangers.length === 1
        ? 'One of the chosen runners is not in your squads, so nothing was added.'
        : `${strangers.length} of the chosen runners are not in your squads, so nothing was added.`,
    );
  }
}

/** A session to write, from shorthand or from one of the actor's library sessions. */
async function sessionToApply(
  actor: Actor,
  input: { title?: string | undefined; text?: string | undefined; library_id?: string | undefined },
  trx: Db,
): Promise<{ title: string; notes: string; items: PlanItem[]; fuel: FuelPlanCopy | null }> {
  if (input.library_id) {
    const saved = await findLibrarySession(actor.id, input.library_id, trx);
    if (!saved) throw new NotFoundError('There is no library session of yours with this id.');
    const items = saved.items as PlanItem[];
    return {
      title: input.title?.trim() || saved.title || saved.name,
      notes: saved.notes,
      items,
      fuel: (saved.fuel_plan as FuelPlanCopy | null) ?? null,
    };
  }
  const items = parsePlanText(input.text!).parts;
  return { title: input.title?.trim() || formatShorthand(items).slice(0, 120), notes: '', items, fuel: null };
}

/**
 * One session for each chosen runner on `date`, in one transaction: a runner who is not the
 * coach's answers 404 and nothing is written. Race-named paces stay as written ("@ goal") and so
 * resolve from each runner's own goal race wherever the plan is read.
 */
export async function assignSession(actor: Actor, input: AssignInput) {
  return inTransaction(async (trx) => {
    await assertCanPlanForAll(actor, input.runner_ids, trx);
    const session = await sessionToApply(actor, input, trx);
    await lockRunners(input.runner_ids, trx);
    const created: SessionPlanRow[] = [];
    for (const runnerId of input.runner_ids) {
      const plan = await insertPlan(
        { runnerId, authorId: actor.id, date: input.date, title: session.title, notes: session.notes, items: session.items },
        trx,
      );
      if (session.fuel) await insertFuelPlanCopy(plan.id, runnerId, actor.id, session.fuel, trx);
      created.push(plan);
    }
    await recordPlanChanges(
      actor,
      created.map((after) => ({ kind: 'added' as const, after })),
      trx,
    );
    const batchId = await insertBatch(
      { actor_id: actor.id, kind: 'assign', created_ids: created.map((p) => p.id), replaced: [] },
      trx,
    );
    return { plans: created.map(toPlan), batch_id: batchId };
  });
}

/**
 * Undoes a batch of the actor's: removes the sessions it added (those still there) and puts back
 * the ones it replaced. Only its author, within 24 hours, while still allowed to write for every
 * runner it touched.
 */
export async function undoBatch(actor: Actor, batchId: string, now = new Date()): Promise<void> {
  await inTransaction(async (trx) => {
    const batch = await findBatch(actor.id, batchId, trx);
    if (!batch) throw new NotFoundError('There is nothing to undo with this id.');
    if (now.getTime() - batch.created_at.getTime() > UNDO_HOURS * 3_600_000) {
      throw new AppError(410, 'undo-expired', `Changes can be undone for ${UNDO_HOURS} hours; this one is older.`);
    }
    const createdIds = batch.created_ids as string[];
    const replaced = batch.replaced as ReplacedPlan[];
    const still: SessionPlanRow[] = [];
    for (const id of createdIds) {
      const row = await findPlanById(id, trx);
      if (row) still.push(row);
    }
    const runnerIds = [...new Set([...still.map((p) => p.runner_id), ...replaced.map((r) => r.row.runner_id)])];
    await assertCanPlanForAll(actor, runnerIds, trx);
    await lockRunners(runnerIds, trx);
    await deletePlans(
      still.map((p) => p.id),
      trx,
    );
    const entries: PlanChangeEntry[] = still.map((before) => ({ kind: 'deleted', before }));
    for (const r of replaced) {
      if (await findPlanById(r.row.id, trx)) continue;
      await restorePlan(r, trx);
      entries.push({ kind: 'added', after: (await findPlanById(r.row.id, trx))! });
    }
    await recordPlanChanges(actor, entries, trx);
    await deleteBatch(batch.id, trx);
  });
}

/** The record of changes of a session the actor may read, newest first (at most 50). */
export async function listChangesOfPlan(actor: Actor, planId: string) {
  const plan = await findPlanById(planId);
  if (!plan) throw new NotFoundError('There is no plan with this id.');
  await assertCanReadRunner(actor, plan.runner_id, 'There is no plan with this id.');
  return (await listPlanChanges(planId)).map(toPlanChange);
}

// ---------------------------------------------------------------------------------------------
// Session library (each person's own)
// ---------------------------------------------------------------------------------------------

export async function listLibraryOf(actor: Actor) {
  return (await listLibrary(actor.id)).map(toLibrarySession);
}

async function withUniqueName<T>(write: () => Promise<T>): Promise<T> {
  try {
    return await write();
  } catch (err) {
    if (isUniqueViolation(err)) throw new ConflictError('Your library already has a session with this name.', 'name-taken');
    throw err;
  }
}

export async function createLibrarySession(actor: Actor, input: CreateLibrarySessionInput) {
  if ((await countLibrary(actor.id)) >= MAX_LIBRARY_SESSIONS) {
    throw new ConflictError(`A library holds at most ${MAX_LIBRARY_SESSIONS} sessions; delete one first.`, 'library-full');
  }
  let items: PlanItem[];
  let title = input.title?.trim() ?? '';
  let notes = input.notes ?? '';
  let fuel: FuelPlanCopy | null = null;
  if (input.plan_id) {
    const plan = await findPlanById(input.plan_id);
    if (!plan) throw new NotFoundError('There is no plan with this id.');
    await assertCanReadRunner(actor, plan.runner_id, 'There is no plan with this id.');
    items = plan.items as PlanItem[];
    title = title || plan.title;
    notes = input.notes ?? plan.notes;
    fuel = await findFuelPlanCopy(plan.id);
  } else {
    items = input.text !== undefined ? parsePlanText(input.text).parts : normaliseItems(input.parts!);
  }
  const row = await withUniqueName(() =>
    insertLibrarySession({ owner_id: actor.id, name: input.name, title, notes, items, fuel_plan: fuel }),
  );
  return toLibrarySession(row);
}

export async function changeLibrarySession(actor: Actor, id: string, input: UpdateLibrarySessionInput) {
  const items = input.text !== undefined ? parsePlanText(input.text).parts : undefined;
  const row = await withUniqueName(() =>
    updateLibrarySession(actor.id, id, { name: input.name, title: input.title, notes: input.notes, items }),
  );
  if (!row) throw new NotFoundError('There is no library session of yours with this id.');
  return toLibrarySession(row);
}

export async function removeLibrarySession(actor: Actor, id: string): Promise<void> {
  if (!(await deleteLibrarySession(actor.id, id))) throw new NotFoundError('There is no library session of yours with this id.');
}

// ---------------------------------------------------------------------------------------------
// Day marks and the runner summary
// ---------------------------------------------------------------------------------------------

export async function putDayMark(actor: Actor, date: string, input: PutDayMarkInput) {
  const runnerId = input.runner_id ?? actor.id;
  await assertCanPlanFor(actor, runnerId);
  return toDayMark(
    await upsertDayMark({
      runner_id: runnerId,
      date,
      kind: input.kind,
      minutes: input.kind === 'cross-training' ? (input.minutes ?? null) : null,
      note: input.note ?? '',
      author_id: actor.id,
    }),
  );
}

export async function removeDayMark(actor: Actor, date: string, runnerId: string | undefined): Promise<void> {
  const runner = runnerId ?? actor.id;
  await assertCanPlanFor(actor, runner);
  if (!(await deleteDayMark(runner, date))) throw new NotFoundError('This day has no mark.');
}

export async function listDayMarks(actor: Actor, query: { from: string; to: string; runner_id?: string | undefined }) {
  const runnerId = query.runner_id ?? actor.id;
  await assertCanReadRunner(actor, runnerId);
  if (query.to < query.from) throw new BadRequestError('The end date comes before the start date.');
  if (Date.parse(query.to) - Date.parse(query.from) > MAX_DAY_MARK_RANGE_DAYS * 86_400_000) {
    throw new BadRequestError(`Ask for at most ${MAX_DAY_MARK_RANGE_DAYS} days at a time.`);
  }
  return (await listDayMarksOf([runnerId], query.from, query.to)).map(toDayMark);
}

export async function runnerSummary(actor: Actor, runnerId: string) {
  await assertCanReadRunner(actor, runnerId);
  const runner = await findUserById(runnerId);
  if (!runner) throw new NotFoundError();
  return {
    id: runner.id,
    name: runner.name,
    unit: runner.unit,
    pace_tolerance: runner.pace_tolerance,
    week_starts_on: runner.week_starts_on,
    time_zone: runner.time_zone,
  };
}

export type { StoredPlan };
