import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

/** Both are Mondays, `YYYY-MM-DD`: the seven days from `from_start` are copied onto those from `to_start`. */
export type CopyWeekBody = { from_start: string; to_start: string };

export async function copyWeek(body: CopyWeekBody): Promise<Plan[]> {
  const { plans } = await api.post<{ plans: Plan[] }>('/plans/copy-week', body);
  return plans;
}

export function useCopyWeek() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: copyWeek,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
