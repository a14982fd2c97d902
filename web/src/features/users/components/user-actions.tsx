import {
  Button,
  makeStyles,
  Menu,
  MenuDivider,
  MenuGroup,
  MenuGroupHeader,
  MenuItem,
  MenuItemRadio,
  MenuList,
  MenuPopover,
  MenuTrigger,
  Text,
} from '@fluentui/react-components';
import { MoreHorizontal20Regular, PersonProhibited20Regular, PersonAvailable20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@domain/auth/roles';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import type { UserResponse } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

const useStyles = makeStyles({
  trigger: { minHeight: '44px', minWidth: '44px' },
  item: { minHeight: '44px' },
});

/** Change role, disable or enable: for an admin, on anyone but themselves. */
export function UserActions({ user }: { user: UserResponse }) {
  const styles = useStyles();
  const notify = useNotify();
  const update = useUpdateUser();
  const [isConfirming, setIsConfirming] = useState(false);

  const changeRole = (role: Role) => {
    if (role === user.role) return;
    update.mutate(
      { id: user.id, changes: { role } },
      {
        onSuccess: (updated) => notify.success('Role changed', `${updated.name} is now ${ROLE_LABELS[updated.role]}.`),
        onError: (error) => notify.error(`Could not change ${user.name}'s role`, describeRequestError(error)),
      },
    );
  };

  const toggleDisabled = () => {
    const isDisabled = !user.isDisabled;
    update.mutate(
      { id: user.id, changes: { isDisabled } },
      {
        onSuccess: (updated) => {
          setIsConfirming(false);
          notify.success(
            isDisabled ? 'Account disabled' : 'Account enabled',
            isDisabled ? `${updated.name} can no longer sign in.` : `${updated.name} can sign in again.`,
          );
        },
        onError: (error) => {
          setIsConfirming(false);
          notify.error(`Could not change ${user.name}'s account`, describeRequestError(error));
        },
      },
    );
  };

  return (
    <>
      <Menu
        checkedValues={{ role: [user.role] }}
        onCheckedValueChange={(_event, data) => {
          const [role] = data.checkedItems;
          if (role) changeRole(role as Role);
        }}
      >
        <MenuTrigger disableButtonEnhancement>
          <Button
            appearance="subtle"
            className={styles.trigger}
            icon={<MoreHorizontal20Regular />}
            aria-label={`Change ${user.name}`}
            disabled={update.isPending}
          />
        </MenuTrigger>
        <MenuPopover>
          <MenuList>
            <MenuGroup>
              <MenuGroupHeader>Role</MenuGroupHeader>
              {ROLES.map((role) => (
                <MenuItemRadio key={role} name="role" value={role} className={styles.item}>
                  {ROLE_LABELS[role]}
                </MenuItemRadio>
              ))}
            </MenuGroup>
            <MenuDivider />
            <MenuItem
              className={styles.item}
              icon={user.isDisabled ? <PersonAvailable20Regular /> : <PersonProhibited20Regular />}
              onClick={() => setIsConfirming(true)}
            >
              {user.isDisabled ? 'Enable account…' : 'Disable account…'}
            </MenuItem>
          </MenuList>
        </MenuPopover>
      </Menu>
      <ConfirmDialog
        open={isConfirming}
        title={user.isDisabled ? `Enable ${user.name}?` : `Disable ${user.name}?`}
        confirmLabel={user.isDisabled ? 'Enable account' : 'Disable account'}
        isPending={update.isPending}
        onConfirm={toggleDisabled}
        onCancel={() => setIsConfirming(false)}
      >
        <Text>
          {user.isDisabled
            ? `${user.name} (${user.email}) will be able to sign in again with their password.`
            : `${user.name} (${user.email}) is signed out everywhere and cannot sign in until an admin enables the account. Their work stays in Loamline.`}
        </Text>
      </ConfirmDialog>
    </>
  );
}
