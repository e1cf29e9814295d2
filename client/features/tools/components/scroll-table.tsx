import type { ReactNode } from 'react';
import { cn } from '../../../lib/cn.ts';

type ScrollTableProps = { label: string; className?: string; children: ReactNode };

/**
 * A table that scrolls inside its card (sideways on a phone, down when long), never the whole page.
 * The scroll box is focusable so keyboard users can scroll it too.
 */
export function ScrollTable({ label, className, children }: ScrollTableProps) {
  return (
    <div role="region" aria-label={label} tabIndex={0} className={cn('overflow-auto rounded-md border border-line', className)}>
      <table className="w-full border-collapse text-sm">{children}</table>
    </div>
  );
}

/** Header cell classes: sticky, so long tables keep their column names in view. */
const TH_BASE = 'sticky top-0 bg-paper px-3 py-2 font-semibold whitespace-nowrap';
export const TH = cn(TH_BASE, 'text-left');
export const TH_NUM = cn(TH_BASE, 'text-right');
const TD_BASE = 'border-t border-line px-3 py-1.5 whitespace-nowrap';
export const TD = cn(TD_BASE, 'text-left');
export const TD_NUM = cn(TD_BASE, 'text-right tabular-nums');
