import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FuelItem, FuelItemAnswer, FuelItemInput } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';

export async function createFuelItem(input: FuelItemInput): Promise<FuelItem> {
  const { item } = await api.post<FuelItemAnswer>('/fuel-items', input);
  return item;
}

export function useCreateFuelItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createFuelItem,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fuelKeys.items() }),
  });
}
