export const weekKeys = {
  all: ['weeks'] as const,
  details: () => [...weekKeys.all, 'detail'] as const,
  /** All weeks of one runner (for invalidation after a note or a review). */
  runner: (runnerId: string) => [...weekKeys.details(), runnerId] as const,
  /** `start` is any day of the week, or null for the runner's current week. */
  detail: (runnerId: string, start: string | null) => [...weekKeys.runner(runnerId), start] as const,
};
