import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunTrack } from '../../../../shared/runs/types.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

export async function getRunTrack(id: string): Promise<RunTrack> {
  return api.get<RunTrack>(`/runs/${encodeURIComponent(id)}/track`);
}

// A run's series never changes after import.
export const runTrackQueryOptions = (id: string) =>
  queryOptions({ queryKey: runKeys.track(id), queryFn: () => getRunTrack(id), staleTime: Infinity });

/** Not suspended: the split table shows at once, charts and the outline follow when the series arrives. */
export function useRunTrack(id: string) {
  return useQuery(runTrackQueryOptions(id));
}
