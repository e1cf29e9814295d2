import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Plan, PlanListAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planCheckKeys, type PlanRange } from './plan-check-keys.ts';

/** The signed-in runner's own session plans between two dates (inclusive). */
export async function getPlansNear(range: PlanRange): Promise<Plan[]> {
  const { plans } = await api.get<PlanListAnswer>(`/plans?${new URLSearchParams(range)}`);
  return plans;
}

export const plansNearQueryOptions = (range: PlanRange) =>
  queryOptions({ queryKey: planCheckKeys.planList(range), queryFn: () => getPlansNear(range) });

/** Only asked for when `enabled` (the run's owner, who alone can link it). */
export function usePlansNear(range: PlanRange, enabled: boolean) {
  return useQuery({ ...plansNearQueryOptions(range), enabled });
}
