import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { Delete20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { ROLE_LABELS } from '@domain/auth/roles';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { formatDateTime } from '../../../lib/format-date';
import { describeRequestError } from '../../../lib/form-errors';
import type { InvitationResponse } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  item: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  who: { flex: '1 1 16rem', minWidth: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS },
  email: { overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground2 },
  revoke: { minHeight: '44px' },
  empty: { margin: 0, color: tokens.colorNeutralForeground2 },
});

/** Invitations sent but not yet accepted, each with a way to withdraw it. */
export function InvitationsList({ invitations }: { invitations: readonly InvitationResponse[] }) {
  const styles = useStyles();
  const notify = useNotify();
  const revoke = useRevokeInvitation();
  const [pending, setPending] = useState<InvitationResponse | undefined>();

  if (invitations.length === 0) {
    return (
      <Text as="p" block className={styles.empty}>
        No invitations waiting. Anyone you invite shows here until they accept.
      </Text>
    );
  }

  const confirmRevoke = () => {
    if (!pending) return;
    revoke.mutate(pending.id, {
      onSuccess: () => notify.success('Invitation withdrawn', `The link sent to ${pending.email} no longer works.`),
      onError: (error) => notify.error('Could not withdraw the invitation', describeRequestError(error)),
      onSettled: () => setPending(undefined),
    });
  };

  return (
    <>
      <ul className={styles.list} aria-label="Waiting invitations">
        {invitations.map((invitation) => (
          <li key={invitation.id} className={styles.item}>
            <div className={styles.who}>
              <Text weight="semibold" className={styles.email}>
                {invitation.name ? `${invitation.name} · ${invitation.email}` : invitation.email}
              </Text>
              <Text size={200} className={styles.muted}>
                {ROLE_LABELS[invitation.role]} · sent {formatDateTime(invitation.createdAt)} · link works until{' '}
                {formatDateTime(invitation.expiresAt)}
              </Text>
            </div>
            <Button
              className={styles.revoke}
              icon={<Delete20Regular />}
              aria-label={`Withdraw the invitation to ${invitation.email}`}
              onClick={() => setPending(invitation)}
            >
              Withdraw
            </Button>
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={pending !== undefined}
        title="Withdraw this invitation?"
        confirmLabel="Withdraw"
        isPending={revoke.isPending}
        onConfirm={confirmRevoke}
        onCancel={() => setPending(undefined)}
      >
        <Text>
          The link sent to {pending?.email} stops working. You can invite them again later.
        </Text>
      </ConfirmDialog>
    </>
  );
}
