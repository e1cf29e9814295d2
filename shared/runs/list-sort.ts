import { ListRunsQuerySchema, type RunListOrder, type RunListSort } from './schemas.ts';

/** How the runs list is ordered: one of the API's sorts and a direction. */
export type RunListSorting = { sort: RunListSort; order: RunListOrder };

/** The list's order when nothing is asked for (the API's defaults): newest first. */
export const DEFAULT_RUN_LIST_SORTING: RunListSorting = { sort: 'date', order: 'desc' };

const SortingFromAddressSchema = ListRunsQuerySchema.pick({ sort: true, order: true });

/**
 * The sorting in a page address (`?sort=…&order=…`). An address is typed or shared by people, so an
 * unknown value falls back to the default instead of breaking the page.
 */
export function readRunListSorting(sort: string | null, order: string | null): RunListSorting {
  const parsed = SortingFromAddressSchema.safeParse({ sort: sort ?? undefined, order: order ?? undefined });
  if (parsed.success) return parsed.data;
  const sortOnly = SortingFromAddressSchema.safeParse({ sort: sort ?? undefined });
  return sortOnly.success ? sortOnly.data : DEFAULT_RUN_LIST_SORTING;
}

export function isDefaultRunListSorting(sorting: RunListSorting): boolean {
  return sorting.sort === DEFAULT_RUN_LIST_SORTING.sort && sorting.order === DEFAULT_RUN_LIST_SORTING.order;
}

const ORDER_WORDS: Record<RunListSort, Record<RunListOrder, string>> = {
  date: { desc: 'newest first', asc: 'oldest first' },
  distance: { desc: 'longest first', asc: 'shortest first' },
  duration: { desc: 'most moving time first', asc: 'least moving time first' },
  pace: { asc: 'fastest pace first', desc: 'slowest pace first' },
};

/** The order in words for the list's description, e.g. "fastest pace first". */
export function describeRunListSorting({ sort, order }: RunListSorting): string {
  return ORDER_WORDS[sort][order];
}

/** Labels of the pager's back and forward links: by date they say which way time goes. */
export function runListPagerLabels({ sort, order }: RunListSorting): { back: string; forward: string } {
  if (sort !== 'date') return { back: 'Previous', forward: 'Next' };
  return order === 'desc' ? { back: 'Newer', forward: 'Older' } : { back: 'Older', forward: 'Newer' };
}
