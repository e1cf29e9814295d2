import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';

export async function deleteFuelItem(id: string): Promise<void> {
  await api.delete(`/fuel-items/${encodeURIComponent(id)}`);
}

export function useDeleteFuelItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteFuelItem,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fuelKeys.items() }),
  });
}
