import type { ReactNode } from 'react';

type EmptyStateProps = { title: string; children: ReactNode; next?: ReactNode };

/** What will live here, and what the person can do now. */
export function EmptyState({ title, children, next }: EmptyStateProps) {
  return (
    <div className="rounded-lg border border-dashed border-line-strong bg-card/60 px-4 py-8 text-center sm:px-8">
      <h2 className="text-lg font-semibold">{title}</h2>
      <div className="mx-auto mt-2 max-w-prose space-y-2 text-ink-muted">{children}</div>
      {next && <div className="mt-4 flex flex-wrap justify-center gap-3">{next}</div>}
    </div>
  );
}
