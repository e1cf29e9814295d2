import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { Plan, PlanListAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys, type PlanListFilters } from './plan-keys.ts';

export async function getPlans(filters: PlanListFilters): Promise<Plan[]> {
  const params = new URLSearchParams({ from: filters.from, to: filters.to });
  if (filters.runner_id) params.set('runner_id', filters.runner_id);
  const { plans } = await api.get<PlanListAnswer>(`/plans?${params}`);
  return plans;
}

export const plansQueryOptions = (filters: PlanListFilters) =>
  queryOptions({ queryKey: planKeys.list(filters), queryFn: () => getPlans(filters) });

export function usePlans(filters: PlanListFilters): Plan[] {
  return useSuspenseQuery(plansQueryOptions(filters)).data;
}
