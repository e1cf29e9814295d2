/** `runner_id`: a squad runner's plan (coaches); without it, the signed-in person's own. */
export type PlanListFilters = { from: string; to: string; runner_id?: string };

export const planKeys = {
  all: ['plans'] as const,
  lists: () => [...planKeys.all, 'list'] as const,
  list: (filters: PlanListFilters) => [...planKeys.lists(), filters] as const,
  /** Outside `all`, so deleting a session does not refetch its (gone) record of changes. */
  changes: (planId: string) => ['plan-changes', planId] as const,
  library: () => [...planKeys.all, 'library'] as const,
  dayMarks: (filters: PlanListFilters) => [...planKeys.all, 'day-marks', filters] as const,
  runner: (runnerId: string) => [...planKeys.all, 'runner', runnerId] as const,
};
