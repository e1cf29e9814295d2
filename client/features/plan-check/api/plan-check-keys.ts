export type PlanRange = { from: string; to: string };

export const planCheckKeys = {
  all: ['plan-check'] as const,
  details: () => [...planCheckKeys.all, 'detail'] as const,
  detail: (runId: string) => [...planCheckKeys.details(), runId] as const,
  /** The runner's own plans near a run, offered for linking. */
  planLists: () => [...planCheckKeys.all, 'plans'] as const,
  planList: (range: PlanRange) => [...planCheckKeys.planLists(), range] as const,
};
