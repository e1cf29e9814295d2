import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CheckinInput } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';
import type { CheckinView } from '../../../../shared/fuel/answers.ts';

export async function saveCheckin(runId: string, input: CheckinInput): Promise<CheckinView> {
  return api.put<CheckinView>(`/runs/${encodeURIComponent(runId)}/checkin`, input);
}

export function useSaveCheckin(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CheckinInput) => saveCheckin(runId, input),
    onSuccess: (view) => queryClient.setQueryData(fuelKeys.checkin(runId), view),
  });
}
