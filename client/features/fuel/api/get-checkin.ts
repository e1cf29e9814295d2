import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';
import type { CheckinView } from '../../../../shared/fuel/answers.ts';

/** The after-run check-in of a run (sleep, soreness, mood, recovery work), with the cold-water caution when used. */
export async function getCheckin(runId: string): Promise<CheckinView> {
  return api.get<CheckinView>(`/runs/${encodeURIComponent(runId)}/checkin`);
}

export const checkinQueryOptions = (runId: string) =>
  queryOptions({ queryKey: fuelKeys.checkin(runId), queryFn: () => getCheckin(runId) });

export function useCheckin(runId: string) {
  return useQuery(checkinQueryOptions(runId));
}
