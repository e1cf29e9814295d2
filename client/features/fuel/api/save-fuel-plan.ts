import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FuelPlanInput } from '../../../../shared/fuel/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys, type FuelPlanOwner } from './fuel-keys.ts';
import { fuelPlanPath } from './get-fuel-plan.ts';
import type { FuelPlan, SavedFuelPlanAnswer } from '../../../../shared/fuel/answers.ts';

/** Saves the inputs; the server computes the schedule, hourly totals, meals and cautions and returns them. */
export async function saveFuelPlan(owner: FuelPlanOwner, input: FuelPlanInput): Promise<FuelPlan> {
  const { fuel_plan } = await api.put<SavedFuelPlanAnswer>(fuelPlanPath(owner), input);
  return fuel_plan;
}

export function useSaveFuelPlan(owner: FuelPlanOwner) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FuelPlanInput) => saveFuelPlan(owner, input),
    onSuccess: (plan) => {
      queryClient.setQueryData(fuelKeys.plan(owner), plan);
      // Planned vs taken on run pages follows the plan.
      void queryClient.invalidateQueries({ queryKey: [...fuelKeys.all, 'taken'] });
    },
  });
}
