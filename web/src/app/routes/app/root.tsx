import { makeStyles, tokens } from '@fluentui/react-components';
import { Outlet } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AppShell } from '../../../components/layouts/app-shell';

const useStyles = makeStyles({
  bare: { padding: tokens.spacingHorizontalXL },
});

export default function AppRoot() {
  return (
    <AppShell>
      <Outlet />
    </AppShell>
  );
}

// If the shell itself fails there is no frame to show the error in.
export function ErrorBoundary() {
  const styles = useStyles();
  return (
    <main className={styles.bare}>
      <RouteErrorPage />
    </main>
  );
}
