import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';
import type { SquadOverview } from './types.ts';

/** `week` is any day of the week; each runner's row covers their own week holding it. */
export async function getSquadOverview(squadId: string, week: string): Promise<SquadOverview> {
  return api.get<SquadOverview>(`/squads/${encodeURIComponent(squadId)}/overview?week=${encodeURIComponent(week)}`);
}

export const squadOverviewQueryOptions = (squadId: string, week: string) =>
  queryOptions({ queryKey: squadKeys.overview(squadId, week), queryFn: () => getSquadOverview(squadId, week) });

export function useSquadOverview(squadId: string, week: string): SquadOverview {
  return useSuspenseQuery(squadOverviewQueryOptions(squadId, week)).data;
}

/** The overview as a CSV file the browser downloads itself (the session cookie goes along). */
export const squadOverviewCsvHref = (squadId: string, week: string) =>
  `/api/squads/${encodeURIComponent(squadId)}/overview.csv?week=${encodeURIComponent(week)}`;
