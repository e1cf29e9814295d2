import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Plan, PlanAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export type UpdatePlanBody = { date?: string; title?: string; notes?: string; text?: string };

export async function updatePlan({ id, ...body }: UpdatePlanBody & { id: string }): Promise<Plan> {
  const { plan } = await api.patch<PlanAnswer>(`/plans/${encodeURIComponent(id)}`, body);
  return plan;
}

export function useUpdatePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePlan,
    onSuccess: (plan) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: planKeys.all }),
        queryClient.invalidateQueries({ queryKey: planKeys.changes(plan.id) }),
      ]),
  });
}
