import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GoalRace, GoalRaceInput, SavedGoalRaceAnswer } from '../../../../shared/goals/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

export async function saveGoalRace(input: GoalRaceInput): Promise<GoalRace> {
  const { goal_race } = await api.put<SavedGoalRaceAnswer>('/me/goal-race', input);
  return goal_race;
}

export function useSaveGoalRace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveGoalRace,
    onSuccess: (goalRace) => queryClient.setQueryData(goalKeys.goalRace(), goalRace),
  });
}
