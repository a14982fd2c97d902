import { QueryClient, type DefaultOptions } from '@tanstack/react-query';

import { isApiError } from './api-client';

const MAX_RETRIES = 2;

export const queryConfig = {
  queries: {
    staleTime: 60_000,
    // A phone coming back into signal refetches on its own; a desk tab switching focus need not.
    refetchOnWindowFocus: false,
    retry: (failureCount, error) => {
      // A 4xx answer will not change on retry; network failures and 5xx may.
      if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
      return failureCount < MAX_RETRIES;
    },
  },
} satisfies DefaultOptions;

export function createQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: queryConfig });
}
