import { useSyncExternalStore } from 'react';

const QUERY = '(prefers-color-scheme: dark)';

function getMediaQuery(): MediaQueryList | undefined {
  return typeof window.matchMedia === 'function' ? window.matchMedia(QUERY) : undefined;
}

function subscribe(onChange: () => void): () => void {
  const mediaQuery = getMediaQuery();
  mediaQuery?.addEventListener('change', onChange);
  return () => mediaQuery?.removeEventListener('change', onChange);
}

/** Follows the operating system's light/dark setting, including changes while the app is open. */
export function usePrefersDarkScheme(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => getMediaQuery()?.matches ?? false,
    () => false,
  );
}
