import { Button, DrawerBody, DrawerHeader, DrawerHeaderTitle, makeStyles, OverlayDrawer, tokens } from '@fluentui/react-components';
import { Dismiss24Regular } from '@fluentui/react-icons';

import { MainNav } from './main-nav';
import type { NavItem } from './nav-items';

const useStyles = makeStyles({
  body: { paddingBlock: tokens.spacingVerticalS },
  close: { minWidth: '48px', minHeight: '48px' },
});

type NavDrawerProps = {
  navItems: readonly NavItem[];
  open: boolean;
  onOpenChange: (open: boolean) => void;
};

/**
 * The main navigation as a drawer, for phones. Its own chunk (the drawer brings Fluent's dialog and
 * focus trap): the app shell loads it the first time the menu button is pressed.
 */
export function NavDrawer({ navItems, open, onOpenChange }: NavDrawerProps) {
  const styles = useStyles();
  const close = () => onOpenChange(false);
  return (
    <OverlayDrawer open={open} onOpenChange={(_event, data) => onOpenChange(data.open)} position="start" size="small" aria-label="Menu">
      <DrawerHeader>
        <DrawerHeaderTitle
          action={
            <Button appearance="subtle" className={styles.close} icon={<Dismiss24Regular />} aria-label="Close menu" onClick={close} />
          }
        >
          Menu
        </DrawerHeaderTitle>
      </DrawerHeader>
      <DrawerBody className={styles.body}>
        <nav aria-label="Main">
          <MainNav items={navItems} onNavigate={close} />
        </nav>
      </DrawerBody>
    </OverlayDrawer>
  );
}
