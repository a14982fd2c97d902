import { useEffect, useState } from 'react';

import { apiBlob } from '../../../lib/api-client';

/**
 * An object URL of the stored logo at `url` (the profile's logo URL, fetched with the session so an
 * <img> can show it); revoked when it changes.
 */
export function useLogoUrl(url: string | undefined): string | undefined {
  const [objectUrl, setObjectUrl] = useState<string | undefined>();
  useEffect(() => {
    if (!url) {
      setObjectUrl(undefined);
      return;
    }
    let isCurrent = true;
    let created: string | undefined;
    apiBlob(url)
      .then((blob) => {
        if (!isCurrent) return;
        created = URL.createObjectURL(blob);
        setObjectUrl(created);
      })
      .catch(() => isCurrent && setObjectUrl(undefined));
    return () => {
      isCurrent = false;
      if (created) URL.revokeObjectURL(created);
    };
  }, [url]);
  return objectUrl;
}
