import { db, type Db, type RunPlanLinkRow, type SessionPlanRow, readDb } from '../../lib/db.ts';
import { bumpWeekInputs, bumpWeekInputsOfRuns } from '../week-cache/index.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';

/** A plan row with the names of who wrote it and who changed it last (null when unknown or gone). */
export type NamedPlanRow = SessionPlanRow & { author_name?: string | null; updated_by_name?: string | null };

/** Plans with their author's and last editor's names. */
function namedPlans(trx: Db) {
  return trx('session_plans')
    .leftJoin('users as plan_author', 'plan_author.id', 'session_plans.author_id')
    .leftJoin('users as plan_editor', 'plan_editor.id', 'session_plans.updated_by')
    .select('session_plans.*', 'plan_author.name as author_name', 'plan_editor.name as updated_by_name');
}

export async function insertPlan(
  plan: { runnerId: string; authorId: string; date: string; title: string; notes: string; items: PlanItem[] },
  trx: Db = db,
): Promise<NamedPlanRow> {
  const [row] = await trx('session_plans')
    .insert({
      runner_id: plan.runnerId,
      author_id: plan.authorId,
      updated_by: plan.authorId,
      date: plan.date,
      title: plan.title,
      notes: plan.notes,
      items: JSON.stringify(plan.items),
    })
    .returning('id');
  await bumpWeekInputs([plan.runnerId], trx);
  return (await findPlanById((row as { id: string }).id, trx))!;
}

export async function findPlanById(id: string, trx: Db = db): Promise<NamedPlanRow | undefined> {
  return namedPlans(trx).where('session_plans.id', id).first();
}

/** Plans in date order, then as written; id settles ties so every list agrees. */
const PLAN_ORDER = [{ column: 'session_plans.date' }, { column: 'session_plans.created_at' }, { column: 'session_plans.id' }];

export async function listPlans(
  runnerId: string,
  from: string | undefined,
  to: string | undefined,
  trx: Db = db,
): Promise<NamedPlanRow[]> {
  const query = namedPlans(trx).where('session_plans.runner_id', runnerId);
  if (from) query.andWhere('session_plans.date', '>=', from);
  if (to) query.andWhere('session_plans.date', '<=', to);
  return query.orderBy(PLAN_ORDER);
}

/** Several runners' plans between two dates (inclusive), in the order `listPlans` gives one runner's. */
export async function listPlansOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = readDb(),
): Promise<NamedPlanRow[]> {
  if (runnerIds.length === 0) return [];
  return namedPlans(trx)
    .whereIn('session_plans.runner_id', runnerIds)
    .andWhere('session_plans.date', '>=', from)
    .andWhere('session_plans.date', '<=', to)
    .orderBy(PLAN_ORDER);
}

/** Changes a plan; `updatedBy` is recorded as its last editor and the calendar sequence goes up by one. */
export async function updatePlan(
  id: string,
  changes: { date?: string | undefined; title?: string | undefined; notes?: string | undefined; items?: PlanItem[] | undefined },
  updatedBy: string,
  trx: Db = db,
): Promise<NamedPlanRow> {
  const { items, ...given } = changes;
  const rest = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
  await trx('session_plans')
    .where({ id })
    .update({
      ...rest,
      ...(items ? { items: JSON.stringify(items) } : {}),
      updated_at: new Date(),
      updated_by: updatedBy,
      sequence: trx.raw('sequence + 1'),
    });
  const plan = (await findPlanById(id, trx))!;
  await bumpWeekInputs([plan.runner_id], trx);
  return plan;
}

export async function deletePlan(id: string, trx: Db = db): Promise<void> {
  const gone = await trx('session_plans').where({ id }).delete().returning('runner_id');
  await bumpWeekInputs(
    gone.map((r: { runner_id: string }) => r.runner_id),
    trx,
  );
}

/** The first plan of the runner's day (by creation), for linking a run automatically. */
export async function findFirstPlanOnDate(runnerId: string, date: string, trx: Db = db): Promise<SessionPlanRow | undefined> {
  return trx('session_plans').where({ runner_id: runnerId, date }).orderBy(['created_at', 'id']).first();
}

/**
 * The plans that can be the plan of these runs: the ones chosen for them (`ids`) and every plan of
 * their runners on their dates, in the order "first plan of the day" reads them.
 */
export async function findPlansForRuns(
  ids: readonly string[],
  runnerIds: readonly string[],
  dates: readonly string[],
  trx: Db = readDb(),
): Promise<SessionPlanRow[]> {
  if (ids.length === 0 && (runnerIds.length === 0 || dates.length === 0)) return [];
  return namedPlans(trx)
    .where((q) => {
      if (ids.length) q.whereIn('session_plans.id', ids);
      if (runnerIds.length && dates.length) {
        q.orWhere((day) => day.whereIn('session_plans.runner_id', runnerIds).whereIn('session_plans.date', dates));
      }
    })
    .orderBy(PLAN_ORDER);
}

export async function findRunPlanLinks(runIds: readonly string[], trx: Db = readDb()): Promise<RunPlanLinkRow[]> {
  if (runIds.length === 0) return [];
  return trx('run_plan_links').whereIn('run_id', runIds);
}

export async function findRunPlanLink(runId: string, trx: Db = db) {
  return trx('run_plan_links').where({ run_id: runId }).first();
}

export async function upsertRunPlanLink(runId: string, planId: string | null, trx: Db = db): Promise<void> {
  await trx('run_plan_links').insert({ run_id: runId, plan_id: planId, linked_at: new Date() }).onConflict('run_id').merge();
  await bumpWeekInputsOfRuns([runId], trx);
}

export async function deleteRunPlanLink(runId: string, trx: Db = db): Promise<void> {
  await trx('run_plan_links').where({ run_id: runId }).delete();
  await bumpWeekInputsOfRuns([runId], trx);
}
