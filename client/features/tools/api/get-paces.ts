import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PacesQuery, PacesResponse } from '../../../../shared/race/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { toolKeys } from './tool-keys.ts';

export async function getPaces(query: PacesQuery): Promise<PacesResponse> {
  const params = new URLSearchParams({
    distance_m: String(query.distance_m),
    time_s: String(query.time_s),
    unit: query.unit,
    negative_split_s: String(query.negative_split_s),
  });
  return api.get<PacesResponse>(`/tools/paces?${params}`);
}

// The answer depends on the query alone, so it never goes stale.
export const pacesQueryOptions = (query: PacesQuery) =>
  queryOptions({ queryKey: toolKeys.pace(query), queryFn: () => getPaces(query), staleTime: Infinity });

/** Pace, split table and training pace ranges for a goal or result; keeps the previous answer on screen while loading. */
export function usePaces(query: PacesQuery) {
  return useQuery({ ...pacesQueryOptions(query), placeholderData: keepPreviousData });
}
