import { lazy, Suspense, useMemo } from 'react';

import type { ToastRequest } from './toaster';

// The toaster is not needed to show the first page: it arrives in its own chunk just after.
const loadToaster = () => import('./toaster');
const ToasterSurface = lazy(() => loadToaster().then(({ ToasterSurface }) => ({ default: ToasterSurface })));

function notify(request: ToastRequest): void {
  void loadToaster().then(({ showToast }) => showToast(request));
}

/** Where toasts appear; rendered once, by the app provider. */
export function AppToaster() {
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
