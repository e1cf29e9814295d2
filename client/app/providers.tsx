import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { Suspense } from 'react';
import { RouterProvider } from 'react-router-dom';
import { PageLoading } from '../components/ui/page-loading.tsx';
import { authKeys } from '../features/auth/api/auth-keys.ts';
import { createQueryClient } from '../lib/query-client.ts';
import { createAppRouter } from './router.tsx';

// A 401 anywhere while signed in means the session is gone: re-asking who is signed in gets null,
// and the app layout then sends the person to sign-in.
const queryClient: QueryClient = createQueryClient(() => {
  if (queryClient.getQueryData(authKeys.me())) void queryClient.invalidateQueries({ queryKey: authKeys.me() });
});
const router = createAppRouter(queryClient);

export function AppProviders() {
  return (
    <QueryClientProvider client={queryClient}>
      <Suspense fallback={<PageLoading />}>
        <RouterProvider router={router} />
      </Suspense>
    </QueryClientProvider>
  );
}
