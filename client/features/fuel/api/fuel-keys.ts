/** Whose fuel plan: a session plan's, or the signed-in runner's goal race. */
export type FuelPlanOwner = { kind: 'plan'; planId: string } | { kind: 'goal' };

export const fuelKeys = {
  all: ['fuel'] as const,
  items: () => [...fuelKeys.all, 'items'] as const,
  itemList: (runnerId: string | null) => [...fuelKeys.items(), runnerId ?? 'mine'] as const,
  plans: () => [...fuelKeys.all, 'plans'] as const,
  plan: (owner: FuelPlanOwner) => [...fuelKeys.plans(), owner] as const,
  sessions: () => [...fuelKeys.all, 'session'] as const,
  session: (planId: string) => [...fuelKeys.sessions(), planId] as const,
  sessionsOn: (date: string) => [...fuelKeys.sessions(), 'on', date] as const,
  taken: (runId: string) => [...fuelKeys.all, 'taken', runId] as const,
  checkin: (runId: string) => [...fuelKeys.all, 'checkin', runId] as const,
};
