import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { RunPage } from '../../../../shared/runs/types.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys, type RunListFilters } from './run-keys.ts';

/** Runs per page of the Log list. */
export const RUNS_PER_PAGE = 20;
/** The most the server returns in one page; a calendar month of runs fits in it. */
export const MAX_RUNS_PER_PAGE = 200;

export async function getRuns(filters: RunListFilters): Promise<RunPage> {
  const params = new URLSearchParams({ page: String(filters.page), per_page: String(filters.per_page) });
  if (filters.from) params.set('from', filters.from);
  if (filters.to) params.set('to', filters.to);
  if (filters.sort) params.set('sort', filters.sort);
  if (filters.order) params.set('order', filters.order);
  if (filters.runner_id) params.set('runner_id', filters.runner_id);
  if (filters.after) params.set('after', filters.after);
  return api.get<RunPage>(`/runs?${params}`);
}

export const runsQueryOptions = (filters: RunListFilters) =>
  queryOptions({ queryKey: runKeys.list(filters), queryFn: () => getRuns(filters) });

export function useRuns(filters: RunListFilters): RunPage {
  return useSuspenseQuery(runsQueryOptions(filters)).data;
}
