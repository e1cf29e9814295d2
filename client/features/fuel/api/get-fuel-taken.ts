import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';
import type { FuelTakenView } from '../../../../shared/fuel/answers.ts';

/** What was taken on a run, and planned vs taken per hour when the run's session or race has a fuel plan. */
export async function getFuelTaken(runId: string): Promise<FuelTakenView> {
  return api.get<FuelTakenView>(`/runs/${encodeURIComponent(runId)}/fuel-taken`);
}

export const fuelTakenQueryOptions = (runId: string) =>
  queryOptions({ queryKey: fuelKeys.taken(runId), queryFn: () => getFuelTaken(runId) });

export function useFuelTaken(runId: string) {
  return useQuery(fuelTakenQueryOptions(runId));
}
