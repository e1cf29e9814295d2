import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InvitationAnswer, InvitationSchema, InviteInputSchema } from '../../../../shared/squads/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';

type Invitation = z.output<typeof InvitationSchema>;

export async function inviteRunner(squadId: string, input: z.output<typeof InviteInputSchema>): Promise<Invitation> {
  const { invitation } = await api.post<InvitationAnswer>(`/squads/${encodeURIComponent(squadId)}/invitations`, input);
  return invitation;
}

export function useInviteRunner(squadId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof InviteInputSchema>) => inviteRunner(squadId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: squadKeys.lists() }),
  });
}
