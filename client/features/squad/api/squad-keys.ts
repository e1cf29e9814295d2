export const squadKeys = {
  all: ['squads'] as const,
  lists: () => [...squadKeys.all, 'list'] as const,
  list: () => [...squadKeys.lists()] as const,
  overviews: () => [...squadKeys.all, 'overview'] as const,
  overview: (squadId: string, week: string) => [...squadKeys.overviews(), squadId, week] as const,
};
