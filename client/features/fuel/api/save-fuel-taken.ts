import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FuelTakenInput } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';
import type { FuelTakenView } from '../../../../shared/fuel/answers.ts';

export async function saveFuelTaken(runId: string, input: FuelTakenInput): Promise<FuelTakenView> {
  return api.put<FuelTakenView>(`/runs/${encodeURIComponent(runId)}/fuel-taken`, input);
}

export function useSaveFuelTaken(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FuelTakenInput) => saveFuelTaken(runId, input),
    onSuccess: (view) => queryClient.setQueryData(fuelKeys.taken(runId), view),
  });
}
