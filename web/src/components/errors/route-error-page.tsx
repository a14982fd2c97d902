import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { ArrowClockwise20Regular } from '@fluentui/react-icons';
import { isRouteErrorResponse, Link, useRouteError } from 'react-router';

import { paths } from '../../config/paths';
import { isApiError } from '../../lib/api-client';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexDirection: 'column',
    alignItems: 'flex-start',
    gap: tokens.spacingVerticalM,
    maxWidth: '40rem',
  },
  title: { margin: 0 },
  text: { margin: 0, color: tokens.colorNeutralForeground2 },
  status: { margin: 0, fontVariantNumeric: 'tabular-nums', color: tokens.colorNeutralForeground3 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  action: { minHeight: '44px' },
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
  },
});

type ErrorDescription = { title: string; text: string; status?: number };

function describeError(error: unknown): ErrorDescription {
  if (isApiError(error)) {
    if (error.status === 403) {
      return { title: 'No access to this page', text: error.message, status: error.status };
    }
    if (error.status === 0) {
      return { title: 'Cannot reach the server', text: `${error.message} Check your connection and try again.` };
    }
    return {
      title: 'This page could not be loaded',
      text: `The server answered: ${error.message}`,
      status: error.status,
    };
  }
  if (isRouteErrorResponse(error)) {
    if (error.status === 403) {
      return { title: 'No access to this page', text: error.statusText || 'Your role does not give access to this page.' };
    }
    return {
      title: error.status === 404 ? 'Page not found' : 'This page could not be loaded',
      text: error.statusText || 'Something went wrong while opening this page.',
      status: error.status,
    };
  }
  // A lazy route chunk did not load. The service worker keeps every chunk of the installed version, so
  // this is a screen that was never fetched (no service worker yet, first visit without signal) or a
  // network failure: not a new version (that one is announced by AppUpdateBar).
  if (error instanceof TypeError && /dynamically imported module|module script|importing a module/i.test(error.message)) {
    return typeof navigator !== 'undefined' && !navigator.onLine
      ? {
          title: 'This screen is not on this device yet',
          text: 'There is no connection, and this screen has not been opened here with signal before. It opens as soon as the phone is back online.',
        }
      : { title: 'This screen could not be loaded', text: 'Part of the app did not arrive. Check your connection and reload the page.' };
  }
  return { title: 'Something went wrong', text: 'This page hit an unexpected problem. Reloading usually fixes it.' };
}

/** Shown in place of a page whose loader or rendering failed (a route's ErrorBoundary). */
export function RouteErrorPage() {
  const styles = useStyles();
  const error = useRouteError();
  const { title, text, status } = describeError(error);

  return (
    <div role="alert" className={styles.root}>
      <title>{`${title} · Loamline`}</title>
      <Text as="h2" block size={700} weight="semibold" className={styles.title}>
        {title}
      </Text>
      <Text as="p" block size={400} className={styles.text}>
        {text}
      </Text>
      {status !== undefined && <p className={styles.status}>Status {status}</p>}
      <div className={styles.actions}>
        <Button
          appearance="primary"
          className={styles.action}
          icon={<ArrowClockwise20Regular />}
          onClick={() => window.location.reload()}
        >
          Reload the page
        </Button>
        <Link to={paths.home.getHref()} className={styles.link}>
          Go to the home page
        </Link>
      </div>
    </div>
  );
}
