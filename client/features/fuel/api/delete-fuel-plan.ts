import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys, type FuelPlanOwner } from './fuel-keys.ts';
import { fuelPlanPath } from './get-fuel-plan.ts';

export async function deleteFuelPlan(owner: FuelPlanOwner): Promise<void> {
  await api.delete(fuelPlanPath(owner));
}

export function useDeleteFuelPlan(owner: FuelPlanOwner) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteFuelPlan(owner),
    onSuccess: () => queryClient.setQueryData(fuelKeys.plan(owner), null),
  });
}
