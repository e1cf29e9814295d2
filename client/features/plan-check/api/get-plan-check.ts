import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanCheckAnswer } from '../../../../shared/plans/plan-check-answer.ts';
import { api } from '../../../lib/api-client.ts';
import { planCheckKeys } from './plan-check-keys.ts';

/** `GET /api/runs/:id/plan-check`: the run against its session plan, paces in seconds per km. */
export async function getPlanCheck(runId: string): Promise<PlanCheckAnswer> {
  return api.get<PlanCheckAnswer>(`/runs/${encodeURIComponent(runId)}/plan-check`);
}

export const planCheckQueryOptions = (runId: string) =>
  queryOptions({ queryKey: planCheckKeys.detail(runId), queryFn: () => getPlanCheck(runId) });

/** Not suspended: the splits show at once, the plan check follows when it has been computed. */
export function usePlanCheck(runId: string) {
  return useQuery(planCheckQueryOptions(runId));
}

/** Files the browser downloads straight from the API (the session cookie goes along). */
export const planCheckDownloads = {
  csv: (runId: string) => `/api/runs/${encodeURIComponent(runId)}/plan-check.csv`,
};
