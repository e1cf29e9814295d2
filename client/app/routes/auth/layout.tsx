import type { QueryClient } from '@tanstack/react-query';
import { Outlet, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { CardPage } from '../../../components/layout/card-page.tsx';
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
    <CardPage>
      <Outlet />
    </CardPage>
  );
}
