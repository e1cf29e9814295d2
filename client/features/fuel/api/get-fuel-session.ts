import { queryOptions } from '@tanstack/react-query';
import type { Plan, PlanAnswer } from '../../../../shared/plans/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { fuelKeys } from './fuel-keys.ts';

/** The session plan a fuel plan is for (its date, title and parts). */
export async function getFuelSession(planId: string): Promise<Plan> {
  const { plan } = await api.get<PlanAnswer>(`/plans/${encodeURIComponent(planId)}`);
  return plan;
}

export const fuelSessionQueryOptions = (planId: string) =>
  queryOptions({ queryKey: fuelKeys.session(planId), queryFn: () => getFuelSession(planId) });
