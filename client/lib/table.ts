import { createSortedRowModel, rowSortingFeature, sortFn_alphanumeric, sortFn_basic, tableFeatures } from '@tanstack/react-table';

/**
 * How a column shows: numbers right-aligned (tabular figures), words left. `primary` columns are the
 * ones a phone shows (a table with any primary column hides the rest below 640 px and opens a row
 * into them); `label` names the column in words where its header is a symbol or a component.
 */
export type ColumnMeta = { align?: 'left' | 'right'; label?: string; primary?: boolean };

/** The features of every sortable table: client-side sorting of the rows it is given. */
export const sortableTableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  columnMeta: {} as ColumnMeta,
});

export type SortableTableFeatures = typeof sortableTableFeatures;
