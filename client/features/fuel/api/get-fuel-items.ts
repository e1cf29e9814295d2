import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FuelItem, FuelItemListAnswer } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';

/** Fuel items: the signed-in user's own, or (for their coach) a squad runner's with `runnerId`. */
export async function getFuelItems(runnerId: string | null): Promise<FuelItem[]> {
  const query = runnerId ? `?${new URLSearchParams({ runner_id: runnerId })}` : '';
  const { items } = await api.get<FuelItemListAnswer>(`/fuel-items${query}`);
  return items;
}

export const fuelItemsQueryOptions = (runnerId: string | null = null) =>
  queryOptions({ queryKey: fuelKeys.itemList(runnerId), queryFn: () => getFuelItems(runnerId) });

export function useFuelItems(runnerId: string | null = null) {
  return useQuery(fuelItemsQueryOptions(runnerId));
}
