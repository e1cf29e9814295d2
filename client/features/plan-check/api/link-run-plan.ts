import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { planCheckKeys } from './plan-check-keys.ts';

/** A plan id, `null` for no plan, or `auto` to go back to the plan on the run's own date. */
export type PlanLink = string | null | 'auto';

export async function linkRunPlan({ runId, planId }: { runId: string; planId: PlanLink }): Promise<void> {
  await api.put(`/runs/${encodeURIComponent(runId)}/plan`, { plan_id: planId });
}

export function useLinkRunPlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: linkRunPlan,
    onSuccess: (_data, { runId }) => queryClient.invalidateQueries({ queryKey: planCheckKeys.detail(runId) }),
  });
}
