import { queryOptions, useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import type { PhotoVariant } from '@domain/photos/photo.schema';

import { apiBlob } from '../../../lib/api-client';

/** The bytes of one size of a photo (the file endpoints need the Bearer token, so no plain <img src>). */
export function getPhotoFile(photoId: string, variant: PhotoVariant, { signal }: { signal?: AbortSignal } = {}): Promise<Blob> {
  return apiBlob(`/api/photos/${encodeURIComponent(photoId)}/${variant}`, { signal, headers: { Accept: 'image/*' } });
}

export function getPhotoFileQueryOptions(photoId: string, variant: PhotoVariant) {
  return queryOptions({
    queryKey: ['photos', 'file', photoId, variant],
    queryFn: ({ signal }) => getPhotoFile(photoId, variant, { signal }),
    // A photo's files never change once stored.
    staleTime: Infinity,
    gcTime: 10 * 60_000,
  });
}

/** An object URL for `blob`, revoked when the blob changes or the component goes. */
export function useObjectUrl(blob: Blob | undefined): string | undefined {
  const [url, setUrl] = useState<string | undefined>();
  useEffect(() => {
    if (!blob) {
      setUrl(undefined);
      return;
    }
    const next = URL.createObjectURL(blob);
    setUrl(next);
    return () => URL.revokeObjectURL(next);
  }, [blob]);
  return url;
}

/** An object URL of one size of a photo, fetched with the session. */
export function usePhotoUrl(photoId: string, variant: PhotoVariant): { url: string | undefined; isError: boolean } {
  const { data, isError } = useQuery(getPhotoFileQueryOptions(photoId, variant));
  return { url: useObjectUrl(data), isError };
}
