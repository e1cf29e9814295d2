import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PartCheck, PlanCheckResult } from '../../../../shared/plans/plan-check.ts';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planCheckKeys } from './plan-check-keys.ts';

/** `GET /api/runs/:id/plan-check`: the run against its session plan, paces in seconds per km. */
export interface PlanCheck extends Omit<PlanCheckResult, 'parts'> {
  plan_id: string | null;
  plan: Plan | null;
  /** How the plan was found: chosen by the runner, or the first plan on the run's local date. */
  linked: 'chosen' | 'same day' | null;
  /** Share of the target pace either side that still counts as on pace (0.02 = ±2 %). */
  tolerance: number;
  /** `unresolved`: why a race-named pace (@ MP …) could not be turned into a number. */
  parts: Array<PartCheck & { unresolved?: string }>;
}

export async function getPlanCheck(runId: string): Promise<PlanCheck> {
  return api.get<PlanCheck>(`/runs/${encodeURIComponent(runId)}/plan-check`);
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
