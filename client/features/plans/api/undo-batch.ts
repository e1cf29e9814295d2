import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

/** Undoes a copied week or an applied library session. */
export async function undoBatch(batchId: string): Promise<void> {
  await api.delete(`/plans/batches/${encodeURIComponent(batchId)}`);
}

export function useUndoBatch() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: undoBatch,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
