import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { EquivalentsQuery, EquivalentsResponse } from '../../../../shared/race/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { toolKeys } from './tool-keys.ts';

export async function getEquivalents(query: EquivalentsQuery): Promise<EquivalentsResponse> {
  const params = new URLSearchParams({ distance_m: String(query.distance_m), time_s: String(query.time_s) });
  return api.get<EquivalentsResponse>(`/tools/equivalents?${params}`);
}

// The answer depends on the query alone, so it never goes stale.
export const equivalentsQueryOptions = (query: EquivalentsQuery) =>
  queryOptions({ queryKey: toolKeys.equivalent(query), queryFn: () => getEquivalents(query), staleTime: Infinity });

/** Race equivalents for a result; keeps showing the previous table while a new result loads. */
export function useEquivalents(query: EquivalentsQuery) {
  return useQuery({ ...equivalentsQueryOptions(query), placeholderData: keepPreviousData });
}
