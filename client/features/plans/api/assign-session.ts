import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AssignInput, AssignResult } from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

/** One session for each chosen runner on a date, all or nothing. */
export async function assignSession(body: AssignInput): Promise<AssignResult> {
  return api.post<AssignResult>('/plans/assign', body);
}

export function useAssignSession() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: assignSession,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.all }),
  });
}
