import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys, type FuelPlanOwner } from './fuel-keys.ts';
import type { FuelPlan, FuelPlanAnswer } from '../../../../shared/fuel/answers.ts';

/** The API path of a fuel plan. */
export function fuelPlanPath(owner: FuelPlanOwner): string {
  return owner.kind === 'plan' ? `/plans/${encodeURIComponent(owner.planId)}/fuel-plan` : '/me/goal-race/fuel-plan';
}

/** A session plan's or the goal race's fuel plan; null when none is saved yet. */
export async function getFuelPlan(owner: FuelPlanOwner): Promise<FuelPlan | null> {
  const { fuel_plan } = await api.get<FuelPlanAnswer>(fuelPlanPath(owner));
  return fuel_plan;
}

export const fuelPlanQueryOptions = (owner: FuelPlanOwner) =>
  queryOptions({ queryKey: fuelKeys.plan(owner), queryFn: () => getFuelPlan(owner) });

export function useFuelPlan(owner: FuelPlanOwner): FuelPlan | null {
  return useSuspenseQuery(fuelPlanQueryOptions(owner)).data;
}
