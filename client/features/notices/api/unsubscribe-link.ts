import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { UnsubscribeAnswer } from '../../../../shared/notices/schemas.ts';
import { api } from '../../../lib/api-client.ts';

export const unsubscribeLinkKeys = {
  all: ['unsubscribe-link'] as const,
  detail: (token: string) => [...unsubscribeLinkKeys.all, token] as const,
};

const linkPath = (token: string) => `/notices/unsubscribe/${encodeURIComponent(token)}`;

/** What an e-mailed unsubscribe link turns off and whether it is on now. Public: the link is signed. */
export const unsubscribeLinkQueryOptions = (token: string) =>
  queryOptions({ queryKey: unsubscribeLinkKeys.detail(token), queryFn: () => api.get<UnsubscribeAnswer>(linkPath(token)) });

export function useUnsubscribeLink(token: string) {
  return useQuery(unsubscribeLinkQueryOptions(token));
}

/** The same one-click request a mail program sends (RFC 8058), as JSON from our page. */
export function useUnsubscribe(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<UnsubscribeAnswer>(linkPath(token), { 'List-Unsubscribe': 'One-Click' }),
    onSuccess: (answer) => queryClient.setQueryData(unsubscribeLinkKeys.detail(token), answer),
    // A signed-in reader's profile switches have changed too.
    onSettled: () => queryClient.invalidateQueries({ predicate: (q) => q.queryKey[0] !== unsubscribeLinkKeys.all[0] }),
  });
}
