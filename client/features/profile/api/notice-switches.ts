import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NoticeKind } from '../../../../shared/notices/kinds.ts';
import type { NoticeSwitches, NoticeSwitchesAnswer } from '../../../../shared/notices/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { profileKeys } from './profile-keys.ts';

export const noticeSwitchesQueryOptions = () =>
  queryOptions({
    queryKey: profileKeys.notices(),
    queryFn: async () => (await api.get<NoticeSwitchesAnswer>('/me/notices')).switches,
  });

/** Which notice e-mails the signed-in user gets, one switch per kind (`GET /api/me/notices`). */
export function useNoticeSwitches() {
  return useQuery(noticeSwitchesQueryOptions());
}

/**
 * Turns one kind of notice e-mail on or off. Each switch has its own mutation, so its saved or
 * failed message stays beside it; the answer holds every switch and replaces the cached ones.
 */
export function useSetNoticeSwitch(kind: NoticeKind) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (on: boolean) => (await api.patch<NoticeSwitchesAnswer>('/me/notices', { [kind]: on })).switches,
    onSuccess: (switches: NoticeSwitches) => queryClient.setQueryData(profileKeys.notices(), switches),
    // The profile answer repeats two of the switches (notify_on_import, notify_on_plan_change).
    onSettled: () => queryClient.invalidateQueries({ queryKey: profileKeys.mine() }),
  });
}
