import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { UnreadAnswer } from '../../../../shared/notes/schemas.ts';
import { api } from '../../../lib/api-client.ts';

export const unreadKeys = { all: ['unread'] as const };

/** How often the navigation asks for new notes while a page is open (a note is rarely urgent to the second). */
const REFRESH_MS = 60_000;

export const unreadQueryOptions = () =>
  queryOptions({
    queryKey: unreadKeys.all,
    queryFn: () => api.get<UnreadAnswer>('/me/unread'),
    refetchInterval: REFRESH_MS,
  });

/** Notes the other side wrote that the signed-in user has not opened; undefined while loading. */
export function useUnread(enabled = true): UnreadAnswer | undefined {
  return useQuery({ ...unreadQueryOptions(), enabled }).data;
}

/**
 * Marks notes opened. The page that shows them keeps its "new" markers for this visit (so the reader sees
 * what was new); the navigation count drops at once, and the markers are gone the next time.
 */
export function useMarkNotesRead() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (ids: readonly string[]) => {
      for (const id of ids) await api.post<void>(`/notes/${encodeURIComponent(id)}/read`);
    },
    // A count fetched while the page opened (before these were marked) must not land after them: drop
    // it, take the opened notes out of the count at once, then ask the server again.
    onSuccess: async (_done, ids) => {
      await queryClient.cancelQueries({ queryKey: unreadKeys.all });
      queryClient.setQueryData<UnreadAnswer>(unreadKeys.all, (old) => {
        if (!old) return old;
        const items = old.items.filter((i) => !ids.includes(i.id));
        return { ...old, items, count: Math.max(0, old.count - (old.items.length - items.length)) };
      });
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: unreadKeys.all }),
  });
}
