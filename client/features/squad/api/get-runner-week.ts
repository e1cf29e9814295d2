import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { weekKeys } from './week-keys.ts';

/** `start` is any day of the week (the server finds the runner's own week start), or null for this week. */
export async function getRunnerWeek(runnerId: string, start: string | null): Promise<RunnerWeek> {
  const query = start ? `?start=${encodeURIComponent(start)}` : '';
  return api.get<RunnerWeek>(`/runners/${encodeURIComponent(runnerId)}/week${query}`);
}

export const runnerWeekQueryOptions = (runnerId: string, start: string | null) =>
  queryOptions({ queryKey: weekKeys.detail(runnerId, start), queryFn: () => getRunnerWeek(runnerId, start) });

export function useRunnerWeek(runnerId: string, start: string | null): RunnerWeek {
  return useSuspenseQuery(runnerWeekQueryOptions(runnerId, start)).data;
}

/** The week as a CSV file the browser downloads itself. */
export const runnerWeekCsvHref = (runnerId: string, start: string) =>
  `/api/runners/${encodeURIComponent(runnerId)}/week.csv?start=${encodeURIComponent(start)}`;
