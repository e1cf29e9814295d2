import { createSortedRowModel, rowSortingFeature, sortFn_alphanumeric, sortFn_basic, tableFeatures } from '@tanstack/react-table';

/** How a column lines up: numbers right-aligned (tabular figures), words left. */
export type ColumnMeta = { align?: 'left' | 'right'; label?: string };

/** The features of every sortable table: client-side sorting of the rows it is given. */
export const sortableTableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  columnMeta: {} as ColumnMeta,
});

export type SortableTableFeatures = typeof sortableTableFeatures;
