import { useCallback, useSyncExternalStore } from 'react';

/** Whether a CSS media query matches now, following changes (rotating a phone, resizing a window). */
export function useMediaQuery(query: string): boolean {
  const subscribe = useCallback(
    (onChange: () => void) => {
      const mediaQuery = typeof window.matchMedia === 'function' ? window.matchMedia(query) : undefined;
      mediaQuery?.addEventListener('change', onChange);
      return () => mediaQuery?.removeEventListener('change', onChange);
    },
    [query],
  );
  const getSnapshot = () => (typeof window.matchMedia === 'function' ? window.matchMedia(query).matches : false);
  return useSyncExternalStore(subscribe, getSnapshot, () => false);
}
