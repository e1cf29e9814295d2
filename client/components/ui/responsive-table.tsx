import { Fragment, useId, useState, type ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';

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
  const [open, setOpen] = useState<ReadonlySet<string>>(new Set());
  const baseId = useId();
  const responsive = columns.some((c) => c.primary);
  const isPrimary = (c: TableColumn<T>) => !responsive || c.primary === true;
  const hideOnPhone = (c: TableColumn<T>) => (isPrimary(c) ? undefined : 'hidden sm:table-cell print:table-cell');
  const phoneColumns = columns.filter(isPrimary).length + (responsive ? 1 : 0);
  const labelOf = (c: TableColumn<T>) => c.label ?? (typeof c.header === 'string' ? c.header : c.id);

  function toggle(key: string) {
    setOpen((current) => {
      const next = new Set(current);
      if (next.has(key)) next.delete(key);
      else next.add(key);
      return next;
    });
  }

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
          {responsive && (
            <th scope="col" className="w-11 sm:hidden print:hidden">
              <span className="sr-only">More</span>
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {rows.map((row, index) => {
          const key = rowKey(row, index);
          const expanded = open.has(key);
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
                  <td className="w-11 py-0 text-right sm:hidden print:hidden">
                    <button
                      type="button"
                      aria-expanded={expanded}
                      aria-controls={detailsId}
                      aria-label={`All figures: ${rowLabel?.(row, index) ?? `row ${index + 1}`}`}
                      onClick={() => toggle(key)}
                      className="inline-flex size-11 items-center justify-center rounded-md text-teal hover:bg-teal-wash"
                    >
                      <span aria-hidden="true">{expanded ? '▴' : '▾'}</span>
                    </button>
                  </td>
                )}
              </tr>
              {responsive && expanded && (
                <tr id={detailsId} className="border-b border-line last:border-0 sm:hidden print:hidden">
                  <td colSpan={phoneColumns} className="pb-2">
                    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 pl-2">
                      {columns
                        .filter((c) => !isPrimary(c))
                        .map((c) => (
                          <Fragment key={c.id}>
                            <dt className="text-ink-muted">{labelOf(c)}</dt>
                            <dd>{c.cell(row, index)}</dd>
                          </Fragment>
                        ))}
                    </dl>
                  </td>
                </tr>
              )}
            </Fragment>
          );
        })}
      </tbody>
    </table>
  );
}
