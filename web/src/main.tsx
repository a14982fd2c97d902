import './fonts.css';
import './global.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { restoreSession } from './features/auth/api/restore-session';
import { loadPendingWrites } from './features/jobs/utils/pending-writes';
import { createQueryClient } from './lib/query-client';
import { startQueryPersistence } from './lib/query-persistence';
import { registerServiceWorker, whenLoadedAndIdle } from './lib/service-worker';
import { startSessionSync } from './lib/session-sync';
// Parsed at start-up so a bad build-time variable stops the app with a list of what is wrong.
import './config/env';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

const queryClient = createQueryClient();
// Hear other tabs' refreshes and sign-outs from the start (one refreshes, the others use its result).
startSessionSync();
// Ask the server about the session at once, while the first route's code downloads: the root route's
// loader then finds the answer (or the request in flight) instead of starting it after that download.
void restoreSession().catch(() => undefined);
// The jobs kept on this device for the person last signed in are back in the cache, and the changes
// waiting to send are known, before any route loader runs (so a job opens with no signal). Quick
// IndexedDB reads, nothing for a new visitor; the route code downloads meanwhile (see createAppRoutes).
const keptData = Promise.all([startQueryPersistence(queryClient).catch(() => undefined), loadPendingWrites()]).then(() => undefined);

createRoot(container).render(
  <StrictMode>
    <AppProvider queryClient={queryClient}>
      <AppRouter queryClient={queryClient} beforeLoaders={keptData} />
    </AppProvider>
  </StrictMode>,
);

// Precaches the whole app for use with no signal, and announces new versions (production builds
// only); after the page has loaded, so the worker's downloads never compete with it.
whenLoadedAndIdle(() => void registerServiceWorker().catch(() => undefined));
