import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

export async function deleteRun(id: string): Promise<void> {
  await api.delete(`/runs/${encodeURIComponent(id)}`);
}

export function useDeleteRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteRun,
    onSuccess: (_data, id) => {
      queryClient.removeQueries({ queryKey: runKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}
