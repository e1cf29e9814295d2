import { queryOptions, useMutation, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import type { PaceToleranceAnswer, RunnerSummary, RunnerSummaryAnswer } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export async function getRunnerSummary(runnerId: string): Promise<RunnerSummary> {
  const { runner } = await api.get<RunnerSummaryAnswer>(`/runners/${encodeURIComponent(runnerId)}`);
  return runner;
}

export const runnerSummaryQueryOptions = (runnerId: string) =>
  queryOptions({ queryKey: planKeys.runner(runnerId), queryFn: () => getRunnerSummary(runnerId) });

export function useRunnerSummary(runnerId: string): RunnerSummary {
  return useSuspenseQuery(runnerSummaryQueryOptions(runnerId)).data;
}

/** The runner or their coach sets the plan-check tolerance (a share: 0.02 = ±2 %). */
export async function setPaceTolerance({ runnerId, pace_tolerance }: { runnerId: string; pace_tolerance: number }) {
  return api.put<PaceToleranceAnswer>(`/runners/${encodeURIComponent(runnerId)}/pace-tolerance`, { pace_tolerance });
}

export function useSetPaceTolerance() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setPaceTolerance,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
