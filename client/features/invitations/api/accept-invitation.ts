import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Squad, SquadAnswer } from '../../../../shared/squads/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { invitationKeys } from './invitation-keys.ts';

export type JoinedSquad = Squad;

export async function acceptInvitation(token: string): Promise<JoinedSquad> {
  const { squad } = await api.post<SquadAnswer>(`/invitations/${encodeURIComponent(token)}/accept`);
  return squad;
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => acceptInvitation(token),
    // A refusal may mean the invitation changed meanwhile (used, withdrawn, expired): show its state now.
    onError: () => queryClient.invalidateQueries({ queryKey: invitationKeys.detail(token) }),
  });
}
