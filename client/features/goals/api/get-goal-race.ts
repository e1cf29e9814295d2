import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GoalRace, GoalRaceAnswer } from '../../../../shared/goals/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

/** The signed-in runner's goal race, or null when none is set. */
export async function getGoalRace(runnerId?: string): Promise<GoalRace | null> {
  const query = runnerId ? `?runner_id=${encodeURIComponent(runnerId)}` : '';
  const { goal_race } = await api.get<GoalRaceAnswer>(`/me/goal-race${query}`);
  return goal_race;
}

export const goalRaceQueryOptions = (runnerId?: string) =>
  queryOptions({ queryKey: goalKeys.goalRace(runnerId), queryFn: () => getGoalRace(runnerId) });

export function useGoalRace() {
  return useQuery(goalRaceQueryOptions());
}
