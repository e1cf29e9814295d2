import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';

export async function withdrawInvitation({ squadId, invitationId }: { squadId: string; invitationId: string }): Promise<void> {
  await api.delete(`/squads/${encodeURIComponent(squadId)}/invitations/${encodeURIComponent(invitationId)}`);
}

export function useWithdrawInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: withdrawInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: squadKeys.lists() }),
  });
}
