import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ImportProgress } from '../../../../shared/history/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { importKeys } from './import-keys.ts';

/** How often a running import is asked for its progress. */
const POLL_MS = 1000;

export async function getImport(id: string): Promise<ImportProgress> {
  return api.get<ImportProgress>(`/imports/${encodeURIComponent(id)}`);
}

export function isImportFinished(progress: ImportProgress | undefined): boolean {
  return progress?.status === 'done' || progress?.status === 'failed';
}

/** Polls while the import is queued or running, then stops. */
export const importQueryOptions = (id: string) =>
  queryOptions({
    queryKey: importKeys.detail(id),
    queryFn: () => getImport(id),
    refetchInterval: (query) => (isImportFinished(query.state.data) || query.state.error ? false : POLL_MS),
    retry: false,
  });

export function useImport(id: string) {
  return useQuery(importQueryOptions(id));
}
