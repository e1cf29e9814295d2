export const goalKeys = {
  all: ['goals'] as const,
  /** The signed-in runner's goal race, or (coaches) a squad runner's with `runnerId`. */
  goalRace: (runnerId?: string) =>
    runnerId ? ([...goalKeys.all, 'goal-race', runnerId] as const) : ([...goalKeys.all, 'goal-race'] as const),
  resultLists: () => [...goalKeys.all, 'race-results'] as const,
};
