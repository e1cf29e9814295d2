import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CopyWeekInput, PlanBatchResult } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

/**
 * Copies the seven days from `from_start` onto those from `to_start`. Onto a week with sessions the
 * server answers 409 (`week-has-sessions`) unless `mode` is "replace" or "add".
 */
export async function copyWeek(body: CopyWeekInput): Promise<PlanBatchResult> {
  return api.post<PlanBatchResult>('/plans/copy-week', body);
}

export function useCopyWeek() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: copyWeek,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
