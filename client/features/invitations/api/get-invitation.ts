import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InvitationPreviewSchema } from '../../../../shared/squads/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { invitationKeys } from './invitation-keys.ts';

export type InvitationPreview = z.output<typeof InvitationPreviewSchema>;

/** What an invitation link is for; a forged link answers 400 with a sentence. Public: no sign-in needed. */
export function getInvitation(token: string): Promise<InvitationPreview> {
  return api.get<InvitationPreview>(`/invitations/${encodeURIComponent(token)}`);
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: invitationKeys.detail(token), queryFn: () => getInvitation(token) });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
