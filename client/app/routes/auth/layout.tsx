import type { QueryClient } from '@tanstack/react-query';
import { Outlet, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { resolveNext } from '../../../config/paths.ts';
import { meQueryOptions } from '../../../features/auth/api/get-me.ts';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (user) throw redirect(resolveNext(new URL(request.url).searchParams.get('next')));
    return null;
  };

export default function AuthLayout() {
  return (
    <div className="flex min-h-dvh flex-col items-center px-4 py-10 sm:py-16">
      <p className="mb-6 text-2xl font-bold tracking-tight">Pacewright</p>
      <main className="w-full max-w-md rounded-lg border border-line bg-card p-5 shadow-xs sm:p-7">
        <Outlet />
      </main>
      <p className="mt-6 max-w-md text-center text-sm text-ink-muted">
        A training log for distance runners and their coaches: splits per mile and kilometre, plan checks, weekly load and
        race-day fueling.
      </p>
    </div>
  );
}
