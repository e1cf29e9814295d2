import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RaceResult, RaceResultListAnswer } from '../../../../shared/goals/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { goalKeys } from './goal-keys.ts';

/** The signed-in runner's race results, newest first. */
export async function getRaceResults(): Promise<RaceResult[]> {
  const { results } = await api.get<RaceResultListAnswer>('/me/race-results');
  return results;
}

export const raceResultsQueryOptions = () => queryOptions({ queryKey: goalKeys.resultLists(), queryFn: getRaceResults });

export function useRaceResults() {
  return useQuery(raceResultsQueryOptions());
}
