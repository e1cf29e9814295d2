import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunction } from 'react-router-dom';
import { PageLoading } from '../components/ui/page-loading.tsx';
import { paths } from '../config/paths.ts';
import AppLayout, { createLoader as createAppLoader } from './routes/app/layout.tsx';
import AuthLayout, { createLoader as createAuthLoader } from './routes/auth/layout.tsx';
import { NotFound } from './routes/not-found.tsx';
import PublicLayout from './routes/public/layout.tsx';
import { RootError, RouteError } from './routes/route-error.tsx';

type RouteModule = {
  default: ComponentType;
  createLoader?: (queryClient: QueryClient) => LoaderFunction;
};

export function createAppRouter(queryClient: QueryClient) {
  // Pages load on first visit; their loaders get the query client so they share the components' query options.
  const page = (importModule: () => Promise<RouteModule>) => async () => {
    const { default: Component, createLoader } = await importModule();
    return createLoader ? { Component, loader: createLoader(queryClient) } : { Component };
  };

  return createBrowserRouter([
    {
      ErrorBoundary: RootError,
      HydrateFallback: PageLoading,
      children: [
        {
          Component: AuthLayout,
          loader: createAuthLoader(queryClient),
          children: [
            { path: paths.signIn.path, lazy: page(() => import('./routes/auth/sign-in.tsx')) },
            { path: paths.signUp.path, lazy: page(() => import('./routes/auth/sign-up.tsx')) },
            { path: paths.forgotPassword.path, lazy: page(() => import('./routes/auth/forgot-password.tsx')) },
          ],
        },
        {
          // Links from e-mails: they must open whether or not someone is signed in.
          Component: PublicLayout,
          children: [
            { path: paths.invite.path, lazy: page(() => import('./routes/public/invite.tsx')) },
            { path: paths.resetPassword.path, lazy: page(() => import('./routes/public/reset-password.tsx')) },
            { path: paths.signUpConfirm.path, lazy: page(() => import('./routes/public/sign-up-confirm.tsx')) },
            { path: paths.noticesOff.path, lazy: page(() => import('./routes/public/notices-off.tsx')) },
          ],
        },
        { path: paths.devOutbox.path, lazy: page(() => import('./routes/dev/outbox.tsx')) },
        // The night-before sheet prints without the app's navigation; its loader checks the session itself.
        { path: paths.planFuelPrint.path, lazy: page(() => import('./routes/app/fuel-print.tsx')) },
        { path: paths.goalFuelPrint.path, lazy: page(() => import('./routes/app/fuel-print.tsx')) },
        {
          path: paths.home.path,
          Component: AppLayout,
          loader: createAppLoader(queryClient),
          children: [
            {
              ErrorBoundary: RouteError,
              children: [
                { index: true, loader: () => redirect(paths.log.getHref()) },
                { path: paths.log.path, lazy: page(() => import('./routes/app/log.tsx')) },
                { path: paths.run.path, lazy: page(() => import('./routes/app/run.tsx')) },
                { path: paths.plan.path, lazy: page(() => import('./routes/app/plan.tsx')) },
                { path: paths.squad.path, lazy: page(() => import('./routes/app/squad.tsx')) },
                { path: paths.runnerPlan.path, lazy: page(() => import('./routes/app/plan.tsx')) },
                { path: paths.weekReview.path, lazy: page(() => import('./routes/app/week-review.tsx')) },
                { path: paths.myWeek.path, lazy: page(() => import('./routes/app/my-week.tsx')) },
                { path: paths.tools.path, lazy: page(() => import('./routes/app/tools.tsx')) },
                { path: paths.fuel.path, lazy: page(() => import('./routes/app/fuel.tsx')) },
                { path: paths.planFuel.path, lazy: page(() => import('./routes/app/fuel-plan.tsx')) },
                { path: paths.goalFuel.path, lazy: page(() => import('./routes/app/fuel-plan.tsx')) },
                { path: paths.profile.path, lazy: page(() => import('./routes/app/profile.tsx')) },
                { path: paths.fees.path, lazy: page(() => import('./routes/app/fees.tsx')) },
                { path: paths.admin.path, lazy: page(() => import('./routes/app/admin.tsx')) },
              ],
            },
          ],
        },
        { path: '*', Component: NotFound },
      ],
    },
  ]);
}
