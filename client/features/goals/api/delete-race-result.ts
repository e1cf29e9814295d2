import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

export async function deleteRaceResult(id: string): Promise<void> {
  await api.delete(`/me/race-results/${encodeURIComponent(id)}`);
}

export function useDeleteRaceResult() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteRaceResult,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: goalKeys.resultLists() }),
  });
}
