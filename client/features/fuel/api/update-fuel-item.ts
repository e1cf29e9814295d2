import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FuelItem, FuelItemAnswer, FuelItemPatch } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';

export async function updateFuelItem(id: string, patch: FuelItemPatch): Promise<FuelItem> {
  const { item } = await api.patch<FuelItemAnswer>(`/fuel-items/${encodeURIComponent(id)}`, patch);
  return item;
}

export function useUpdateFuelItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: FuelItemPatch }) => updateFuelItem(id, patch),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fuelKeys.items() }),
  });
}
