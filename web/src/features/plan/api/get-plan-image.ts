import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';

import { apiBlob } from '../../../lib/api-client';

import type { SitePlanImage } from './site-plan-image';

/** The bytes of a site's plan image (the API wants the access token, so an <img> cannot fetch it itself). */
export function getPlanImage(url: string, { signal }: { signal?: AbortSignal } = {}): Promise<Blob> {
  return apiBlob(url, { signal, headers: { Accept: 'image/*' }, timeoutMs: 60_000 });
}

export function getPlanImageQueryOptions(url: string) {
  return {
    queryKey: ['sites', 'plan-image', url] as const,
    queryFn: ({ signal }: { signal?: AbortSignal }) => getPlanImage(url, { signal }),
    // An image at one address never changes: a new upload gets a new address or a new site answer.
    staleTime: Infinity,
  };
}

/** An object URL for the plan image (revoked when it changes or the screen closes), or undefined while loading. */
export function usePlanImageUrl(image: SitePlanImage | null): { href: string | undefined; isError: boolean } {
  const query = useQuery({ ...getPlanImageQueryOptions(image?.url ?? ''), enabled: image !== null });
  const href = useMemo(() => (query.data ? URL.createObjectURL(query.data) : undefined), [query.data]);
  useEffect(() => () => {
    if (href) URL.revokeObjectURL(href);
  }, [href]);
  return { href, isError: query.isError };
}
