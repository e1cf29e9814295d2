import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Health } from '../../../../shared/api/health.ts';
import { api, isApiError } from '../../../lib/api-client.ts';
import { adminKeys } from './admin-keys.ts';

export type { Health };

export const HEALTH_REFRESH_MS = 30_000;

/** The service's own answer; a 503 still carries it (the database is down, the API is up). */
export async function getHealth(): Promise<Health> {
  try {
    return await api.get<Health>('/health');
  } catch (error) {
    if (isApiError(error, 503)) return { ok: false, db: 'down' };
    throw error;
  }
}

export const healthQueryOptions = () =>
  queryOptions({ queryKey: adminKeys.health(), queryFn: getHealth, refetchInterval: HEALTH_REFRESH_MS });

export function useHealth() {
  return useQuery(healthQueryOptions());
}
