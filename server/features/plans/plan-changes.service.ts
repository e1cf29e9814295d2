import type { Actor } from '../../../shared/auth/permissions.ts';
import { describePlanAddedOrDeleted, describePlanChange, type PlanFields } from '../../../shared/plans/plan-changes.ts';
import { formatShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import type { Db, SessionPlanRow } from '../../lib/db.ts';
import { findUserById } from '../users/index.ts';
import { insertPlanChanges } from './prescribe.repository.ts';

export type PlanChangeEntry =
  | { kind: 'added'; after: SessionPlanRow }
  | { kind: 'changed'; before: SessionPlanRow; after: SessionPlanRow }
  | { kind: 'deleted'; before: SessionPlanRow };

function fieldsOf(row: SessionPlanRow): PlanFields {
  return { date: row.date, title: row.title, notes: row.notes, text: formatShorthand(row.items as PlanItem[]) };
}

/**
 * Records changes to sessions, inside the caller's transaction: who (name kept, so the record
 * outlives an account), when and what. A change by the runner to their own plan needs no e-mail,
 * so it is stored as already noticed; a coach's waits for the notice sweep (plan-notices.ts).
 */
export async function recordPlanChanges(actor: Actor, entries: readonly PlanChangeEntry[], trx: Db): Promise<void> {
  if (entries.length === 0) return;
  const name = (await findUserById(actor.id, trx))?.name ?? 'Someone';
  const rows = entries.flatMap((entry) => {
    const plan = entry.kind === 'deleted' ? entry.before : entry.after;
    const base = {
      plan_id: plan.id,
      runner_id: plan.runner_id,
      actor_id: actor.id,
      actor_name: name,
      noticed: actor.id === plan.runner_id,
    };
    if (entry.kind === 'changed') {
      const change = describePlanChange(fieldsOf(entry.before), fieldsOf(entry.after));
      return change ? [{ ...base, ...change, plan_date: entry.after.date }] : [];
    }
    const fields = fieldsOf(plan);
    return [{ ...base, kind: entry.kind, summary: describePlanAddedOrDeleted(entry.kind, fields), plan_date: plan.date }];
  });
  await insertPlanChanges(rows, trx);
}
