import {
  Link,
  Toast,
  ToastBody,
  Toaster,
  ToastTitle,
  ToastTrigger,
  useToastController,
  type ToastIntent,
} from '@fluentui/react-components';
import { useCallback, useMemo } from 'react';

const TOASTER_ID = 'loamline-toaster';

/** Where toasts appear; rendered once, by the app provider. */
export function AppToaster() {
  return <Toaster toasterId={TOASTER_ID} position="bottom" pauseOnHover pauseOnWindowBlur />;
}

/** Short confirmations and failures of actions (saved, invited, could not save). */
export function useNotify() {
  const { dispatchToast } = useToastController(TOASTER_ID);
  const show = useCallback(
    (intent: ToastIntent, title: string, body?: string) =>
      dispatchToast(
        <Toast>
          <ToastTitle>{title}</ToastTitle>
          {body && <ToastBody>{body}</ToastBody>}
        </Toast>,
        { intent, timeout: intent === 'error' ? 8_000 : 4_000 },
      ),
    [dispatchToast],
  );
  const undoable = useCallback(
    (title: string, onUndo: () => void) =>
      dispatchToast(
        <Toast>
          <ToastTitle
            action={
              <ToastTrigger>
                <Link onClick={onUndo}>Undo</Link>
              </ToastTrigger>
            }
          >
            {title}
          </ToastTitle>
        </Toast>,
        // Long enough to notice a wrong tap on a phone in the sun.
        { intent: 'success', timeout: 10_000 },
      ),
    [dispatchToast],
  );
  return useMemo(
    () => ({
      success: (title: string, body?: string) => show('success', title, body),
      error: (title: string, body?: string) => show('error', title, body),
      /** A done thing that can be taken back: the toast has an Undo link. */
      undoable,
    }),
    [show, undoable],
  );
}
