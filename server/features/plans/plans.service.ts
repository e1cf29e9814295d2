import type { Actor } from '../../../shared/auth/permissions.ts';
import { expandParts, resolveTargets } from '../../../shared/plans/expand.ts';
import { checkRunAgainstPlan, type PlanCheckResult } from '../../../shared/plans/plan-check.ts';
import { racePacesFor } from '../../../shared/plans/race-paces.ts';
import type { CreatePlanInput, UpdatePlanInput } from '../../../shared/plans/schemas.ts';
import { formatShorthand, normaliseItems, parseShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { db, type RunRow, type SessionPlanRow } from '../../lib/db.ts';
import { AppError, NotFoundError } from '../../lib/errors.ts';
import { findGoalRace, listRaceResults } from '../goals/goals.repository.ts';
import { getReadableRun, loadRunSeriesAndLaps } from '../runs/runs.service.ts';
import { assertCanPlanFor, assertCanReadRunner } from '../squads/runner-access.ts';
import { findUserById, updateUserProfile } from '../users/users.repository.ts';
import {
  deletePlan,
  deleteRunPlanLink,
  findFirstPlanOnDate,
  findPlanById,
  findRunPlanLink,
  insertPlan,
  listPlans,
  toPlan,
  updatePlan,
  upsertRunPlanLink,
  type StoredPlan,
} from './plans.repository.ts';

/** Parses shorthand for the API: the items, their expanded list and the canonical text, or a 400 pointing at the mistake. */
export function parsePlanText(text: string) {
  const result = parseShorthand(text);
  if (!result.ok) {
    throw new AppError(400, 'shorthand-mistake', result.error.message, {
      position: result.error.position,
      expected: result.error.expected,
    });
  }
  return { parts: result.items, expanded: expandParts(result.items), text: formatShorthand(result.items) };
}

function itemsOf(input: { text?: string | undefined; parts?: PlanItem[] | undefined }): PlanItem[] | undefined {
  if (input.text !== undefined) return parsePlanText(input.text).parts;
  return input.parts === undefined ? undefined : normaliseItems(input.parts);
}

function defaultTitle(items: PlanItem[]): string {
  return formatShorthand(items).slice(0, 120);
}

export async function createPlan(actor: Actor, input: CreatePlanInput): Promise<StoredPlan> {
  const runnerId = input.runner_id ?? actor.id;
  await assertCanPlanFor(actor, runnerId);
  const items = itemsOf(input)!;
  const row = await insertPlan({
    runnerId,
    authorId: actor.id,
    date: input.date,
    title: input.title?.trim() || defaultTitle(items),
    notes: input.notes ?? '',
    items,
  });
  return toPlan(row);
}

export async function listPlansFor(
  actor: Actor,
  query: { from?: string | undefined; to?: string | undefined; runner_id?: string | undefined },
) {
  const runnerId = query.runner_id ?? actor.id;
  await assertCanReadRunner(actor, runnerId);
  return (await listPlans(runnerId, query.from, query.to)).map(toPlan);
}

async function readablePlan(actor: Actor, id: string): Promise<SessionPlanRow> {
  const row = await findPlanById(id);
  if (!row) throw new NotFoundError('There is no plan with this id.');
  await assertCanReadRunner(actor, row.runner_id).catch(() => {
    throw new NotFoundError('There is no plan with this id.');
  });
  return row;
}

export async function getPlan(actor: Actor, id: string): Promise<StoredPlan> {
  return toPlan(await readablePlan(actor, id));
}

export async function changePlan(actor: Actor, id: string, changes: UpdatePlanInput): Promise<StoredPlan> {
  const row = await readablePlan(actor, id);
  await assertCanPlanFor(actor, row.runner_id);
  return toPlan(
    await updatePlan(id, { date: changes.date, title: changes.title, notes: changes.notes, items: itemsOf(changes) }),
  );
}

export async function removePlan(actor: Actor, id: string): Promise<void> {
  const row = await readablePlan(actor, id);
  await assertCanPlanFor(actor, row.runner_id);
  await deletePlan(id);
}

function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

/** Copies the seven days from `fromStart` onto the seven days from `toStart`, same weekday for weekday. */
export async function copyWeek(actor: Actor, input: { from_start: string; to_start: string; runner_id?: string | undefined }) {
  const runnerId = input.runner_id ?? actor.id;
  await assertCanPlanFor(actor, runnerId);
  const shift = Math.round((Date.parse(input.to_start) - Date.parse(input.from_start)) / 86_400_000);
  const source = await listPlans(runnerId, input.from_start, addDays(input.from_start, 6));
  const copies = await db.transaction(async (trx) => {
    const out: SessionPlanRow[] = [];
    for (const plan of source) {
      out.push(
        await insertPlan(
          {
            runnerId,
            authorId: actor.id,
            date: addDays(plan.date, shift),
            title: plan.title,
            notes: plan.notes,
            items: plan.items as PlanItem[],
          },
          trx,
        ),
      );
    }
    return out;
  });
  return copies.map(toPlan);
}

/** The plan a run is compared with: the one chosen for it, else the first plan on its local date. */
async function planOfRun(run: { id: string; user_id: string; local_date: string }): Promise<SessionPlanRow | null> {
  const link = await findRunPlanLink(run.id);
  if (link) return link.plan_id ? ((await findPlanById(link.plan_id)) ?? null) : null;
  return (await findFirstPlanOnDate(run.user_id, run.local_date)) ?? null;
}

export interface PlanCheckResponse extends Omit<PlanCheckResult, 'parts'> {
  plan_id: string | null;
  plan: StoredPlan | null;
  linked: 'chosen' | 'same day' | null;
  tolerance: number;
  parts: Array<PlanCheckResult['parts'][number] & { unresolved?: string }>;
}

export async function planCheckOfRun(actor: Actor, runId: string): Promise<PlanCheckResponse> {
  return checkRun(await getReadableRun(actor, runId));
}

/** The plan check of a run the caller may read (also used by the week review). */
export async function checkRun(run: RunRow): Promise<PlanCheckResponse> {
  const plan = await planOfRun(run);
  const runner = await findUserById(run.user_id);
  const tolerance = runner?.pace_tolerance ?? 0.02;
  if (!plan)
    return {
      plan_id: null,
      plan: null,
      linked: null,
      tolerance,
      method: 'planned amounts',
      session_verdict: 'unplanned',
      parts: [],
    };
  const [goal, results, link] = await Promise.all([
    findGoalRace(run.user_id),
    listRaceResults(run.user_id),
    findRunPlanLink(run.id),
  ]);
  const paces = racePacesFor(
    goal ? { date: goal.date, distance_m: goal.distance_m, time_s: goal.goal_time_s } : null,
    results,
    run.local_date,
  );
  const parts = resolveTargets(expandParts(plan.items as PlanItem[]), paces);
  const { series, laps } = await loadRunSeriesAndLaps(run);
  const result = checkRunAgainstPlan(parts, series, laps, tolerance);
  return {
    plan_id: plan.id,
    plan: toPlan(plan),
    linked: link ? 'chosen' : 'same day',
    tolerance,
    method: result.method,
    session_verdict: result.session_verdict,
    parts: result.parts.map((p) => {
      const resolved = parts[p.index]!.resolved;
      return resolved.type === 'unresolved' ? { ...p, unresolved: resolved.reason } : p;
    }),
  };
}

/** The runner links a run to one of their plans, or to none (`planId` null); `auto` forgets the choice. */
export async function linkRunToPlan(actor: Actor, runId: string, planId: string | null | 'auto'): Promise<void> {
  const run = await getReadableRun(actor, runId);
  if (run.user_id !== actor.id) throw new NotFoundError('There is no run with this id.');
  if (planId === 'auto') return deleteRunPlanLink(run.id);
  if (planId !== null) {
    const plan = await findPlanById(planId);
    if (!plan || plan.runner_id !== run.user_id) throw new NotFoundError('There is no plan with this id.');
  }
  await upsertRunPlanLink(run.id, planId);
}

/** The runner or one of their coaches sets the runner's pace tolerance for the plan check. */
export async function setPaceTolerance(actor: Actor, runnerId: string, tolerance: number): Promise<number> {
  await assertCanPlanFor(actor, runnerId);
  await updateUserProfile(runnerId, { pace_tolerance: tolerance });
  return tolerance;
}
