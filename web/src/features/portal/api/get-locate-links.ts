import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type LocateLinkResponse, LocateLinkResponseSchema } from '@domain/locate/locate-link.schema';

import { apiRequest } from '../../../lib/api-client';

export type { LocateLinkResponse };

/** The site's locate links, newest first (never their tokens). */
export function getLocateLinks(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<LocateLinkResponse[]> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/locate-links`, z.array(LocateLinkResponseSchema), { signal });
}

export function getLocateLinksQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['locate-links', siteId],
    queryFn: ({ signal }) => getLocateLinks(siteId, { signal }),
  });
}

export function useLocateLinks(siteId: string) {
  return useQuery(getLocateLinksQueryOptions(siteId));
}
