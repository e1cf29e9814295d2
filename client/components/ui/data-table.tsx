import type { ReactTable, Row, RowData } from '@tanstack/react-table';
import { cn } from '../../lib/cn.ts';
import type { SortableTableFeatures } from '../../lib/table.ts';

type DataTableProps<TData extends RowData> = {
  table: ReactTable<SortableTableFeatures, TData>;
  caption: string;
  /** Tailwind min-width class: below it the table scrolls sideways inside its card. */
  minWidth?: string;
  rowClassName?: (row: Row<SortableTableFeatures, TData>) => string | undefined;
  /** Column id whose cells are row headers (`<th scope="row">`). */
  rowHeader?: string;
};

const ARIA_SORT = { asc: 'ascending', desc: 'descending' } as const;

/**
 * A dense table with sortable headers (buttons, so they are keyboard reachable, with `aria-sort`).
 * The wrapper scrolls sideways; the page never does.
 */
export function DataTable<TData extends RowData>({
  table,
  caption,
  minWidth = 'min-w-lg',
  rowClassName,
  rowHeader,
}: DataTableProps<TData>) {
  return (
    <div className="relative -mx-4 overflow-x-auto px-4 sm:-mx-5 sm:px-5">
      <table className={cn('w-full text-sm', minWidth)}>
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
                    className={cn('py-1.5 pr-3 font-semibold whitespace-nowrap last:pr-0', right ? 'text-right' : 'text-left')}
                  >
                    {header.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className={cn(
                          'inline-flex items-center gap-1 hover:text-ink',
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
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className={cn('border-b border-line last:border-0', rowClassName?.(row))}>
              {row.getAllCells().map((cell) => {
                const right = cell.column.columnDef.meta?.align === 'right';
                const className = cn('py-1.5 pr-3 whitespace-nowrap last:pr-0', right ? 'text-right tabular-nums' : 'text-left');
                return cell.column.id === rowHeader ? (
                  <th key={cell.id} scope="row" className={cn(className, 'font-semibold')}>
                    <table.FlexRender cell={cell} />
                  </th>
                ) : (
                  <td key={cell.id} className={className}>
                    <table.FlexRender cell={cell} />
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
