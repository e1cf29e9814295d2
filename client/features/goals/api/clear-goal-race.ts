import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

export async function clearGoalRace(): Promise<void> {
  await api.delete('/me/goal-race');
}

export function useClearGoalRace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: clearGoalRace,
    onSuccess: () => queryClient.setQueryData(goalKeys.goalRace(), null),
  });
}
