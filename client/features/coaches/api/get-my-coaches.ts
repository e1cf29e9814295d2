import type { CoachAccess, CoachAccessListAnswer } from '../../../../shared/squads/schemas.ts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { coachKeys } from './coach-keys.ts';

export type { CoachAccess };

/** The coaches who can read the signed-in runner's data, one entry per squad that gives them access. */
export async function getMyCoaches(): Promise<CoachAccess[]> {
  const { coaches } = await api.get<CoachAccessListAnswer>('/me/coaches');
  return coaches;
}

export const myCoachesQueryOptions = () => queryOptions({ queryKey: coachKeys.lists(), queryFn: getMyCoaches });

export function useMyCoaches() {
  return useQuery(myCoachesQueryOptions());
}
