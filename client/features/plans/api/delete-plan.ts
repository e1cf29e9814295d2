import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export async function deletePlan(id: string): Promise<void> {
  await api.delete(`/plans/${encodeURIComponent(id)}`);
}

export function useDeletePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePlan,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
