import { Button, makeStyles, tokens } from '@fluentui/react-components';
import { Navigation24Regular } from '@fluentui/react-icons';
import { lazy, Suspense, useState, type ReactNode } from 'react';
import { Link } from 'react-router';

import { paths } from '../../config/paths';
import { LogoMark } from '../logo';

import { MainNav } from './main-nav';
import type { NavItem } from './nav-items';

// The phone menu drawer is fetched the first time it is opened: wide screens never need it.
const NavDrawer = lazy(() => import('./nav-drawer').then(({ NavDrawer }) => ({ default: NavDrawer })));

// Below this width the side navigation folds into a menu drawer.
const WIDE = '@media (min-width: 768px)';
const NARROW = '@media (max-width: 767.98px)';

const useStyles = makeStyles({
  root: {
    minHeight: '100dvh',
    display: 'grid',
    gridTemplateRows: 'auto 1fr',
    backgroundColor: tokens.colorNeutralBackground2,
  },
  skipLink: {
    position: 'absolute',
    insetInlineStart: tokens.spacingHorizontalM,
    top: tokens.spacingVerticalM,
    zIndex: 2,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorBrandForegroundLink,
    boxShadow: tokens.shadow8,
    transform: 'translateY(-200%)',
    ':focus': { transform: 'none' },
  },
  header: {
    position: 'sticky',
    top: 0,
    zIndex: 1,
    display: 'flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    minHeight: '56px',
    paddingInline: tokens.spacingHorizontalM,
    backgroundColor: tokens.colorNeutralBackground1,
    borderBottom: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    [WIDE]: { paddingInline: tokens.spacingHorizontalXL },
  },
  headerEnd: { marginInlineStart: 'auto', display: 'flex', alignItems: 'center' },
  menuButton: {
    minWidth: '48px',
    minHeight: '48px',
    [WIDE]: { display: 'none' },
  },
  brand: {
    display: 'flex',
    paddingInlineEnd: tokens.spacingHorizontalXS,
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    minHeight: '48px',
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
    borderRadius: tokens.borderRadiusMedium,
    ':focus-visible': {
      outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}`,
    },
  },
  title: {
    margin: 0,
    fontSize: tokens.fontSizeBase500,
    lineHeight: tokens.lineHeightBase500,
    fontWeight: tokens.fontWeightBold,
    letterSpacing: '-0.01em',
  },
  body: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    [WIDE]: { gridTemplateColumns: '248px minmax(0, 1fr)' },
  },
  sideNav: {
    position: 'sticky',
    top: '57px',
    alignSelf: 'start',
    height: 'calc(100dvh - 57px)',
    overflowY: 'auto',
    boxSizing: 'border-box',
    padding: `${tokens.spacingVerticalL} ${tokens.spacingHorizontalM}`,
    backgroundColor: tokens.colorNeutralBackground1,
    borderRight: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    [NARROW]: { display: 'none' },
  },
  main: {
    minWidth: 0,
    boxSizing: 'border-box',
    width: '100%',
    maxWidth: '1040px',
    padding: `${tokens.spacingVerticalXL} ${tokens.spacingHorizontalL}`,
    ':focus': { outlineStyle: 'none' },
    [WIDE]: { padding: `${tokens.spacingVerticalXXXL} ${tokens.spacingHorizontalXXXL}` },
  },
});

type AppShellProps = {
  navItems: readonly NavItem[];
  /** Shown at the end of the header: the user menu, or a way to sign in. */
  headerEnd?: ReactNode;
  children: ReactNode;
};

/**
 * The frame around every signed-in page: a header with the product name, the main navigation (a side
 * column on wide screens, a menu drawer on phones) and the page itself.
 */
export function AppShell({ navItems, headerEnd, children }: AppShellProps) {
  const styles = useStyles();
  const [isMenuOpen, setIsMenuOpen] = useState(false);
  // Mounted from the first opening on, so closing it still animates.
  const [hasOpenedMenu, setHasOpenedMenu] = useState(false);
  const openMenu = () => {
    setHasOpenedMenu(true);
    setIsMenuOpen(true);
  };

  return (
    <div className={styles.root}>
      <a href="#main-content" className={styles.skipLink}>
        Skip to content
      </a>
      <header className={styles.header}>
        <Button
          appearance="subtle"
          className={styles.menuButton}
          icon={<Navigation24Regular />}
          aria-label="Open menu"
          aria-expanded={isMenuOpen}
          onClick={openMenu}
        />
        <h1 className={styles.title}>
          <Link to={paths.home.getHref()} className={styles.brand}>
            <LogoMark size={32} />
            Loamline
          </Link>
        </h1>
        {headerEnd && <div className={styles.headerEnd}>{headerEnd}</div>}
      </header>

      <div className={styles.body}>
        <nav aria-label="Main" className={styles.sideNav}>
          <MainNav items={navItems} />
        </nav>
        <main id="main-content" tabIndex={-1} className={styles.main}>
          {children}
        </main>
      </div>

      {hasOpenedMenu && (
        <Suspense fallback={null}>
          <NavDrawer navItems={navItems} open={isMenuOpen} onOpenChange={setIsMenuOpen} />
        </Suspense>
      )}
    </div>
  );
}
