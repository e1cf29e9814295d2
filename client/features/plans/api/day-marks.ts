import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DayMark, DayMarkAnswer, DayMarkListAnswer, PutDayMarkInput } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys, type PlanListFilters } from './plan-keys.ts';

export async function getDayMarks(filters: PlanListFilters): Promise<DayMark[]> {
  const params = new URLSearchParams({ from: filters.from, to: filters.to });
  if (filters.runner_id) params.set('runner_id', filters.runner_id);
  const { day_marks } = await api.get<DayMarkListAnswer>(`/days?${params}`);
  return day_marks;
}

export const dayMarksQueryOptions = (filters: PlanListFilters) =>
  queryOptions({ queryKey: planKeys.dayMarks(filters), queryFn: () => getDayMarks(filters) });

export function useDayMarks(filters: PlanListFilters) {
  return useQuery(dayMarksQueryOptions(filters));
}

export async function putDayMark({ date, ...body }: PutDayMarkInput & { date: string }): Promise<DayMark> {
  const { day_mark } = await api.put<DayMarkAnswer>(`/days/${encodeURIComponent(date)}`, body);
  return day_mark;
}

export async function deleteDayMark({ date, runner_id }: { date: string; runner_id?: string }): Promise<void> {
  const query = runner_id ? `?runner_id=${encodeURIComponent(runner_id)}` : '';
  await api.delete(`/days/${encodeURIComponent(date)}${query}`);
}

export function usePutDayMark() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: putDayMark, onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }) });
}

export function useDeleteDayMark() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deleteDayMark, onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }) });
}
