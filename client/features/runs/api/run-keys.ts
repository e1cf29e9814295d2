import type { RunListOrder, RunListSort } from '../../../../shared/runs/schemas.ts';

/** The sort and order are part of the key: each order of the list is its own cached set of pages. */
export type RunListFilters = {
  page: number;
  per_page: number;
  from?: string;
  to?: string;
  sort?: RunListSort;
  order?: RunListOrder;
  /** Keyset paging: the runs after this `next_cursor` (with `page` 1, as the server asks). */
  after?: string;
  /** A squad runner's runs (coaches). */
  runner_id?: string;
};

export const runKeys = {
  all: ['runs'] as const,
  lists: () => [...runKeys.all, 'list'] as const,
  list: (filters: RunListFilters) => [...runKeys.lists(), filters] as const,
  details: () => [...runKeys.all, 'detail'] as const,
  detail: (id: string) => [...runKeys.details(), id] as const,
  track: (id: string) => [...runKeys.detail(id), 'track'] as const,
};
