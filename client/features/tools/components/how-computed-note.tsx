import type { ReactNode } from 'react';

/** A folded "How this is computed" note under a result: the method and its published source. */
export function HowComputedNote({ children }: { children: ReactNode }) {
  return (
    <details className="mt-3 rounded-md border border-line bg-paper px-3 py-2 text-sm">
      <summary className="cursor-pointer font-semibold text-teal">How this is computed</summary>
      <div className="mt-2 space-y-1.5 text-ink-muted">{children}</div>
    </details>
  );
}
