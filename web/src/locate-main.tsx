import './fonts.css';
import './locate.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

import { loadLocateView } from './features/locate/api/get-locate-view';
import { LocateErrorBoundary, LocatePage } from './features/locate/components/locate-page';

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
// Asked before the first render, so the request runs while React draws the frame.
const view = loadLocateView(token);

createRoot(container).render(
  <StrictMode>
    <LocateErrorBoundary>
      <LocatePage view={view} />
    </LocateErrorBoundary>
  </StrictMode>,
);
