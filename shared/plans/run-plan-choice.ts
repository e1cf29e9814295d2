import type { CheckedPart } from './plan-check.ts';

/** The fields of a session plan the choice needs. */
export interface PlanForChoice {
  id: string;
  runner_id: string;
  date: string;
}

function dayKey(runnerId: string, date: string): string {
  return `${runnerId}|${date}`;
}

/**
 * The first plan of each runner's day, from plans already in the order "first" means (by date, then
 * creation). Looked up with `firstPlanOn`.
 */
export function firstPlanOfEachDay<P extends PlanForChoice>(plans: readonly P[]): ReadonlyMap<string, P> {
  const first = new Map<string, P>();
  for (const plan of plans) {
    const key = dayKey(plan.runner_id, plan.date);
    if (!first.has(key)) first.set(key, plan);
  }
  return first;
}

export function firstPlanOn<P>(firstOfDay: ReadonlyMap<string, P>, runnerId: string, date: string): P | undefined {
  return firstOfDay.get(dayKey(runnerId, date));
}

/**
 * The plan a run is compared with (DEVELOPERS.md, decision 26): the one chosen for it — or none when
 * "no plan" was chosen on purpose (a link without a plan) — else the first plan on the run's local date.
 */
export function planOfRun<P extends PlanForChoice>(
  run: { user_id: string; local_date: string },
  link: { plan_id: string | null } | undefined,
  plansById: ReadonlyMap<string, P>,
  firstOfDay: ReadonlyMap<string, P>,
): { plan: P | null; linked: 'chosen' | 'same day' | null } {
  if (link) {
    const plan = link.plan_id === null ? null : (plansById.get(link.plan_id) ?? null);
    return { plan, linked: plan ? 'chosen' : null };
  }
  const plan = firstPlanOn(firstOfDay, run.user_id, run.local_date) ?? null;
  return { plan, linked: plan ? 'same day' : null };
}

/**
 * Everything a run's plan check depends on besides the run's own series and device laps, which never
 * change after import: the run, the plan's parts with their targets resolved (so a new goal race or race
 * result that moves a race-named pace changes it) and the runner's tolerance. `checkVersion` names the
 * plan-check code itself. A stored result is reused only while this text (as a hash) is the same.
 */
export function planCheckInputsText(
  runId: string,
  parts: readonly CheckedPart[],
  tolerance: number,
  checkVersion: string,
): string {
  return JSON.stringify({ check: checkVersion, run_id: runId, tolerance, parts });
}
