import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';
import type { SquadDetail } from './types.ts';
import type { SquadListAnswer } from '../../../../shared/squads/schemas.ts';

export async function getSquads(): Promise<SquadDetail[]> {
  const { squads } = await api.get<SquadListAnswer>('/squads');
  return squads;
}

export const squadsQueryOptions = () => queryOptions({ queryKey: squadKeys.list(), queryFn: getSquads });

/** Squads the user coaches or belongs to; members and invitations only on those they coach. */
export function useSquads(): SquadDetail[] {
  return useSuspenseQuery(squadsQueryOptions()).data;
}
