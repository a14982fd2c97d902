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
import { useEffect } from 'react';

const TOASTER_ID = 'loamline-toaster';

/** A toast as `useNotify` (notify.tsx) asks for it. */
export type ToastRequest =
  | { kind: 'message'; intent: ToastIntent; title: string; body?: string }
  | { kind: 'undoable'; title: string; onUndo: () => void };

// Toasts asked for before the toaster is on the page (its chunk still on the way) wait here and are
// shown as soon as it is.
const waiting: ToastRequest[] = [];
let dispatchNow: ((request: ToastRequest) => void) | undefined;

/** Shows a toast now, or as soon as the toaster is on the page. */
export function showToast(request: ToastRequest): void {
  if (dispatchNow) dispatchNow(request);
  else waiting.push(request);
}

/**
 * Where toasts appear. Its own chunk (Fluent's toaster, portal and motion), loaded by `AppToaster`
 * (notify.tsx) right after the first page rather than with it.
 */
export function ToasterSurface() {
  const { dispatchToast, dismissAllToasts } = useToastController(TOASTER_ID);

  // Runs after the Toaster's own effects, so it is listening before anything is dispatched.
  useEffect(() => {
    const dispatch = (request: ToastRequest) => {
      // One at a time: a newer message replaces the one showing (three readings saved in a row leave
      // one toast, not three stacked over the form).
      dismissAllToasts();
      if (request.kind === 'undoable') {
        dispatchToast(
          <Toast>
            <ToastTitle
              action={
                <ToastTrigger>
                  <Link onClick={request.onUndo}>Undo</Link>
                </ToastTrigger>
              }
            >
              {request.title}
            </ToastTitle>
          </Toast>,
          // Long enough to notice a wrong tap on a phone in the sun.
          { intent: 'success', timeout: 10_000 },
        );
        return;
      }
      dispatchToast(
        <Toast>
          <ToastTitle>{request.title}</ToastTitle>
          {request.body && <ToastBody>{request.body}</ToastBody>}
        </Toast>,
        { intent: request.intent, timeout: request.intent === 'error' ? 8_000 : 4_000 },
      );
    };
    dispatchNow = dispatch;
    for (const request of waiting.splice(0)) dispatch(request);
    return () => {
      if (dispatchNow === dispatch) dispatchNow = undefined;
    };
  }, [dispatchToast, dismissAllToasts]);

  // At the top of the screen, clear of the save buttons and the bottom of a form on a phone where the
  // thumb just tapped; never more than one.
  return <Toaster toasterId={TOASTER_ID} position="top" limit={1} offset={{ vertical: 8 }} pauseOnHover pauseOnWindowBlur />;
}
