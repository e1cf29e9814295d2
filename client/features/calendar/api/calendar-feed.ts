import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeed, CalendarFeedStatus } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';

export const calendarFeedKeys = {
  all: ['calendar-feed'] as const,
  status: () => [...calendarFeedKeys.all, 'status'] as const,
};

export const calendarFeedQueryOptions = () =>
  queryOptions({ queryKey: calendarFeedKeys.status(), queryFn: () => api.get<CalendarFeedStatus>('/me/calendar') });

export function useCalendarFeedStatus() {
  return useQuery(calendarFeedQueryOptions());
}

/** Turns the feed on, or replaces its address (the old one stops working at once). */
export function useMakeCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<CalendarFeed>('/me/calendar'),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: calendarFeedKeys.all }),
  });
}

export function useTurnOffCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete('/me/calendar'),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: calendarFeedKeys.all }),
  });
}
