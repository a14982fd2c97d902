import './fonts.css';
import './global.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { loadPendingWrites } from './features/jobs/utils/pending-writes';
import { createQueryClient } from './lib/query-client';
import { startQueryPersistence } from './lib/query-persistence';
import { registerServiceWorker } from './lib/service-worker';
import { startSessionSync } from './lib/session-sync';
// Parsed at start-up so a bad build-time variable stops the app with a list of what is wrong.
import './config/env';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

const queryClient = createQueryClient();
// Hear other tabs' refreshes and sign-outs from the start (one refreshes, the others use its result).
startSessionSync();
// Precaches the whole app for use with no signal, and announces new versions (production builds only).
void registerServiceWorker().catch(() => undefined);

// The jobs kept on this device for the person last signed in are back in the cache before the first
// route loader runs, so a job opens with no signal, and the changes waiting to send are known (quick
// IndexedDB reads; nothing for a new visitor).
void Promise.all([startQueryPersistence(queryClient).catch(() => undefined), loadPendingWrites()])
  .finally(() => {
    createRoot(container).render(
      <StrictMode>
        <AppProvider queryClient={queryClient}>
          <AppRouter queryClient={queryClient} />
        </AppProvider>
      </StrictMode>,
    );
  });
