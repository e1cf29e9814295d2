import type { Column, ReactTable, Row, RowData } from '@tanstack/react-table';
import { Fragment, useId, type ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';
import type { SortableTableFeatures } from '../../lib/table.ts';
import { MoreButtonCell, MoreHeaderCell, RowDetailsRow, useOpenRows } from './table-row-details.tsx';

type DataTableProps<TData extends RowData> = {
  table: ReactTable<SortableTableFeatures, TData>;
  caption: string;
  /** Tailwind min-width class from 640 px up: below it the table scrolls sideways inside its card. */
  minWidth?: string;
  rowClassName?: (row: Row<SortableTableFeatures, TData>) => string | undefined;
  /** Column id whose cells are row headers (`<th scope="row">`). */
  rowHeader?: string;
  /** Names a row in words for the phone's "more" button ("Split 3"). */
  rowLabel?: (row: Row<SortableTableFeatures, TData>) => string;
  /** A line under a row across the whole table (e.g. a part's note). */
  rowNote?: (row: Row<SortableTableFeatures, TData>) => ReactNode;
};

const ARIA_SORT = { asc: 'ascending', desc: 'descending' } as const;

/** The min-width classes from 640 px up, spelled out so Tailwind finds them. */
const FROM_SM: Record<string, string> = {
  'min-w-md': 'sm:min-w-md',
  'min-w-lg': 'sm:min-w-lg',
  'min-w-xl': 'sm:min-w-xl',
  'min-w-2xl': 'sm:min-w-2xl',
  'min-w-3xl': 'sm:min-w-3xl',
};

/** A column's name in words: its `meta.label`, else its header when that is text. */
export function columnLabel<TData extends RowData>(column: Column<SortableTableFeatures, TData>): string {
  const header = column.columnDef.header;
  return column.columnDef.meta?.label ?? (typeof header === 'string' ? header : column.id);
}

/**
 * A dense table with sortable headers (buttons, so they are keyboard reachable, with `aria-sort`).
 *
 * Phones (below 640 px): when some columns are marked `meta.primary`, only those show (their cells
 * carry `data-primary`, which the page audit checks lie on screen); a "more" button at the end of
 * each row opens the other columns under it as label–value lines, and a "Sort by" select replaces
 * the header buttons of the hidden columns. Wider screens show every column.
 */
export function DataTable<TData extends RowData>({
  table,
  caption,
  minWidth = 'min-w-lg',
  rowClassName,
  rowHeader,
  rowLabel,
  rowNote,
}: DataTableProps<TData>) {
  const open = useOpenRows();
  const baseId = useId();
  const columns = table.getAllLeafColumns();
  const responsive = columns.some((c) => c.columnDef.meta?.primary);
  const isPrimary = (column: Column<SortableTableFeatures, TData>) => !responsive || column.columnDef.meta?.primary === true;
  const phoneColumns = columns.filter(isPrimary).length + (responsive ? 1 : 0);
  const hideOnPhone = (column: Column<SortableTableFeatures, TData>) => (isPrimary(column) ? undefined : 'hidden sm:table-cell');
  const sortable = columns.filter((c) => c.getCanSort());
  const sortedColumn = sortable.find((c) => c.getIsSorted());
  const sorting = sortedColumn && { id: sortedColumn.id, desc: sortedColumn.getIsSorted() === 'desc' };

  return (
    <div className="flex flex-col gap-2">
      {responsive && sortable.length > 0 && (
        <label className="flex items-center gap-2 text-sm sm:hidden">
          <span className="font-semibold">Sort by</span>
          <select
            className="rounded-md border border-line-strong bg-white px-2 py-1.5"
            value={sorting ? `${sorting.id}:${sorting.desc ? 'desc' : 'asc'}` : ''}
            onChange={(event) => {
              const [id, direction] = event.target.value.split(':');
              if (id) table.setSorting([{ id, desc: direction === 'desc' }]);
            }}
          >
            {!sorting && <option value="">as listed</option>}
            {sortable.map((column) => (
              <Fragment key={column.id}>
                <option value={`${column.id}:asc`}>{columnLabel(column)}, low to high</option>
                <option value={`${column.id}:desc`}>{columnLabel(column)}, high to low</option>
              </Fragment>
            ))}
          </select>
        </label>
      )}
      <div className={cn('relative -mx-4 overflow-x-auto sm:-mx-5 sm:px-5', responsive ? 'px-1' : 'px-4')}>
        <table className={cn('w-full text-sm', responsive ? FROM_SM[minWidth] : minWidth)}>
          <caption className="sr-only">{caption}</caption>
          <thead className="border-b border-line-strong text-ink-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const right = header.column.columnDef.meta?.align === 'right';
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted ? ARIA_SORT[sorted] : undefined}
                      className={cn(
                        'py-1.5 pr-3 font-semibold whitespace-nowrap last:pr-0',
                        right ? 'text-right' : 'text-left',
                        hideOnPhone(header.column),
                      )}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={cn(
                            'inline-flex min-h-11 items-center gap-1 hover:text-ink sm:min-h-6',
                            sorted && 'text-ink',
                            right && 'flex-row-reverse',
                          )}
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true" className="w-2 text-xs">
                            {sorted === 'asc' ? '↑' : sorted === 'desc' ? '↓' : ''}
                          </span>
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
                {responsive && <MoreHeaderCell />}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row, index) => {
              const note = rowNote?.(row);
              const expanded = open.isOpen(row.id);
              const detailsId = `${baseId}-${row.id}`;
              const hidden = row.getAllCells().filter((cell) => !isPrimary(cell.column));
              return (
                <Fragment key={row.id}>
                  <tr
                    className={cn(
                      'border-line',
                      !note && !expanded && 'border-b last:border-0',
                      expanded && 'max-sm:bg-teal-wash/40',
                      rowClassName?.(row),
                    )}
                  >
                    {row.getAllCells().map((cell) => {
                      const right = cell.column.columnDef.meta?.align === 'right';
                      const className = cn(
                        // Phones may wrap a cell's words (a target range, a rep's name); wider screens keep one line.
                        'py-1.5 pr-2 last:pr-0 sm:pr-3',
                        responsive ? 'sm:whitespace-nowrap' : 'whitespace-nowrap',
                        right ? 'text-right tabular-nums' : 'text-left',
                        hideOnPhone(cell.column),
                      );
                      const primary = responsive && isPrimary(cell.column) ? { 'data-primary': '' } : {};
                      return cell.column.id === rowHeader ? (
                        <th key={cell.id} scope="row" className={cn(className, 'font-semibold')} {...primary}>
                          <table.FlexRender cell={cell} />
                        </th>
                      ) : (
                        <td key={cell.id} className={className} {...primary}>
                          <table.FlexRender cell={cell} />
                        </td>
                      );
                    })}
                    {responsive && (
                      <MoreButtonCell
                        expanded={expanded}
                        controls={detailsId}
                        rowName={rowLabel?.(row) ?? `row ${index + 1}`}
                        onToggle={() => open.toggle(row.id)}
                      />
                    )}
                  </tr>
                  {responsive && expanded && (
                    <RowDetailsRow
                      id={detailsId}
                      colSpan={phoneColumns}
                      className={cn(!note && 'border-b last:border-0')}
                      valueClassName="tabular-nums"
                      items={hidden.map((cell) => ({
                        key: cell.id,
                        label: columnLabel(cell.column),
                        value: <table.FlexRender cell={cell} />,
                      }))}
                    />
                  )}
                  {note && (
                    <tr className="border-b border-line last:border-0">
                      <td
                        colSpan={responsive ? columns.length + 1 : columns.length}
                        className="pb-1.5 whitespace-normal text-ink-muted"
                      >
                        {note}
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
