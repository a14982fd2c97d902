import {
  Avatar,
  Button,
  makeStyles,
  Menu,
  MenuDivider,
  MenuItem,
  MenuList,
  MenuPopover,
  MenuTrigger,
  Text,
  tokens,
} from '@fluentui/react-components';
import { SignOut20Regular } from '@fluentui/react-icons';
import { ROLE_LABELS } from '@domain/auth/roles';

import { paths } from '../../../config/paths';
import { pageLoad } from '../../../lib/page-load';
import type { SessionUser } from '../../../lib/session';
import { useSignOut } from '../api/sign-out';

const useStyles = makeStyles({
  trigger: {
    minHeight: '48px',
    minWidth: '48px',
    maxWidth: '18rem',
    gap: tokens.spacingHorizontalS,
    paddingInline: tokens.spacingHorizontalS,
  },
  triggerName: {
    overflow: 'hidden',
    textOverflow: 'ellipsis',
    whiteSpace: 'nowrap',
    // On a phone the avatar alone opens the menu; the name is inside it.
    '@media (max-width: 599.98px)': { display: 'none' },
  },
  identity: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalXXS,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalS}`,
    maxWidth: '18rem',
  },
  wrap: { overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground2, overflowWrap: 'anywhere' },
  item: { minHeight: '44px' },
});

type UserMenuProps = { user: SessionUser };

/** The signed-in person (name, role, company) and the way to sign out, in the header. */
export function UserMenu({ user }: UserMenuProps) {
  const styles = useStyles();
  const signOut = useSignOut();

  const handleSignOut = () => {
    signOut.mutate(undefined, {
      // The sign-in page is a page of its own (web/sign-in.html): a full page load.
      onSettled: () => pageLoad.replace(paths.signIn.getHref()),
    });
  };

  return (
    <Menu positioning="below-end">
      <MenuTrigger disableButtonEnhancement>
        <Button
          appearance="subtle"
          className={styles.trigger}
          aria-label={`Account: ${user.name}`}
          icon={<Avatar name={user.name} size={32} color="colorful" aria-hidden="true" />}
        >
          <span className={styles.triggerName}>{user.name}</span>
        </Button>
      </MenuTrigger>
      <MenuPopover>
        <div className={styles.identity}>
          <Text weight="semibold" size={400} className={styles.wrap}>
            {user.name}
          </Text>
          <Text className={styles.muted}>
            {ROLE_LABELS[user.role]} · {user.companyName}
          </Text>
          <Text size={200} className={styles.muted}>
            {user.email}
          </Text>
        </div>
        <MenuDivider />
        <MenuList>
          <MenuItem
            className={styles.item}
            icon={<SignOut20Regular />}
            disabled={signOut.isPending}
            onClick={handleSignOut}
          >
            Sign out
          </MenuItem>
        </MenuList>
      </MenuPopover>
    </Menu>
  );
}
