import { lazy, Suspense, useMemo, useSyncExternalStore } from 'react';

import type { ToastRequest } from './toaster';

// The toaster is not needed to show the first page: it arrives in its own chunk just after.
const loadToaster = () => import('./toaster');
const ToasterSurface = lazy(() => loadToaster().then(({ ToasterSurface }) => ({ default: ToasterSurface })));

// Nothing about toasts loads until the first one is asked for: a page of the app that never shows one
// never downloads the toaster's chunk (issue 17, fast on a weak signal).
let isWanted = false;
const listeners = new Set<() => void>();

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function notify(request: ToastRequest): void {
  if (!isWanted) {
    isWanted = true;
    for (const listener of listeners) listener();
  }
  // Waits in the toaster's queue until the surface is on the page (toaster.tsx, `showToast`).
  void loadToaster().then(({ showToast }) => showToast(request));
}

/** Where toasts appear; rendered once, by the app provider. Mounts the toaster with the first toast. */
export function AppToaster() {
  const wanted = useSyncExternalStore(subscribe, () => isWanted, () => false);
  if (!wanted) return null;
  return (
    <Suspense fallback={null}>
      <ToasterSurface />
    </Suspense>
  );
}

/** Short confirmations and failures of actions (saved, invited, could not save). */
export function useNotify() {
  return useMemo(
    () => ({
      success: (title: string, body?: string) => notify({ kind: 'message', intent: 'success', title, body }),
      error: (title: string, body?: string) => notify({ kind: 'message', intent: 'error', title, body }),
      /** A done thing that can be taken back: the toast has an Undo link. */
      undoable: (title: string, onUndo: () => void) => notify({ kind: 'undoable', title, onUndo }),
    }),
    [],
  );
}
