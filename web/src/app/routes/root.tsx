import { makeStyles, tokens } from '@fluentui/react-components';
import { Outlet } from 'react-router';

import { RouteErrorPage } from '../../components/errors/route-error-page';
import { restoreSession } from '../../features/auth/api/restore-session';
import { useSessionKeepAlive } from '../../features/auth/hooks/use-session-keep-alive';

const useStyles = makeStyles({
  bare: { padding: tokens.spacingHorizontalXL },
});

export const clientLoader = () => async () => {
  // Ask once per page load whether the refresh cookie still holds a session, so a reload keeps the
  // user signed in. Public pages open even if the server cannot be reached; the signed-in area
  // reports that itself.
  await restoreSession().catch(() => undefined);
  return null;
};

/** Above every page, signed in or not. */
export default function Root() {
  useSessionKeepAlive();
  return <Outlet />;
}

export function ErrorBoundary() {
  const styles = useStyles();
  return (
    <main className={styles.bare}>
      <RouteErrorPage />
    </main>
  );
}
