import { Badge, Button, Input, makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { Add20Regular, Copy20Regular, Delete20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { z } from 'zod';
import { CreateLocateLinkSchema } from '@domain/locate/locate-link.schema';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { formatDate, formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { useCreateLocateLink, type CreatedLocateLinkResponse } from '../api/create-locate-link';
import { type LocateLinkResponse, useLocateLinks } from '../api/get-locate-links';
import { useRevokeLocateLink } from '../api/revoke-locate-link';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  created: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  url: { display: 'flex', gap: tokens.spacingHorizontalS, alignItems: 'stretch' },
  urlInput: { flexGrow: 1, minHeight: '48px', fontFamily: tokens.fontFamilyMonospace },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  rowText: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS },
  muted: { color: tokens.colorNeutralForeground2 },
  button: { minHeight: '44px' },
});

function CreatedLink({ link }: { link: CreatedLocateLinkResponse }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const notify = useNotify();
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(link.url);
      notify.success('Link copied');
    } catch {
      notify.error('Could not copy', 'Select the link and copy it by hand.');
    }
  };
  return (
    <div className={styles.created}>
      <MessageBar intent="warning">
        <MessageBarBody>Copy this link now: it cannot be shown again. If you lose it, make a new one.</MessageBarBody>
      </MessageBar>
      <div className={styles.url}>
        <Input readOnly value={link.url} className={styles.urlInput} aria-label="New locate link" onFocus={(e) => e.currentTarget.select()} />
        <Button className={styles.button} icon={<Copy20Regular />} onClick={() => void copy()}>
          Copy
        </Button>
      </div>
      <Text className={styles.muted}>Works until {formatDate(link.expiresAt, dateStyle)}.</Text>
    </div>
  );
}

/** The form's text as typed; parsed into the shared CreateLocateLinkSchema (blank days: not a number, blank note: none). */
const LocateLinkFormSchema = z
  .object({ expiresInDays: z.string(), note: z.string() })
  .transform(
    ({ expiresInDays, note }): z.input<typeof CreateLocateLinkSchema> => ({
      expiresInDays: expiresInDays.trim() === '' ? Number.NaN : Number(expiresInDays),
      ...(note.trim() === '' ? {} : { note }),
    }),
  )
  .pipe(CreateLocateLinkSchema);

/** Make a link for a contractor: how long it works, an optional note; then show its URL once. */
export function CreateLocateLinkDialog({ siteId }: { siteId: string }) {
  const styles = useStyles();
  const create = useCreateLocateLink();
  const [created, setCreated] = useState<CreatedLocateLinkResponse | undefined>();

  return (
    <FormDialog
      trigger={
        <Button appearance="primary" className={styles.button} icon={<Add20Regular />}>
          New locate link
        </Button>
      }
      title="New locate link"
      schema={LocateLinkFormSchema}
      defaultValues={{ expiresInDays: '14', note: '' }}
      isPending={create.isPending}
      submitLabel="Create link"
      onOpenChange={(open) => {
        if (open) return;
        setCreated(undefined);
        create.reset();
      }}
      view={created && { title: 'Locate link ready', content: <CreatedLink link={created} />, closeLabel: 'Done' }}
      onSubmit={(input, { showFieldErrors, showMessage }) =>
        create.mutate(
          { siteId, input },
          {
            onSuccess: setCreated,
            onError: (error) => {
              if (!showFieldErrors(error)) showMessage(describeRequestError(error));
            },
          },
        )
      }
    >
      {(form, fieldError) => (
        <>
          <Text>
            Send this link to whoever is about to dig (landscaper, fence or irrigation contractor). It shows the map of buried cables and
            their depths, without signing in.
          </Text>
          <FormTextField
            form={form}
            name="expiresInDays"
            label="Works for (days)"
            required
            type="number"
            inputMode="numeric"
            min={1}
            max={365}
            hint="1 to 365 days"
            error={fieldError('expiresInDays')}
          />
          <FormTextField
            form={form}
            name="note"
            label="Note (optional)"
            isMultiline
            maxLength={500}
            hint="Shown to whoever opens the link"
            error={fieldError('note')}
          />
        </>
      )}
    </FormDialog>
  );
}

function LinkRow({ link, onRevoke }: { link: LocateLinkResponse; onRevoke: (link: LocateLinkResponse) => void }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const status = link.revokedAt ? 'revoked' : link.isActive ? 'active' : 'expired';
  return (
    <li className={styles.row}>
      <div className={styles.rowText}>
        <Text weight="semibold">
          {link.note ?? (link.isLongLived ? 'Packet QR code' : 'Locate link')}{' '}
          <Badge appearance="tint" color={status === 'active' ? 'success' : 'subtle'}>
            {status}
          </Badge>
        </Text>
        <Text size={200} className={styles.muted}>
          Made {formatDate(link.createdAt, dateStyle)}
          {link.createdBy ? ` by ${link.createdBy.name}` : ''} · {status === 'revoked' ? `revoked ${formatDate(link.revokedAt!, dateStyle)}` : `until ${formatDate(link.expiresAt, dateStyle)}`}
        </Text>
        <Text size={200} className={styles.muted}>
          Opened {link.accessCount} {link.accessCount === 1 ? 'time' : 'times'}
          {link.lastAccessedAt ? `, last ${formatDateTime(link.lastAccessedAt, dateStyle)}` : ''}
        </Text>
      </div>
      {link.isActive && (
        <Button className={styles.button} icon={<Delete20Regular />} onClick={() => onRevoke(link)}>
          Revoke
        </Button>
      )}
    </li>
  );
}

/** The site's locate links: make one, see who opened them, revoke. */
export function LocateLinks({ siteId }: { siteId: string }) {
  const styles = useStyles();
  const notify = useNotify();
  const links = useLocateLinks(siteId);
  const revoke = useRevokeLocateLink();
  const [revoking, setRevoking] = useState<LocateLinkResponse | undefined>();

  return (
    <div className={styles.root}>
      <div>
        <CreateLocateLinkDialog siteId={siteId} />
      </div>
      {links.isPending && <Spinner size="small" label="Loading links…" />}
      {links.isError && <Text>{describeRequestError(links.error)}</Text>}
      {links.data &&
        (links.data.length === 0 ? (
          <Text className={styles.muted}>No locate links yet.</Text>
        ) : (
          <ul className={styles.list} aria-label="Locate links">
            {links.data.map((link) => (
              <LinkRow key={link.id} link={link} onRevoke={setRevoking} />
            ))}
          </ul>
        ))}
      <ConfirmDialog
        open={revoking !== undefined}
        title="Revoke this link?"
        confirmLabel="Revoke"
        isPending={revoke.isPending}
        onCancel={() => setRevoking(undefined)}
        onConfirm={() => {
          if (!revoking) return;
          revoke.mutate(
            { id: revoking.id, siteId },
            {
              onSuccess: () => {
                notify.success('Link revoked');
                setRevoking(undefined);
              },
              onError: (error) => notify.error('Could not revoke the link', describeRequestError(error)),
            },
          );
        }}
      >
        Whoever has it will see that it no longer works. This cannot be undone; you can make a new link.
      </ConfirmDialog>
    </div>
  );
}
