import { db, type Db, type RunPlanLinkRow, type SessionPlanRow } from '../../lib/db.ts';
import { formatShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';

export interface StoredPlan {
  id: string;
  runner_id: string;
  author_id: string | null;
  date: string;
  title: string;
  notes: string;
  text: string;
  parts: PlanItem[];
  created_at: string;
  updated_at: string;
}

export function toPlan(row: SessionPlanRow): StoredPlan {
  const parts = row.items as PlanItem[];
  return {
    id: row.id,
    runner_id: row.runner_id,
    author_id: row.author_id,
    date: row.date,
    title: row.title,
    notes: row.notes,
    text: formatShorthand(parts),
    parts,
    created_at: row.created_at.toISOString(),
    updated_at: row.updated_at.toISOString(),
  };
}

export async function insertPlan(
  plan: { runnerId: string; authorId: string; date: string; title: string; notes: string; items: PlanItem[] },
  trx: Db = db,
): Promise<SessionPlanRow> {
  const [row] = await trx('session_plans')
    .insert({
      runner_id: plan.runnerId,
      author_id: plan.authorId,
      date: plan.date,
      title: plan.title,
      notes: plan.notes,
      items: JSON.stringify(plan.items),
    })
    .returning('*');
  return row as SessionPlanRow;
}

export async function findPlanById(id: string, trx: Db = db): Promise<SessionPlanRow | undefined> {
  return trx('session_plans').where({ id }).first();
}

/** Plans in date order, then as written; id settles ties so every list agrees. */
const PLAN_ORDER = [{ column: 'date' }, { column: 'created_at' }, { column: 'id' }];

export async function listPlans(
  runnerId: string,
  from: string | undefined,
  to: string | undefined,
  trx: Db = db,
): Promise<SessionPlanRow[]> {
  const query = trx('session_plans').where({ runner_id: runnerId });
  if (from) query.andWhere('date', '>=', from);
  if (to) query.andWhere('date', '<=', to);
  return query.orderBy(PLAN_ORDER);
}

/** Several runners' plans between two dates (inclusive), in the order `listPlans` gives one runner's. */
export async function listPlansOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx: Db = db,
): Promise<SessionPlanRow[]> {
  if (runnerIds.length === 0) return [];
  return trx('session_plans')
    .whereIn('runner_id', runnerIds)
    .andWhere('date', '>=', from)
    .andWhere('date', '<=', to)
    .orderBy(PLAN_ORDER);
}

export async function updatePlan(
  id: string,
  changes: { date?: string | undefined; title?: string | undefined; notes?: string | undefined; items?: PlanItem[] | undefined },
  trx: Db = db,
): Promise<SessionPlanRow> {
  const { items, ...given } = changes;
  const rest = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
  const [row] = await trx('session_plans')
    .where({ id })
    .update({ ...rest, ...(items ? { items: JSON.stringify(items) } : {}), updated_at: new Date() })
    .returning('*');
  return row as SessionPlanRow;
}

export async function deletePlan(id: string, trx: Db = db): Promise<void> {
  await trx('session_plans').where({ id }).delete();
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
  trx: Db = db,
): Promise<SessionPlanRow[]> {
  if (ids.length === 0 && (runnerIds.length === 0 || dates.length === 0)) return [];
  return trx('session_plans')
    .where((q) => {
      if (ids.length) q.whereIn('id', ids);
      if (runnerIds.length && dates.length) q.orWhere((day) => day.whereIn('runner_id', runnerIds).whereIn('date', dates));
    })
    .orderBy(PLAN_ORDER);
}

export async function findRunPlanLinks(runIds: readonly string[], trx: Db = db): Promise<RunPlanLinkRow[]> {
  if (runIds.length === 0) return [];
  return trx('run_plan_links').whereIn('run_id', runIds);
}

export async function findRunPlanLink(runId: string, trx: Db = db) {
  return trx('run_plan_links').where({ run_id: runId }).first();
}

export async function upsertRunPlanLink(runId: string, planId: string | null, trx: Db = db): Promise<void> {
  await trx('run_plan_links').insert({ run_id: runId, plan_id: planId, linked_at: new Date() }).onConflict('run_id').merge();
}

export async function deleteRunPlanLink(runId: string, trx: Db = db): Promise<void> {
  await trx('run_plan_links').where({ run_id: runId }).delete();
}
