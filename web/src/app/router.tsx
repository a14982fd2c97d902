import type { QueryClient } from '@tanstack/react-query';
import { useMemo, type ComponentType } from 'react';
import { createBrowserRouter, redirectDocument, RouterProvider, type LoaderFunction, type RouteObject } from 'react-router';

import { paths } from '../config/paths';

/** What every module under app/routes exports (HOUSE_STYLE §3). */
type RouteModule = {
  default: ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: ComponentType;
};

function convert(queryClient: QueryClient, beforeLoaders: Promise<void> | undefined) {
  return ({ default: Component, clientLoader, ErrorBoundary }: RouteModule) => {
    const loader = clientLoader?.(queryClient);
    return {
      Component,
      ErrorBoundary,
      loader:
        loader && beforeLoaders
          ? async (...args: Parameters<LoaderFunction>) => {
              await beforeLoaders;
              return loader(...args);
            }
          : loader,
    };
  };
}

/**
 * The route tree, shared by the browser router and the memory router in tests. `beforeLoaders`: what
 * every route loader waits for first (the data kept on the device, main.tsx); the route modules
 * themselves download meanwhile rather than after it.
 */
export function createAppRoutes(queryClient: QueryClient, beforeLoaders?: Promise<void>): RouteObject[] {
  const load = convert(queryClient, beforeLoaders);
  return [
    {
      path: paths.home.path,
      lazy: () => import('./routes/root').then(load),
      // Shown only for the moment the first route modules load; blank rather than a flashing spinner.
      HydrateFallback: () => null,
      children: [
        // Not a route of the app: the sign-in page is a page of its own (web/sign-in.html, issue 17). Any
        // client-side navigation that still arrives here becomes a full page load of that page.
        { path: paths.signIn.path, loader: ({ request }) => redirectDocument(new URL(request.url).pathname + new URL(request.url).search) },
        { path: paths.acceptInvitation.path, lazy: () => import('./routes/auth/accept-invitation').then(load) },
        { path: paths.signUp.path, lazy: () => import('./routes/auth/sign-up').then(load) },
        { path: paths.signUpVerify.path, lazy: () => import('./routes/auth/sign-up-verify').then(load) },
        { path: paths.forgotPassword.path, lazy: () => import('./routes/auth/forgot-password').then(load) },
        { path: paths.resetPassword.path, lazy: () => import('./routes/auth/reset-password').then(load) },
        {
          lazy: () => import('./routes/app/root').then(load),
          children: [
            // Public on purpose: it holds no company data, and "is the server up?" is worth asking
            // when signing in does not work.
            { path: paths.status.path, lazy: () => import('./routes/app/status').then(load) },
            {
              lazy: () => import('./routes/app/protected').then(load),
              children: [
                { index: true, lazy: () => import('./routes/app/home').then(load) },
                { path: paths.jobs.path, lazy: () => import('./routes/app/jobs').then(load) },
                { path: paths.job.path, lazy: () => import('./routes/app/job').then(load) },
                { path: paths.jobDrawings.path, lazy: () => import('./routes/app/job-drawings').then(load) },
                { path: paths.jobPlan.path, lazy: () => import('./routes/app/job-plan').then(load) },
                { path: paths.customers.path, lazy: () => import('./routes/app/customers').then(load) },
                { path: paths.customer.path, lazy: () => import('./routes/app/customer').then(load) },
                { path: paths.site.path, lazy: () => import('./routes/app/site').then(load) },
                { path: paths.users.path, lazy: () => import('./routes/app/users').then(load) },
                { path: paths.settings.path, lazy: () => import('./routes/app/settings').then(load) },
                { path: paths.outbox.path, lazy: () => import('./routes/app/outbox').then(load) },
                { path: paths.outboxMessage.path, lazy: () => import('./routes/app/outbox-message').then(load) },
                { path: paths.portal.path, lazy: () => import('./routes/portal/sites').then(load) },
                { path: paths.portalSite.path, lazy: () => import('./routes/portal/site').then(load) },
              ],
            },
            { path: '*', lazy: () => import('./routes/not-found').then(load) },
          ],
        },
      ],
    },
  ];
}

type AppRouterProps = { queryClient: QueryClient; beforeLoaders?: Promise<void> };

export function AppRouter({ queryClient, beforeLoaders }: AppRouterProps) {
  const router = useMemo(() => createBrowserRouter(createAppRoutes(queryClient, beforeLoaders)), [queryClient, beforeLoaders]);
  return <RouterProvider router={router} />;
}
