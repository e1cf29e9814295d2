import { Fragment, useState, type ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';

// The phone pattern both tables share (DataTable, ResponsiveTable): below 640 px only the primary
// columns show; a button at the end of each row opens the other columns under it as label–value lines.

/** Which rows have their details open, by row key. */
export function useOpenRows(): { isOpen: (key: string) => boolean; toggle: (key: string) => void } {
  const [open, setOpen] = useState<ReadonlySet<string>>(new Set());
  return {
    isOpen: (key) => open.has(key),
    toggle: (key) =>
      setOpen((current) => {
        const next = new Set(current);
        if (next.has(key)) next.delete(key);
        else next.add(key);
        return next;
      }),
  };
}

/** The header cell over the phone's "more" buttons (named for screen readers only). */
export function MoreHeaderCell({ className }: { className?: string }) {
  return (
    <th scope="col" className={cn('w-11 sm:hidden', className)}>
      <span className="sr-only">More</span>
    </th>
  );
}

/** The phone's button at the end of a row that opens the row's other columns. */
export function MoreButtonCell({
  expanded,
  controls,
  rowName,
  onToggle,
  className,
}: {
  expanded: boolean;
  /** The id of the details row it opens. */
  controls: string;
  /** The row in words ("Split 3"); the button reads "All figures: Split 3". */
  rowName: string;
  onToggle: () => void;
  className?: string;
}) {
  return (
    <td className={cn('w-11 py-0 text-right sm:hidden', className)}>
      <button
        type="button"
        aria-expanded={expanded}
        aria-controls={controls}
        aria-label={`All figures: ${rowName}`}
        onClick={onToggle}
        className="inline-flex size-11 items-center justify-center rounded-md text-teal hover:bg-teal-wash"
      >
        <span aria-hidden="true">{expanded ? '▴' : '▾'}</span>
      </button>
    </td>
  );
}

/** The opened row: the hidden columns as label–value lines, across the phone's columns. */
export function RowDetailsRow({
  id,
  colSpan,
  items,
  className,
  valueClassName,
}: {
  id: string;
  colSpan: number;
  items: readonly { key: string; label: string; value: ReactNode }[];
  className?: string;
  valueClassName?: string;
}) {
  return (
    <tr id={id} className={cn('border-line sm:hidden', className)}>
      <td colSpan={colSpan} className="pb-2">
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 pl-2">
          {items.map((item) => (
            <Fragment key={item.key}>
              <dt className="text-ink-muted">{item.label}</dt>
              <dd className={valueClassName}>{item.value}</dd>
            </Fragment>
          ))}
        </dl>
      </td>
    </tr>
  );
}
