import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RaceResult, RaceResultAnswer, RaceResultInput } from '../../../../shared/goals/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

export async function addRaceResult(input: RaceResultInput): Promise<RaceResult> {
  const { result } = await api.post<RaceResultAnswer>('/me/race-results', input);
  return result;
}

export function useAddRaceResult() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addRaceResult,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: goalKeys.resultLists() }),
  });
}
