import type { ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';

/** A form-level message; `role="alert"` makes screen readers announce it as soon as it appears. */
export function FormAlert({ tone = 'error', children }: { tone?: 'error' | 'success'; children: ReactNode }) {
  return (
    <p
      role={tone === 'error' ? 'alert' : 'status'}
      className={cn(
        'rounded-md border-l-4 px-3 py-2 text-sm',
        tone === 'error' ? 'border-tartan bg-tartan-wash text-tartan-deep' : 'border-teal bg-teal-wash text-teal-deep',
      )}
    >
      {children}
    </p>
  );
}
