import { describe, expect, it } from 'vitest';
import {
  DEFAULT_RUN_LIST_SORTING,
  describeRunListSorting,
  isDefaultRunListSorting,
  readRunListSorting,
  runListPagerLabels,
} from '../../../../shared/runs/list-sort.ts';

describe('readRunListSorting', () => {
  it('reads a known sort and order from the address', () => {
    expect(readRunListSorting('pace', 'asc')).toEqual({ sort: 'pace', order: 'asc' });
  });

  it('uses newest first when the address says nothing', () => {
    expect(readRunListSorting(null, null)).toEqual(DEFAULT_RUN_LIST_SORTING);
    expect(DEFAULT_RUN_LIST_SORTING).toEqual({ sort: 'date', order: 'desc' });
  });

  it('keeps a known sort when only the order is unknown, and falls back to the default for an unknown sort', () => {
    expect(readRunListSorting('distance', 'sideways')).toEqual({ sort: 'distance', order: 'desc' });
    expect(readRunListSorting('heart_rate', 'asc')).toEqual(DEFAULT_RUN_LIST_SORTING);
  });
});

describe('describing the order', () => {
  it('names the order in words and tells the default apart', () => {
    expect(describeRunListSorting({ sort: 'pace', order: 'asc' })).toBe('fastest pace first');
    expect(describeRunListSorting({ sort: 'date', order: 'desc' })).toBe('newest first');
    expect(isDefaultRunListSorting({ sort: 'date', order: 'desc' })).toBe(true);
    expect(isDefaultRunListSorting({ sort: 'date', order: 'asc' })).toBe(false);
  });

  it('labels the pager by time only when the list is by date', () => {
    expect(runListPagerLabels({ sort: 'date', order: 'desc' })).toEqual({ back: 'Newer', forward: 'Older' });
    expect(runListPagerLabels({ sort: 'date', order: 'asc' })).toEqual({ back: 'Older', forward: 'Newer' });
    expect(runListPagerLabels({ sort: 'distance', order: 'desc' })).toEqual({ back: 'Previous', forward: 'Next' });
  });
});
