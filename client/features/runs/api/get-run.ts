import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { SplitUnit } from '../../../../shared/tracks/types.ts';
import type { RunDetail } from '../../../../shared/runs/types.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

export async function getRun(id: string): Promise<RunDetail> {
  return api.get<RunDetail>(`/runs/${encodeURIComponent(id)}`);
}

export const runQueryOptions = (id: string) => queryOptions({ queryKey: runKeys.detail(id), queryFn: () => getRun(id) });

export function useRun(id: string): RunDetail {
  return useSuspenseQuery(runQueryOptions(id)).data;
}

/** Files the browser downloads straight from the API (the session cookie goes along). */
export const runDownloads = {
  splitsCsv: (id: string, unit: SplitUnit) => `/api/runs/${encodeURIComponent(id)}/splits.csv?unit=${unit}`,
  original: (id: string) => `/api/runs/${encodeURIComponent(id)}/original`,
};
