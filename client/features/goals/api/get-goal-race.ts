import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GoalRace } from '../../../../shared/goals/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

/** The signed-in runner's goal race, or null when none is set. */
export async function getGoalRace(): Promise<GoalRace | null> {
  const { goal_race } = await api.get<{ goal_race: GoalRace | null }>('/me/goal-race');
  return goal_race;
}

export const goalRaceQueryOptions = () => queryOptions({ queryKey: goalKeys.goalRace(), queryFn: getGoalRace });

export function useGoalRace() {
  return useQuery(goalRaceQueryOptions());
}
