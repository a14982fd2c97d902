import type { QueryClient } from '@tanstack/react-query';
import { useMemo, type ComponentType } from 'react';
import { createBrowserRouter, RouterProvider, type LoaderFunction, type RouteObject } from 'react-router';

import { paths } from '../config/paths';

/** What every module under app/routes exports (HOUSE_STYLE §3). */
type RouteModule = {
  default: ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: ComponentType;
};

function convert(queryClient: QueryClient) {
  return ({ default: Component, clientLoader, ErrorBoundary }: RouteModule) => ({
    Component,
    ErrorBoundary,
    loader: clientLoader?.(queryClient),
  });
}

/** The route tree, shared by the browser router and the memory router in tests. */
export function createAppRoutes(queryClient: QueryClient): RouteObject[] {
  const load = convert(queryClient);
  return [
    {
      path: paths.home.path,
      lazy: () => import('./routes/app/root').then(load),
      // Shown only for the moment the first route modules load; blank rather than a flashing spinner.
      HydrateFallback: () => null,
      children: [
        { index: true, lazy: () => import('./routes/app/home').then(load) },
        { path: paths.status.path, lazy: () => import('./routes/app/status').then(load) },
        { path: '*', lazy: () => import('./routes/not-found').then(load) },
      ],
    },
  ];
}

type AppRouterProps = { queryClient: QueryClient };

export function AppRouter({ queryClient }: AppRouterProps) {
  const router = useMemo(() => createBrowserRouter(createAppRoutes(queryClient)), [queryClient]);
  return <RouterProvider router={router} />;
}
