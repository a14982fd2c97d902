import { makeStyles, tokens } from '@fluentui/react-components';
import { lazy, Suspense } from 'react';
import { Link, Outlet, useLocation } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AppShell } from '../../../components/layouts/app-shell';
import { buildNavItems } from '../../../components/layouts/nav-items';
import { paths } from '../../../config/paths';
import { restoreSession } from '../../../features/auth/api/restore-session';
import { currentPathOf } from '../../../features/auth/utils/safe-next-path';
import { WaitingToSend } from '../../../features/jobs/components/waiting-to-send';
import { useHasOutbox } from '../../../features/outbox/api/get-mail-status';
import { useSessionUser } from '../../../lib/session';

// The account menu (Fluent's menu, popover positioning, avatar) is its own chunk: the loader below
// starts fetching it while the page's data loads, and a box of the trigger's size holds its place
// should it arrive after the frame.
const loadUserMenu = () => import('../../../features/auth/components/user-menu');
const UserMenu = lazy(() => loadUserMenu().then(({ UserMenu }) => ({ default: UserMenu })));

export const clientLoader = () => () => {
  // Not awaited: the page does not wait for the menu. `restoreSession` asks the server once per page load.
  // A failed fetch is left to the menu itself, which asks again when it renders.
  void restoreSession()
    .then((user) => (user ? loadUserMenu() : undefined))
    .catch(() => undefined);
  return null;
};

const useStyles = makeStyles({
  bare: { padding: tokens.spacingHorizontalXL },
  userMenuPlaceholder: { minWidth: '48px', minHeight: '48px' },
  signIn: {
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    paddingInline: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorBrandBackground,
    color: tokens.colorNeutralForegroundOnBrand,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorBrandBackgroundHover },
  },
});

/** The app frame. Most pages in it need a session; System status and "not found" do not. */
export default function AppRoot() {
  const styles = useStyles();
  const user = useSessionUser();
  const location = useLocation();
  const hasOutbox = useHasOutbox(user?.role === 'admin' || user?.role === 'office');

  return (
    <AppShell
      navItems={buildNavItems({ role: user?.role, hasOutbox })}
      headerEnd={
        user ? (
          <>
            <WaitingToSend />
            <Suspense fallback={<div className={styles.userMenuPlaceholder} />}>
              <UserMenu user={user} />
            </Suspense>
          </>
        ) : (
          <Link to={paths.signIn.getHref(currentPathOf(location))} reloadDocument className={styles.signIn}>
            Sign in
          </Link>
        )
      }
    >
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
