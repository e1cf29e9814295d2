import type { ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';

type CardProps = {
  title?: string;
  description?: ReactNode;
  actions?: ReactNode;
  className?: string;
  children: ReactNode;
};

export function Card({ title, description, actions, className, children }: CardProps) {
  return (
    <section className={cn('min-w-0 rounded-lg border border-line bg-card p-4 shadow-xs sm:p-5', className)}>
      {(title || actions) && (
        <header className="mb-3 flex flex-wrap items-start justify-between gap-2">
          <div>
            {title && <h2 className="text-lg font-semibold">{title}</h2>}
            {description && <p className="text-sm text-ink-muted">{description}</p>}
          </div>
          {actions}
        </header>
      )}
      {children}
    </section>
  );
}
