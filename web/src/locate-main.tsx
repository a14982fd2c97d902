import './fonts.css';
import './locate.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

import { loadLocateView } from './features/locate/api/get-locate-view';
import { LocateErrorBoundary, LocatePage, settledState } from './features/locate/components/locate-page';

/**
 * The public locate view's own entry (locate.html, issue 17): the page a stranger opens once, from a
 * link or a QR code, on a phone with a weak signal. React and the locate view only: no Fluent UI, no
 * router, no query cache, no session start-up, no service worker (the server answers `/locate/*` with
 * this page; web/vite.config.ts, api/src/common/web-app.ts).
 */
const container = document.getElementById('root');
if (!container) throw new Error('locate.html has no #root element');

// `/locate/<token>`: the token is the rest of the path (the server answers nothing else with this page).
const token = decodeURIComponent(window.location.pathname.replace(/^\/locate\//, '').replace(/\/$/, ''));
/** How long the first render waits for an answer already on its way before drawing the loading frame. */
const FRAME_AFTER_MS = 150;

// Asked at once (the server's Link header has usually started it with the page, so it is often in by
// now); the first render waits for it a moment, then draws the loading frame if it has not come.
const view = loadLocateView(token);
const early = Promise.race([settledState(view), new Promise<undefined>((resolve) => setTimeout(resolve, FRAME_AFTER_MS))]);

void early.then((initial) =>
  createRoot(container).render(
    <StrictMode>
      <LocateErrorBoundary>
        <LocatePage view={view} initial={initial} />
      </LocateErrorBoundary>
    </StrictMode>,
  ),
);
