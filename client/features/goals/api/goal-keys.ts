export const goalKeys = {
  all: ['goals'] as const,
  goalRace: () => [...goalKeys.all, 'goal-race'] as const,
  resultLists: () => [...goalKeys.all, 'race-results'] as const,
};
