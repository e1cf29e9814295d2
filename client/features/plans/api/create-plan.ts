import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Plan, PlanAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export type CreatePlanBody = { date: string; title?: string; notes?: string; text: string; runner_id?: string };

export async function createPlan(body: CreatePlanBody): Promise<Plan> {
  const { plan } = await api.post<PlanAnswer>('/plans', body);
  return plan;
}

export function useCreatePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPlan,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
