import { queryOptions, useQueries, useQuery } from '@tanstack/react-query';
import type { Plan, PlanListAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';
import { fuelPlanQueryOptions } from './get-fuel-plan.ts';
import type { FuelPlan } from '../../../../shared/fuel/answers.ts';

/** The session plans on one date (the candidates for the fuel plan a run rehearsed). */
export async function getSessionsOn(date: string): Promise<Plan[]> {
  const params = new URLSearchParams({ from: date, to: date });
  const { plans } = await api.get<PlanListAnswer>(`/plans?${params}`);
  return plans;
}

export const sessionsOnQueryOptions = (date: string) =>
  queryOptions({ queryKey: fuelKeys.sessionsOn(date), queryFn: () => getSessionsOn(date) });

/**
 * The fuel plan whose id the run's fuel-taken answer names: one of the day's session plans' fuel plans, or the goal
 * race's on race day. Undefined while looking or when none matches; no fuel plan is fetched without an id.
 */
export function useRunFuelPlan(localDate: string, fuelPlanId: string | null): FuelPlan | undefined {
  // Asked alongside the fuel-taken answer (not after it), so the planned intakes follow quickly.
  const sessions = useQuery(sessionsOnQueryOptions(localDate));
  const owners = fuelPlanId === null ? [] : [...(sessions.data ?? []).map((p) => ({ kind: 'plan' as const, planId: p.id }))];
  const candidates = useQueries({
    queries: [
      ...owners.map((owner) => fuelPlanQueryOptions(owner)),
      { ...fuelPlanQueryOptions({ kind: 'goal' }), enabled: fuelPlanId !== null },
    ],
  });
  return candidates.map((c) => c.data).find((p): p is FuelPlan => !!p && p.id === fuelPlanId);
}
