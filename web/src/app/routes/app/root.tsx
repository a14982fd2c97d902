import { makeStyles, tokens } from '@fluentui/react-components';
import { Link, Outlet, useLocation } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AppShell } from '../../../components/layouts/app-shell';
import { buildNavItems } from '../../../components/layouts/nav-items';
import { paths } from '../../../config/paths';
import { UserMenu } from '../../../features/auth/components/user-menu';
import { currentPathOf } from '../../../features/auth/utils/safe-next-path';
import { useHasOutbox } from '../../../features/outbox/api/get-outbox';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  bare: { padding: tokens.spacingHorizontalXL },
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
  const hasOutbox = useHasOutbox(user?.role === 'admin');

  return (
    <AppShell
      navItems={buildNavItems({ role: user?.role, hasOutbox })}
      headerEnd={
        user ? (
          <UserMenu user={user} />
        ) : (
          <Link to={paths.signIn.getHref(currentPathOf(location))} className={styles.signIn}>
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
