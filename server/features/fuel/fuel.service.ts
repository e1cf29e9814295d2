import type { CheckinView, FuelPlan, FuelTakenView } from '../../../shared/fuel/answers.ts';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { CAUTIONS, cautionsFor, coldWaterNotes, type CautionTopic } from '../../../shared/fuel/cautions.ts';
import { mealPlan } from '../../../shared/fuel/meals.ts';
import {
  buildSchedule,
  courseFromPlanItems,
  courseFromRace,
  FuelPlanError,
  scaleCourse,
  type Amounts,
  type Bottle,
  type Course,
  type FuelItemFacts,
  type FuelSchedule,
  type IntakeRule,
} from '../../../shared/fuel/schedule.ts';
import type { CheckinInput, FuelItemInput, FuelItemPatch, FuelPlanInput, FuelTakenInput } from '../../../shared/fuel/schemas.ts';
import { comparePlannedWithTaken, resolveTakenEntries, type TakenEntry } from '../../../shared/fuel/taken.ts';
import { proposeTargets, type FuelTarget, type FuelTargets } from '../../../shared/fuel/targets.ts';
import { racePacesFor } from '../../../shared/plans/race-paces.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import type { FuelPlanRow, RunCheckinRow, RunRow } from '../../lib/db.ts';
import { HIGH_SORENESS } from '../../../shared/notices/batching.ts';
import { AppError, ForbiddenError, NotFoundError, ValidationError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { recordSorenessAlert, type NoticeDeps } from '../notices/index.ts';
import { findGoalRace, listRaceResults } from '../goals/index.ts';
import { findFirstPlanOnDate, findPlanById, findRunPlanLink } from '../plans/index.ts';
import { getReadableRun } from '../runs/index.ts';
import { assertCanPlanFor, assertCanReadRunner } from '../squads/index.ts';
import {
  deleteFuelItem,
  deleteFuelPlan,
  findFuelItemsByIds,
  findFuelPlan,
  findFuelTaken,
  findRunCheckin,
  insertFuelItem,
  listFuelItems,
  toFuelItem,
  updateFuelItem,
  upsertFuelPlan,
  upsertFuelTaken,
  upsertRunCheckin,
  type FuelPlanOwner,
} from './fuel.repository.ts';

// ─── Fuel items ────────────────────────────────────────────────────────────────────────────

export async function listItemsOf(actor: Actor, runnerId: string) {
  await assertCanReadRunner(actor, runnerId);
  return (await listFuelItems(runnerId)).map(toFuelItem);
}

export async function createItem(actor: Actor, input: FuelItemInput) {
  return toFuelItem(await insertFuelItem(actor.id, input));
}

export async function changeItem(actor: Actor, id: string, patch: FuelItemPatch) {
  const row = await updateFuelItem(actor.id, id, patch);
  if (!row) throw new NotFoundError('There is no fuel item with this id.');
  return toFuelItem(row);
}

export async function removeItem(actor: Actor, id: string): Promise<void> {
  if (!(await deleteFuelItem(actor.id, id))) throw new NotFoundError('There is no fuel item with this id.');
}

// ─── Fuel plans ────────────────────────────────────────────────────────────────────────────

/** What is stored in `fuel_plans.intakes`. */
interface StoredIntakes {
  rules: IntakeRule[];
  bottles: Bottle[];
}

/** What is stored in `fuel_plans.schedule`: the schedule, the course it was placed on and the item facts it used. */
interface StoredSchedule {
  course: Course;
  items: FuelItemFacts[];
  schedule: FuelSchedule;
}

function asBadInput(err: unknown): never {
  if (err instanceof FuelPlanError) {
    if (err.field) throw new ValidationError(err.message, [{ field: err.field, message: err.message }]);
    throw new AppError(422, 'fuel-plan-unusable', err.message);
  }
  throw err;
}

function proposedFor(durationS: number, bodyMassKg: number, sweat: number | null): FuelTargets {
  return proposeTargets({ duration_s: durationS, body_mass_kg: bodyMassKg, sweat_l_per_h: sweat ?? undefined });
}

function setTarget(proposed: FuelTarget, own: { low: number; high: number } | undefined): FuelTarget {
  if (!own) return proposed;
  return {
    ...own,
    unit: proposed.unit,
    source: 'Set for this plan by the runner or their coach',
    note: `Pacewright proposed ${proposed.low}–${proposed.high ?? 'no upper figure'} ${proposed.unit} (${proposed.source}).`,
    evidence: 'set',
  };
}

function cautionTopics(schedule: FuelSchedule, items: readonly FuelItemFacts[]): CautionTopic[] {
  const topics: CautionTopic[] = ['carbohydrate', 'fluid', 'sodium'];
  if (schedule.totals.caffeine_mg > 0 || items.some((i) => i.caffeine_mg > 0)) topics.push('caffeine');
  return topics;
}

function present(row: FuelPlanRow, sourceUpdatedAt: Date | null): FuelPlan {
  const intakes = row.intakes as StoredIntakes;
  const stored = row.schedule as StoredSchedule;
  return {
    id: row.id,
    runner_id: row.runner_id,
    author_id: row.author_id,
    plan_id: row.plan_id,
    goal_race: row.goal_race_user_id !== null,
    body_mass_kg: row.body_mass_kg,
    easy_pace_s_per_km: row.easy_pace_s_per_km,
    expected_duration_s: row.expected_duration_s,
    expected_duration_given: row.expected_duration_given,
    expected_distance_m: stored.course.distance_m,
    start_clock: row.start_clock,
    sweat_l_per_h: row.sweat_l_per_h,
    targets: row.targets as FuelTargets,
    proposed_targets: proposedFor(row.expected_duration_s, row.body_mass_kg, row.sweat_l_per_h),
    intakes: intakes.rules,
    bottles: intakes.bottles,
    items: stored.items,
    course: stored.course,
    schedule: stored.schedule,
    meals: mealPlan(row.body_mass_kg, row.expected_duration_s),
    cautions: cautionsFor(cautionTopics(stored.schedule, stored.items)),
    source_changed: sourceUpdatedAt !== null && sourceUpdatedAt.getTime() > row.updated_at.getTime(),
    updated_at: row.updated_at.toISOString(),
  };
}

function referencedItemIds(input: FuelPlanInput): string[] {
  const ids = new Set<string>();
  for (const r of input.intakes) if (r.item_id) ids.add(r.item_id);
  for (const b of input.bottles) for (const c of b.contents) ids.add(c.item_id);
  return [...ids];
}

/** Computes and stores a fuel plan for `owner` on `course`; bad input throws 400/422 before anything is written. */
async function saveFuelPlan(
  actor: Actor,
  runnerId: string,
  owner: FuelPlanOwner,
  baseCourse: () => Course,
  input: FuelPlanInput,
) {
  const items = (await findFuelItemsByIds(runnerId, referencedItemIds(input))).map(toFuelItem);
  let course: Course;
  let schedule: FuelSchedule;
  let targets: FuelTargets;
  try {
    course = baseCourse();
    if (input.expected_duration_s !== undefined) course = scaleCourse(course, input.expected_duration_s);
    const proposed = proposedFor(course.duration_s, input.body_mass_kg, input.sweat_l_per_h ?? null);
    targets = {
      carbohydrate: setTarget(proposed.carbohydrate, input.targets?.carbohydrate),
      fluid: setTarget(proposed.fluid, input.targets?.fluid),
      sodium: setTarget(proposed.sodium, input.targets?.sodium),
    };
    schedule = buildSchedule({
      course,
      items,
      bottles: input.bottles,
      intakes: input.intakes,
      targets,
      start_clock: input.start_clock ?? null,
      body_mass_kg: input.body_mass_kg,
    });
  } catch (err) {
    asBadInput(err);
  }
  const stored: StoredSchedule = { course, items, schedule };
  return upsertFuelPlan(owner, {
    runner_id: runnerId,
    author_id: actor.id,
    body_mass_kg: input.body_mass_kg,
    expected_duration_s: course.duration_s,
    expected_duration_given: input.expected_duration_s !== undefined,
    easy_pace_s_per_km: input.easy_pace_s_per_km ?? null,
    start_clock: input.start_clock ?? null,
    sweat_l_per_h: input.sweat_l_per_h ?? null,
    targets,
    intakes: { rules: input.intakes, bottles: input.bottles } satisfies StoredIntakes,
    schedule: stored,
  });
}

async function readablePlan(actor: Actor, planId: string) {
  const plan = await findPlanById(planId);
  if (!plan) throw new NotFoundError('There is no plan with this id.');
  await assertCanReadRunner(actor, plan.runner_id, 'There is no plan with this id.');
  return plan;
}

export async function getPlanFuelPlan(actor: Actor, planId: string): Promise<FuelPlan | null> {
  const plan = await readablePlan(actor, planId);
  const row = await findFuelPlan({ plan_id: plan.id });
  return row ? present(row, plan.updated_at) : null;
}

export async function putPlanFuelPlan(actor: Actor, planId: string, input: FuelPlanInput): Promise<FuelPlan> {
  const plan = await readablePlan(actor, planId);
  await assertCanPlanFor(actor, plan.runner_id);
  const [goal, results] = await Promise.all([findGoalRace(plan.runner_id), listRaceResults(plan.runner_id)]);
  const paces = racePacesFor(
    goal ? { date: goal.date, distance_m: goal.distance_m, time_s: goal.goal_time_s } : null,
    results,
    plan.date,
  );
  const row = await saveFuelPlan(
    actor,
    plan.runner_id,
    { plan_id: plan.id },
    () => courseFromPlanItems(plan.items as PlanItem[], paces, input.easy_pace_s_per_km),
    input,
  );
  return present(row, plan.updated_at);
}

export async function removePlanFuelPlan(actor: Actor, planId: string): Promise<void> {
  const plan = await readablePlan(actor, planId);
  await assertCanPlanFor(actor, plan.runner_id);
  if (!(await deleteFuelPlan({ plan_id: plan.id }))) throw new NotFoundError('This plan has no fuel plan.');
}

export async function getGoalFuelPlan(actor: Actor, runnerId: string): Promise<FuelPlan | null> {
  await assertCanReadRunner(actor, runnerId);
  const [goal, row] = await Promise.all([findGoalRace(runnerId), findFuelPlan({ goal_race_user_id: runnerId })]);
  return row && goal ? present(row, goal.updated_at) : null;
}

export async function putGoalFuelPlan(actor: Actor, runnerId: string, input: FuelPlanInput): Promise<FuelPlan> {
  await assertCanPlanFor(actor, runnerId);
  const goal = await findGoalRace(runnerId);
  if (!goal) throw new AppError(422, 'no-goal-race', 'Set a goal race first: its distance and goal time time the fuel plan.');
  const row = await saveFuelPlan(
    actor,
    runnerId,
    { goal_race_user_id: runnerId },
    () => courseFromRace(goal.distance_m, goal.goal_time_s),
    input,
  );
  return present(row, goal.updated_at);
}

export async function removeGoalFuelPlan(actor: Actor, runnerId: string): Promise<void> {
  await assertCanPlanFor(actor, runnerId);
  if (!(await deleteFuelPlan({ goal_race_user_id: runnerId }))) throw new NotFoundError('Your goal race has no fuel plan.');
}

// ─── Fuel taken and check-in (per run) ─────────────────────────────────────────────────────

/** The run's owner writes; someone who may only read it (a coach, an admin) gets 403. */
async function ownRun(actor: Actor, runId: string): Promise<RunRow> {
  const run = await getReadableRun(actor, runId);
  if (run.user_id !== actor.id) throw new ForbiddenError('Only the runner records this for their run.');
  return run;
}

/** The fuel plan a run rehearsed: its session plan's (the chosen one, else the same day's), else on race day the goal race's. */
async function fuelPlanOfRun(run: Pick<RunRow, 'id' | 'user_id' | 'local_date'>): Promise<FuelPlanRow | null> {
  const link = await findRunPlanLink(run.id);
  const plan = link
    ? link.plan_id
      ? await findPlanById(link.plan_id)
      : undefined
    : await findFirstPlanOnDate(run.user_id, run.local_date);
  if (plan) {
    const row = await findFuelPlan({ plan_id: plan.id });
    if (row) return row;
  }
  const goal = await findGoalRace(run.user_id);
  if (goal && goal.date === run.local_date) return (await findFuelPlan({ goal_race_user_id: run.user_id })) ?? null;
  return null;
}

/** The totals of the fuel plan a run rehearsed (carbohydrate, fluid, sodium, caffeine), or null without one. */
export async function plannedFuelTotalsOf(run: Pick<RunRow, 'id' | 'user_id' | 'local_date'>): Promise<Amounts | null> {
  const plan = await fuelPlanOfRun(run);
  if (!plan) return null;
  const { carbohydrate_g, fluid_ml, sodium_mg, caffeine_mg } = (plan.schedule as StoredSchedule).schedule.totals;
  return { carbohydrate_g, fluid_ml, sodium_mg, caffeine_mg };
}

async function fuelTakenView(run: RunRow): Promise<FuelTakenView> {
  const [row, plan] = await Promise.all([findFuelTaken(run.id), fuelPlanOfRun(run)]);
  const entries = (row?.entries ?? []) as TakenEntry[];
  const planned = plan ? (plan.schedule as StoredSchedule).schedule : null;
  const topics: CautionTopic[] = ['fluid', 'sodium'];
  if (entries.some((e) => e.caffeine_mg > 0) || (planned?.totals.caffeine_mg ?? 0) > 0) topics.push('caffeine');
  return {
    fuel_taken: row
      ? {
          run_id: row.run_id,
          entries,
          stomach: row.stomach,
          energy: row.energy,
          notes: row.notes,
          updated_at: row.updated_at.toISOString(),
        }
      : null,
    planned_vs_taken:
      plan && planned
        ? {
            fuel_plan_id: plan.id,
            ...comparePlannedWithTaken(planned.intakes, entries, Math.max(run.elapsed_s, planned.duration_s)),
          }
        : null,
    cautions: row || plan ? cautionsFor(topics) : [],
  };
}

export async function getFuelTaken(actor: Actor, runId: string): Promise<FuelTakenView> {
  return fuelTakenView(await getReadableRun(actor, runId));
}

export async function putFuelTaken(actor: Actor, runId: string, input: FuelTakenInput): Promise<FuelTakenView> {
  const run = await ownRun(actor, runId);
  const ids = [...new Set(input.entries.flatMap((e) => (e.kind === 'item' ? [e.item_id] : [])))];
  const items = (await findFuelItemsByIds(actor.id, ids)).map(toFuelItem);
  // Drinks are resolved against the bottles of the fuel plan the run rehearsed; no plan, no bottles to name.
  const plan = input.entries.some((e) => e.kind === 'drink') ? await fuelPlanOfRun(run) : null;
  const bottles = plan ? (plan.schedule as StoredSchedule).schedule.bottles : [];
  const resolved = resolveTakenEntries(input.entries, items, bottles);
  if (!resolved.ok) {
    const field = `entries.${resolved.index}.${resolved.field}`;
    throw new ValidationError(resolved.message, [{ field, message: resolved.message }]);
  }
  await upsertFuelTaken(run.id, { entries: resolved.entries, stomach: input.stomach, energy: input.energy, notes: input.notes });
  return fuelTakenView(run);
}

function checkinView(row: RunCheckinRow | undefined): CheckinView {
  if (!row) return { checkin: null, cautions: [] };
  const cold =
    row.cold_water_temp_c !== null && row.cold_water_minutes !== null
      ? {
          water_temp_c: row.cold_water_temp_c,
          minutes: row.cold_water_minutes,
          notes: coldWaterNotes(row.cold_water_temp_c, row.cold_water_minutes),
        }
      : null;
  return {
    checkin: {
      run_id: row.run_id,
      sleep_hours: row.sleep_hours,
      soreness: row.soreness,
      mood: row.mood,
      walking_minutes: row.walking_minutes,
      mobility_minutes: row.mobility_minutes,
      cold_water: cold,
      notes: row.notes,
      updated_at: row.updated_at.toISOString(),
    },
    cautions: cold ? [CAUTIONS['cold water']] : [],
  };
}

export async function getCheckin(actor: Actor, runId: string): Promise<CheckinView> {
  const run = await getReadableRun(actor, runId);
  return checkinView(await findRunCheckin(run.id));
}

export async function putCheckin(actor: Actor, runId: string, input: CheckinInput, notices: NoticeDeps): Promise<CheckinView> {
  const run = await ownRun(actor, runId);
  const before = await findRunCheckin(run.id);
  const saved = checkinView(
    await upsertRunCheckin({
      run_id: run.id,
      sleep_hours: input.sleep_hours,
      soreness: input.soreness,
      mood: input.mood,
      walking_minutes: input.walking_minutes,
      mobility_minutes: input.mobility_minutes,
      cold_water_temp_c: input.cold_water?.water_temp_c ?? null,
      cold_water_minutes: input.cold_water?.minutes ?? null,
      notes: input.notes,
    }),
  );
  // Told once when soreness rises to 4–5, not again on each later edit of the same check-in.
  const rose = (input.soreness ?? 0) >= HIGH_SORENESS && (before?.soreness ?? 0) < HIGH_SORENESS;
  if (rose)
    await recordSorenessAlert(actor.id, run, input.soreness!, notices).catch((err: unknown) =>
      logger.error({ err, run: run.id }, 'recording a soreness alert failed'),
    );
  return saved;
}
