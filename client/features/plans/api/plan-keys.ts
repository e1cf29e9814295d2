export type PlanListFilters = { from: string; to: string };

export const planKeys = {
  all: ['plans'] as const,
  lists: () => [...planKeys.all, 'list'] as const,
  list: (filters: PlanListFilters) => [...planKeys.lists(), filters] as const,
};
