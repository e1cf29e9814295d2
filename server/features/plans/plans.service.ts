import { createHash } from 'node:crypto';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { expandParts, resolveTargets } from '../../../shared/plans/expand.ts';
import { DEFAULT_TOLERANCE, type CheckedPart, type PlanCheckResult } from '../../../shared/plans/plan-check.ts';
import { racePacesFor, type RaceTime } from '../../../shared/plans/race-paces.ts';
import { firstPlanOfEachDay, planCheckInputsText, planOfRun } from '../../../shared/plans/run-plan-choice.ts';
import type { CreatePlanInput, UpdatePlanInput } from '../../../shared/plans/schemas.ts';
import { formatShorthand, normaliseItems, parseShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { databaseUrlFromEnv } from '../../config.ts';
import { DatabaseUnavailableError } from '../../lib/database-errors.ts';
import { inTransaction, type GoalRaceRow, type RunRow, type SessionPlanRow, type UserRow } from '../../lib/db.ts';
import { recordPlanChanges } from './plan-changes.service.ts';
import { AppError, NotFoundError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { findGoalRacesOf, listRaceResultsOf } from '../goals/index.ts';
import { computePlanCheckJob } from '../compute/index.ts';
import { getReadableRun, loadRunLaps } from '../runs/index.ts';
import { assertCanPlanFor, assertCanReadRunner } from '../squads/index.ts';
import { findUsersByIds, storePaceTolerance } from '../users/index.ts';
import { repBlocks } from '../../../shared/plans/rep-blocks.ts';
import type { PlanCheckAnswer } from '../../../shared/plans/plan-check-answer.ts';
import { findPlanCheckResults, savePlanCheckResults } from './plan-check-results.repository.ts';
import { toPlan, type StoredPlan } from './plan-view.ts';
import { PLAN_CHECK_CODE_VERSION } from './plan-check-version.ts';
import {
  deletePlan,
  deleteRunPlanLink,
  findPlanById,
  findPlansForRuns,
  findRunPlanLinks,
  insertPlan,
  listPlans,
  updatePlan,
  upsertRunPlanLink,
  type NamedPlanRow,
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
  const row = await inTransaction(async (trx) => {
    const created = await insertPlan(
      {
        runnerId,
        authorId: actor.id,
        date: input.date,
        title: input.title?.trim() || defaultTitle(items),
        notes: input.notes ?? '',
        items,
      },
      trx,
    );
    await recordPlanChanges(actor, [{ kind: 'added', after: created }], trx);
    return created;
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

async function readablePlan(actor: Actor, id: string): Promise<NamedPlanRow> {
  const row = await findPlanById(id);
  if (!row) throw new NotFoundError('There is no plan with this id.');
  await assertCanReadRunner(actor, row.runner_id, 'There is no plan with this id.');
  return row;
}

export async function getPlan(actor: Actor, id: string): Promise<StoredPlan> {
  return toPlan(await readablePlan(actor, id));
}

/** Changes a session (a new date moves it, keeping its id, fuel plan and run link) and records what changed. */
export async function changePlan(actor: Actor, id: string, changes: UpdatePlanInput): Promise<StoredPlan> {
  const row = await readablePlan(actor, id);
  await assertCanPlanFor(actor, row.runner_id);
  const items = itemsOf(changes);
  const updated = await inTransaction(async (trx) => {
    const after = await updatePlan(id, { date: changes.date, title: changes.title, notes: changes.notes, items }, actor.id, trx);
    await recordPlanChanges(actor, [{ kind: 'changed', before: row, after }], trx);
    return after;
  });
  return toPlan(updated);
}

export async function removePlan(actor: Actor, id: string): Promise<void> {
  const row = await readablePlan(actor, id);
  await assertCanPlanFor(actor, row.runner_id);
  await inTransaction(async (trx) => {
    await deletePlan(id, trx);
    await recordPlanChanges(actor, [{ kind: 'deleted', before: row }], trx);
  });
}

/** The answer of `GET /api/runs/:id/plan-check`, declared once in shared/plans/plan-check-answer.ts. */
export type PlanCheckResponse = PlanCheckAnswer;

export async function planCheckOfRun(actor: Actor, runId: string): Promise<PlanCheckResponse> {
  return checkRun(await getReadableRun(actor, runId), actor.id);
}

/** The plan check of a run the caller (`readerId`, whose compute turn a recompute takes) may read. */
export async function checkRun(run: RunRow, readerId: string): Promise<PlanCheckResponse> {
  const checks = await checkRuns([run], await loadRunnerCheckInputs([run.user_id]), readerId);
  return toPlanCheckResponse(checks.get(run.id)!);
}

/** One run's plan check: the plan it was compared with (null: unplanned), how it was chosen, and the result. */
export interface RunCheck {
  plan: SessionPlanRow | null;
  linked: 'chosen' | 'same day' | null;
  tolerance: number;
  /** The plan's expanded parts with their targets resolved, as checked. */
  parts: CheckedPart[];
  result: PlanCheckResult;
}

export function toPlanCheckResponse(check: RunCheck): PlanCheckResponse {
  return {
    plan_id: check.plan?.id ?? null,
    plan: check.plan ? toPlan(check.plan) : null,
    linked: check.linked,
    tolerance: check.tolerance,
    method: check.result.method,
    session_verdict: check.result.session_verdict,
    parts: check.result.parts.map((part) => {
      const resolved = check.parts[part.index]!.resolved;
      return resolved.type === 'unresolved' ? { ...part, unresolved: resolved.reason } : part;
    }),
    rep_blocks: repBlocks(check.parts, check.result.parts),
  };
}

/** What a runner's plan checks read besides the runs and plans: the tolerance, the goal race and race results. */
export interface RunnerCheckInputs {
  tolerance: number;
  goal: RaceTime | null;
  results: readonly RaceTime[];
}

export function runnerCheckInputs(
  runner: Pick<UserRow, 'pace_tolerance'> | undefined,
  goal: GoalRaceRow | undefined,
  results: readonly RaceTime[],
): RunnerCheckInputs {
  return {
    tolerance: runner?.pace_tolerance ?? DEFAULT_TOLERANCE,
    goal: goal ? { date: goal.date, distance_m: goal.distance_m, time_s: goal.goal_time_s } : null,
    results,
  };
}

/** The check inputs of several runners, in three queries. */
export async function loadRunnerCheckInputs(runnerIds: readonly string[]): Promise<Map<string, RunnerCheckInputs>> {
  const [runners, goals, results] = await Promise.all([
    findUsersByIds(runnerIds),
    findGoalRacesOf(runnerIds),
    listRaceResultsOf(runnerIds),
  ]);
  return new Map(
    runnerIds.map((id) => [
      id,
      runnerCheckInputs(
        runners.find((r) => r.id === id),
        goals.find((g) => g.user_id === id),
        results.filter((r) => r.user_id === id),
      ),
    ]),
  );
}

const UNPLANNED: PlanCheckResult = { method: 'planned amounts', parts: [], session_verdict: 'unplanned' };

/** Runs whose stored track is read (and sent to a compute worker) at the same time when their results have to be computed. */
const COMPUTE_BATCH = 4;

function sha256(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

/**
 * The plan checks of several runs (of one runner or many), with a few queries for all of them. A
 * result is computed from the run's track only when no stored result has the key of its current
 * inputs (plan, resolved targets, tolerance, plan-check code); computed results are stored for the
 * next read. `inputsOf` must hold every run's runner.
 *
 * A result computed here is charged to `readerId`, the account whose read asked for it: it takes that account's
 * turn in the compute pool (`jobsAtOncePerUser`, `waitingPerUser`), never the runner's, so a coach reading a
 * squad's weeks cannot use up a runner's place and have the runner's own upload refused with "files or checks
 * of yours" (server/features/runs/README.md, "One account's waiting jobs have a number too").
 */
export async function checkRuns(
  runs: ReadonlyArray<Pick<RunRow, 'id' | 'user_id' | 'local_date' | 'activity_kind'>>,
  inputsOf: ReadonlyMap<string, RunnerCheckInputs>,
  readerId: string,
): Promise<Map<string, RunCheck>> {
  const runIds = runs.map((r) => r.id);
  const links = new Map((await findRunPlanLinks(runIds)).map((l) => [l.run_id, l]));
  const chosenIds = [...new Set([...links.values()].flatMap((l) => (l.plan_id ? [l.plan_id] : [])))];
  const unlinked = runs.filter((r) => !links.has(r.id));
  const plans = await findPlansForRuns(
    chosenIds,
    [...new Set(unlinked.map((r) => r.user_id))],
    [...new Set(unlinked.map((r) => r.local_date))],
  );
  const plansById = new Map(plans.map((p) => [p.id, p]));
  const firstOfDay = firstPlanOfEachDay(plans);

  const out = new Map<string, RunCheck>();
  const pending: Array<{
    run: (typeof runs)[number];
    plan: SessionPlanRow;
    linked: 'chosen' | 'same day';
    parts: CheckedPart[];
    key: string | null;
    tolerance: number;
  }> = [];
  for (const run of runs) {
    const inputs = inputsOf.get(run.user_id)!;
    const { plan, linked } = planOfRun(run, links.get(run.id), plansById, firstOfDay);
    // A ride or a hike is never checked against a running plan (issue #14).
    if (!plan || !linked || run.activity_kind !== 'run') {
      out.set(run.id, { plan: null, linked: null, tolerance: inputs.tolerance, parts: [], result: UNPLANNED });
      continue;
    }
    const paces = racePacesFor(inputs.goal, inputs.results, run.local_date);
    const parts = resolveTargets(expandParts(plan.items as PlanItem[]), paces);
    const key =
      PLAN_CHECK_CODE_VERSION === null
        ? null
        : sha256(planCheckInputsText(run.id, parts, inputs.tolerance, PLAN_CHECK_CODE_VERSION));
    pending.push({ run, plan, linked, parts, key, tolerance: inputs.tolerance });
  }

  const stored = new Map((await findPlanCheckResults(pending.map((p) => p.run.id))).map((r) => [r.run_id, r]));
  const toCompute = pending.filter((p) => p.key === null || stored.get(p.run.id)?.inputs_key !== p.key);
  const computed = new Map<string, PlanCheckResult>();
  const databaseUrl = databaseUrlFromEnv();
  for (let i = 0; i < toCompute.length; i += COMPUTE_BATCH) {
    await Promise.all(
      toCompute.slice(i, i + COMPUTE_BATCH).map(async (p) => {
        // Reading and decoding the stored track and checking it is CPU work: a compute worker does it, in the reader's turn.
        const out = await computePlanCheckJob(readerId, {
          parts: p.parts,
          runId: p.run.id,
          databaseUrl,
          laps: await loadRunLaps(p.run),
          tolerance: p.tolerance,
        });
        if (!out.ok) {
          if (out.reason === 'database-unavailable') throw new DatabaseUnavailableError();
          throw new NotFoundError('This run has no stored track.');
        }
        computed.set(p.run.id, out.result);
      }),
    );
  }
  const fresh = toCompute.flatMap((p) =>
    p.key === null ? [] : [{ run_id: p.run.id, inputs_key: p.key, result: computed.get(p.run.id)! }],
  );
  // A result that cannot be stored (its run deleted meanwhile) is still right for this answer.
  await savePlanCheckResults(fresh).catch((err: unknown) => logger.warn({ err }, 'storing plan-check results failed'));

  for (const p of pending) {
    const result = computed.get(p.run.id) ?? (stored.get(p.run.id)!.result as PlanCheckResult);
    out.set(p.run.id, { plan: p.plan, linked: p.linked, tolerance: p.tolerance, parts: p.parts, result });
  }
  return out;
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
  await storePaceTolerance(runnerId, tolerance);
  return tolerance;
}
