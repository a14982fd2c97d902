import { Button, Field, makeStyles, MessageBar, MessageBarBody, Radio, RadioGroup, Select, Text, tokens } from '@fluentui/react-components';
import { LinkDismiss20Regular, PersonAdd20Regular } from '@fluentui/react-icons';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { InviteHomeownerSchema } from '@domain/sites/homeowner-invitation.schema';
import { LinkHomeownerSchema, type SiteResponse } from '@domain/sites/site.schema';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { getUsersQueryOptions } from '../../users';
import { useInviteHomeowner } from '../api/invite-homeowner';
import { useLinkHomeowner } from '../api/link-homeowner';
import { useUnlinkHomeowner } from '../api/unlink-homeowner';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    minHeight: '56px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  who: { display: 'flex', flexDirection: 'column', minWidth: 0, overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground2 },
  control: { minHeight: '48px' },
  surface: { maxWidth: '32rem' },
});

type SiteHomeownersProps = { site: Pick<SiteResponse, 'id' | 'label' | 'homeowners'>; canChange: boolean };

/** Who sees this site in the homeowner portal; the office links an account or invites one by e-mail. */
export function SiteHomeowners({ site, canChange }: SiteHomeownersProps) {
  const styles = useStyles();
  const notify = useNotify();
  const unlink = useUnlinkHomeowner();
  const [unlinking, setUnlinking] = useState<SiteResponse['homeowners'][number] | undefined>();

  const confirmUnlink = () => {
    if (!unlinking) return;
    const owner = unlinking;
    unlink.mutate(
      { siteId: site.id, userId: owner.id },
      {
        onSuccess: () => {
          setUnlinking(undefined);
          notify.success('Homeowner unlinked', `${owner.name} no longer sees ${site.label} in the portal.`);
        },
      },
    );
  };

  return (
    <div className={styles.root}>
      {site.homeowners.length === 0 ? (
        <Text className={styles.muted}>No homeowner account is linked to this site yet.</Text>
      ) : (
        <ul className={styles.list} aria-label="Homeowners">
          {site.homeowners.map((owner) => (
            <li key={owner.id} className={styles.row}>
              <span className={styles.who}>
                <Text weight="semibold">{owner.name}</Text>
                <Text className={styles.muted}>{owner.email}</Text>
              </span>
              {canChange && (
                <Button className={styles.control} icon={<LinkDismiss20Regular />} aria-label={`Unlink ${owner.name}`} onClick={() => setUnlinking(owner)}>
                  Unlink
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {canChange && (
        <div>
          <AddHomeownerDialog site={site} />
        </div>
      )}
      <ConfirmDialog
        open={unlinking !== undefined}
        title={`Unlink ${unlinking?.name ?? ''}?`}
        confirmLabel="Unlink"
        isPending={unlink.isPending}
        onConfirm={confirmUnlink}
        onCancel={() => {
          unlink.reset();
          setUnlinking(undefined);
        }}
      >
        {unlink.isError && (
          <MessageBar intent="error" layout="multiline">
            <MessageBarBody>{describeRequestError(unlink.error)}</MessageBarBody>
          </MessageBar>
        )}
        <Text as="p" block>
          They no longer see {site.label}, its packets and its buried-cable map in the portal, and cannot make new locate links for
          it. Their account stays, and locate links they already shared keep working until they expire. You can link them again later.
        </Text>
      </ConfirmDialog>
    </div>
  );
}

/** How the homeowner is added, as the form holds it; each way parses into its shared request schema. */
const AddHomeownerFormSchema = z.discriminatedUnion('how', [
  z.object({
    how: z.literal('link'),
    userId: z.string().min(1, { error: 'Choose the homeowner to link.' }).pipe(LinkHomeownerSchema.shape.userId),
    email: z.string(),
    name: z.string(),
  }),
  z.object({
    how: z.literal('invite'),
    userId: z.string(),
    email: InviteHomeownerSchema.shape.email,
    // Blank: they fill in their name when they accept.
    name: z
      .string()
      .transform((name) => (name.trim() === '' ? undefined : name))
      .pipe(InviteHomeownerSchema.shape.name),
  }),
]);
type AddHomeownerForm = z.input<typeof AddHomeownerFormSchema>;

const EMPTY: AddHomeownerForm = { how: 'link', userId: '', email: '', name: '' };

function AddHomeownerDialog({ site }: { site: SiteHomeownersProps['site'] }) {
  const styles = useStyles();
  const notify = useNotify();
  const [open, setOpen] = useState(false);
  const link = useLinkHomeowner();
  const invite = useInviteHomeowner();
  const users = useQuery({ ...getUsersQueryOptions(), enabled: open });
  const linkedIds = new Set(site.homeowners.map((owner) => owner.id));
  const candidates = (users.data ?? []).filter((user) => user.role === 'homeowner' && !user.isDisabled && !linkedIds.has(user.id));

  return (
    <FormDialog
      trigger={
        <Button className={styles.control} icon={<PersonAdd20Regular />}>
          Add homeowner
        </Button>
      }
      title={`Add a homeowner to ${site.label}`}
      formLabel="Add a homeowner"
      schema={AddHomeownerFormSchema}
      defaultValues={EMPTY}
      submitLabel={(values) => (values.how === 'link' ? 'Link homeowner' : 'Send invitation')}
      surfaceClassName={styles.surface}
      onOpenChange={setOpen}
      onSubmit={async (values, { close, showFieldErrors, showMessage }) => {
        try {
          if (values.how === 'link') {
            await link.mutateAsync({ siteId: site.id, userId: values.userId });
            notify.success('Homeowner linked', `${candidates.find((user) => user.id === values.userId)?.name ?? 'They'} now see ${site.label} in the portal.`);
          } else {
            await invite.mutateAsync({ siteId: site.id, input: { email: values.email, ...(values.name ? { name: values.name } : {}) } });
            notify.success('Invitation sent', `${values.email} is linked to ${site.label} when they accept.`);
          }
          close();
        } catch (error) {
          if (!showFieldErrors(error)) showMessage(describeRequestError(error));
        }
      }}
    >
      {(form, fieldError) => (
        <>
          <Controller
            control={form.control}
            name="how"
            render={({ field }) => (
              <RadioGroup value={field.value} onChange={(_event, data) => field.onChange(data.value)} aria-label="How">
                <Radio value="link" label="They already have a portal account" />
                <Radio value="invite" label="Invite them by e-mail" />
              </RadioGroup>
            )}
          />
          {form.watch('how') === 'link' ? (
            <Controller
              control={form.control}
              name="userId"
              render={({ field }) => (
                <Field
                  label="Homeowner"
                  required
                  validationMessage={fieldError('userId')}
                  hint={!users.isLoading && candidates.length === 0 ? 'No other homeowner account yet: invite them by e-mail.' : undefined}
                >
                  <Select ref={field.ref} className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur}>
                    <option value="">{users.isLoading ? 'Loading…' : 'Choose a homeowner'}</option>
                    {candidates.map((user) => (
                      <option key={user.id} value={user.id}>
                        {user.name} ({user.email})
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
            />
          ) : (
            <>
              <FormTextField form={form} name="email" label="E-mail" required type="email" autoComplete="off" error={fieldError('email')} />
              <FormTextField form={form} name="name" label="Name" hint="Optional: they can fill it in when they accept." error={fieldError('name')} />
              <Text className={styles.muted}>
                The e-mail has a link to set a password. When they accept, this site is linked to their account. Open invitations are listed on
                the Users page.
              </Text>
            </>
          )}
        </>
      )}
    </FormDialog>
  );
}
