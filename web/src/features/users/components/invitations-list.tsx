import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { ArrowClockwise20Regular, Delete20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { ROLE_LABELS } from '@domain/auth/roles';
import type { DateStyle } from '@domain/format/date-time';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { describeRequestError } from '../../../lib/form-errors';
import type { InvitationResponse } from '../api/get-invitations';
import { useResendInvitation } from '../api/resend-invitation';
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
  problem: { color: tokens.colorPaletteRedForeground1, overflowWrap: 'anywhere' },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  revoke: { minHeight: '44px' },
  empty: { margin: 0, color: tokens.colorNeutralForeground2 },
});

/** Where the invitation's e-mail is, in words; `isProblem` when it will not arrive without help. */
function describeMail(mail: InvitationResponse['mail'], dateStyle: DateStyle): { text: string; isProblem: boolean; canResend: boolean } {
  switch (mail?.status) {
    case 'sent':
      return { text: `E-mail sent ${mail.sentAt ? formatDateTime(mail.sentAt, dateStyle) : ''}`.trim(), isProblem: false, canResend: false };
    case 'queued':
    case 'sending':
      return mail.lastError
        ? { text: 'E-mail not sent yet: the mail server did not take it; trying again', isProblem: false, canResend: false }
        : { text: 'E-mail on its way', isProblem: false, canResend: false };
    case 'failed':
      return {
        text: `E-mail not sent after ${mail.attempts} ${mail.attempts === 1 ? 'try' : 'tries'}${mail.lastError ? ` (${mail.lastError})` : ''}`,
        isProblem: true,
        canResend: true,
      };
    default:
      return { text: 'No e-mail waiting for this invitation', isProblem: true, canResend: true };
  }
}

/** Invitations sent but not yet accepted, each with where its e-mail is and a way to withdraw it. */
export function InvitationsList({ invitations }: { invitations: readonly InvitationResponse[] }) {
  const styles = useStyles();
  const dateStyle = useDateStyle();
  const notify = useNotify();
  const revoke = useRevokeInvitation();
  const resend = useResendInvitation();
  const [pending, setPending] = useState<InvitationResponse | undefined>();

  if (invitations.length === 0) {
    return (
      <Text as="p" block className={styles.empty}>
        No invitations waiting. Anyone you invite shows here until they accept.
      </Text>
    );
  }

  const sendAgain = (invitation: InvitationResponse) => {
    resend.mutate(invitation.id, {
      onSuccess: () => notify.success('Invitation queued again', `A new link is on its way to ${invitation.email}.`),
      onError: (error) => notify.error('Could not send the invitation again', describeRequestError(error)),
    });
  };

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
        {invitations.map((invitation) => {
          const mail = describeMail(invitation.mail, dateStyle);
          return (
            <li key={invitation.id} className={styles.item}>
              <div className={styles.who}>
                <Text weight="semibold" className={styles.email}>
                  {invitation.name ? `${invitation.name} · ${invitation.email}` : invitation.email}
                </Text>
                <Text size={200} className={styles.muted}>
                  {ROLE_LABELS[invitation.role]} · invited {formatDateTime(invitation.createdAt, dateStyle)} · link works until{' '}
                  {formatDateTime(invitation.expiresAt, dateStyle)}
                </Text>
                {invitation.mail !== undefined && (
                  <Text size={200} className={mail.isProblem ? styles.problem : styles.muted}>
                    {mail.text}
                  </Text>
                )}
              </div>
              <div className={styles.actions}>
                {invitation.mail !== undefined && mail.canResend && (
                  <Button
                    className={styles.revoke}
                    icon={<ArrowClockwise20Regular />}
                    aria-label={`Send the invitation to ${invitation.email} again`}
                    disabled={resend.isPending && resend.variables === invitation.id}
                    onClick={() => sendAgain(invitation)}
                  >
                    Send again
                  </Button>
                )}
                <Button
                  className={styles.revoke}
                  icon={<Delete20Regular />}
                  aria-label={`Withdraw the invitation to ${invitation.email}`}
                  onClick={() => setPending(invitation)}
                >
                  Withdraw
                </Button>
              </div>
            </li>
          );
        })}
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
