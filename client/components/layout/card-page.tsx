import type { ReactNode } from 'react';

/** The page of the signed-out screens: the wordmark, one card in the middle, a line about the product below. */
export function CardPage({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col items-center px-4 py-10 sm:py-16">
      <p className="mb-6 text-2xl font-bold tracking-tight">Pacewright</p>
      <main className="w-full max-w-md rounded-lg border border-line bg-card p-5 shadow-xs sm:p-7">{children}</main>
      <p className="mt-6 max-w-md text-center text-sm text-ink-muted">
        A training log for distance runners and their coaches: splits per mile and kilometre, plan checks, weekly load and
        race-day fueling.
      </p>
    </div>
  );
}
