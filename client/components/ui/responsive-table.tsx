import { Fragment, useId, type ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';
import { MoreButtonCell, MoreHeaderCell, RowDetailsRow, useOpenRows } from './table-row-details.tsx';

export type TableColumn<T> = {
  id: string;
  header: ReactNode;
  /** The column's name in words, for the phone's label–value lines (required when `header` is not text). */
  label?: string;
  align?: 'left' | 'right';
  /** Shown on phones; the other columns open under a row. Cells carry `data-primary` (the page audit checks them). */
  primary?: boolean;
  /** This column's cells are the row headers (`<th scope="row">`). */
  rowHeader?: boolean;
  cell: (row: T, index: number) => ReactNode;
};

type ResponsiveTableProps<T> = {
  caption: string;
  columns: readonly TableColumn<T>[];
  rows: readonly T[];
  rowKey: (row: T, index: number) => string;
  /** Names a row for the phone's "all figures" button ("intake at 4.5 mi"). */
  rowLabel?: (row: T, index: number) => string;
  /** Extra classes for the `<table>` (e.g. print rules). */
  className?: string;
};

/**
 * A plain (unsorted) table that reads on a phone without sideways scrolling — the same pattern as
 * `DataTable` for tables that need no sorting: below 640 px only the `primary` columns show and a
 * button at the end of each row opens the others as label–value lines; from 640 px up every column
 * shows and header words may wrap, so the table fits its card instead of being cut off.
 */
export function ResponsiveTable<T>({ caption, columns, rows, rowKey, rowLabel, className }: ResponsiveTableProps<T>) {
  const open = useOpenRows();
  const baseId = useId();
  const responsive = columns.some((c) => c.primary);
  const isPrimary = (c: TableColumn<T>) => !responsive || c.primary === true;
  const hideOnPhone = (c: TableColumn<T>) => (isPrimary(c) ? undefined : 'hidden sm:table-cell print:table-cell');
  const phoneColumns = columns.filter(isPrimary).length + (responsive ? 1 : 0);
  const labelOf = (c: TableColumn<T>) => c.label ?? (typeof c.header === 'string' ? c.header : c.id);

  return (
    <table className={cn('w-full text-sm tabular-nums', className)}>
      <caption className="sr-only">{caption}</caption>
      <thead className="border-b border-line-strong text-ink-muted print:text-black">
        <tr>
          {columns.map((c) => (
            <th
              key={c.id}
              scope="col"
              className={cn(
                'py-1.5 pr-2 align-bottom font-semibold last:pr-0 sm:pr-3',
                c.align === 'right' ? 'text-right' : 'text-left',
                hideOnPhone(c),
              )}
            >
              {c.header}
            </th>
          ))}
          {responsive && <MoreHeaderCell className="print:hidden" />}
        </tr>
      </thead>
      <tbody>
        {rows.map((row, index) => {
          const key = rowKey(row, index);
          const expanded = open.isOpen(key);
          const detailsId = `${baseId}-${index}`;
          return (
            <Fragment key={key}>
              <tr className={cn('border-line', !expanded && 'border-b last:border-0')}>
                {columns.map((c) => {
                  const className = cn(
                    'py-1 pr-2 last:pr-0 sm:pr-3',
                    c.align === 'right' ? 'text-right' : 'text-left',
                    c.rowHeader && 'font-semibold',
                    hideOnPhone(c),
                  );
                  const primary = responsive && isPrimary(c) ? { 'data-primary': '' } : {};
                  return c.rowHeader ? (
                    <th key={c.id} scope="row" className={className} {...primary}>
                      {c.cell(row, index)}
                    </th>
                  ) : (
                    <td key={c.id} className={className} {...primary}>
                      {c.cell(row, index)}
                    </td>
                  );
                })}
                {responsive && (
                  <MoreButtonCell
                    className="print:hidden"
                    expanded={expanded}
                    controls={detailsId}
                    rowName={rowLabel?.(row, index) ?? `row ${index + 1}`}
                    onToggle={() => open.toggle(key)}
                  />
                )}
              </tr>
              {responsive && expanded && (
                <RowDetailsRow
                  id={detailsId}
                  colSpan={phoneColumns}
                  className="border-b last:border-0 print:hidden"
                  items={columns
                    .filter((c) => !isPrimary(c))
                    .map((c) => ({ key: c.id, label: labelOf(c), value: c.cell(row, index) }))}
                />
              )}
            </Fragment>
          );
        })}
      </tbody>
    </table>
  );
}
