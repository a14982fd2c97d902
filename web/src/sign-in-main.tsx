import './fonts.css';
import './locate.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

import { getSignupStatus } from './features/auth/api/public-sign-in';
import { goOnIfSignedIn, SignInPage } from './features/auth/components/sign-in-page';
import { safeNextPath } from './features/auth/utils/safe-next-path';

/**
 * The sign-in page's own entry (sign-in.html, issue 17): two fields and a button, on a phone that may have
 * a weak signal. React and the form only: no Fluent UI, no router, no query cache, no zod, no session code
 * and no service worker of its own (the server answers `/sign-in` with this page; web/vite.config.ts,
 * api/src/common/web-app.ts). Signed in, it loads the app at `next`, which restores the session from the
 * refresh cookie.
 */
const container = document.getElementById('root');
if (!container) throw new Error('sign-in.html has no #root element');

const params = new URLSearchParams(window.location.search);
const next = safeNextPath(params.get('next'));
// A full page load that leaves this page out of the history, as the app's route replaced itself.
const go = (url: string) => window.location.replace(url);

// Both questions go out at once, beside the first render rather than before it.
const signupStatus = getSignupStatus();
signupStatus.catch(() => undefined);
void goOnIfSignedIn(next, go);

createRoot(container).render(
  <StrictMode>
    <SignInPage next={next} expired={params.get('expired') === '1'} signupStatus={signupStatus} go={go} />
  </StrictMode>,
);
