import type { ReactNode } from 'react';

export function PageHeader({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <header className="mb-5">
      <title>{`${title} · Pacewright`}</title>
      <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
      {children && <p className="mt-1 max-w-prose text-ink-muted">{children}</p>}
    </header>
  );
}
