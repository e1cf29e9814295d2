import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanChange, PlanChangesAnswer } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export async function getPlanChanges(planId: string): Promise<PlanChange[]> {
  const { changes } = await api.get<PlanChangesAnswer>(`/plans/${encodeURIComponent(planId)}/changes`);
  return changes;
}

export const planChangesQueryOptions = (planId: string) =>
  queryOptions({ queryKey: planKeys.changes(planId), queryFn: () => getPlanChanges(planId) });

export function usePlanChanges(planId: string) {
  return useQuery(planChangesQueryOptions(planId));
}
