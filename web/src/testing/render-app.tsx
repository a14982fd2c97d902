import { FluentProvider } from '@fluentui/react-components';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router';

import { createAppRoutes } from '../app/router';
import { lightTheme } from '../app/theme';
import { AppToaster } from '../components/notify';
import { queryConfig } from '../lib/query-client';
import { clearSession, resetSession, setSession, type SessionUser } from '../lib/session';

import { buildSessionResponse, buildSessionUser } from './data';

type RenderAppOptions = {
  /** The address the app opens at. */
  url?: string;
  /**
   * Who is signed in: a user (default: a crew lead), `null` for nobody, or `'unknown'` to start as a
   * fresh page load does, asking the server (`POST /api/auth/refresh`) first.
   */
  signedInAs?: SessionUser | null | 'unknown';
};

export function createTestQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: { queries: { ...queryConfig.queries, retry: false, gcTime: Infinity } },
  });
}

/** Renders the whole app (routes, providers) at `url` in a memory router. */
export function renderApp({ url = '/', signedInAs = buildSessionUser() }: RenderAppOptions = {}) {
  if (signedInAs === 'unknown') resetSession();
  else if (signedInAs === null) clearSession();
  else setSession(buildSessionResponse(signedInAs));
  const queryClient = createTestQueryClient();
  const router = createMemoryRouter(createAppRoutes(queryClient), { initialEntries: [url] });
  const user = userEvent.setup();
  const result = render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
        <AppToaster />
      </QueryClientProvider>
    </FluentProvider>,
  );
  return { ...result, user, router, queryClient };
}

/** A `fetch` Response with a JSON body, as our API sends it. */
export function jsonResponse(body: unknown, status = 200): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });
}
