import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';

export async function removeMember({ squadId, runnerId }: { squadId: string; runnerId: string }): Promise<void> {
  await api.delete(`/squads/${encodeURIComponent(squadId)}/members/${encodeURIComponent(runnerId)}`);
}

export function useRemoveMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeMember,
    // The member list and every overview row list change.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: squadKeys.all }),
  });
}
