import { zodResolver } from '@hookform/resolvers/zod';
import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  DialogTrigger,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Radio,
  RadioGroup,
  Select,
  Spinner,
  Text,
  tokens,
} from '@fluentui/react-components';
import { LinkDismiss20Regular, PersonAdd20Regular } from '@fluentui/react-icons';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { InviteHomeownerSchema } from '@domain/sites/homeowner-invitation.schema';
import type { SiteResponse } from '@domain/sites/site.schema';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, toSentence } from '../../../lib/form-errors';
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
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
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

const AddHomeownerFormSchema = z.discriminatedUnion('how', [
  z.object({ how: z.literal('link'), userId: z.string().min(1, { error: 'Choose the homeowner to link.' }), email: z.string(), name: z.string() }),
  z.object({
    how: z.literal('invite'),
    userId: z.string(),
    email: InviteHomeownerSchema.shape.email,
    name: z.string().trim().max(120),
  }),
]);
type AddHomeownerForm = z.input<typeof AddHomeownerFormSchema>;
type AddHomeownerValues = z.output<typeof AddHomeownerFormSchema>;

const EMPTY: AddHomeownerForm = { how: 'link', userId: '', email: '', name: '' };

function AddHomeownerDialog({ site }: { site: SiteHomeownersProps['site'] }) {
  const styles = useStyles();
  const notify = useNotify();
  const [open, setOpen] = useState(false);
  const link = useLinkHomeowner();
  const invite = useInviteHomeowner();
  const users = useQuery({ ...getUsersQueryOptions(), enabled: open });
  const [message, setMessage] = useState<string | undefined>();
  const { control, handleSubmit, watch, reset, setError, formState } = useForm<AddHomeownerForm, unknown, AddHomeownerValues>({
    resolver: zodResolver(AddHomeownerFormSchema),
    defaultValues: EMPTY,
  });
  const how = watch('how');
  const linkedIds = new Set(site.homeowners.map((owner) => owner.id));
  const candidates = (users.data ?? []).filter((user) => user.role === 'homeowner' && !user.isDisabled && !linkedIds.has(user.id));

  const close = () => {
    setOpen(false);
    setMessage(undefined);
    reset(EMPTY);
  };

  const save = handleSubmit(async (values) => {
    setMessage(undefined);
    try {
      if (values.how === 'link') {
        await link.mutateAsync({ siteId: site.id, userId: values.userId });
        notify.success('Homeowner linked', `${candidates.find((user) => user.id === values.userId)?.name ?? 'They'} now see ${site.label} in the portal.`);
      } else {
        const name = values.name === '' ? undefined : values.name;
        await invite.mutateAsync({ siteId: site.id, input: { email: values.email, ...(name ? { name } : {}) } });
        notify.success('Invitation sent', `${values.email} is linked to ${site.label} when they accept.`);
      }
      close();
    } catch (error) {
      const issues = isApiError(error) ? error.issues : [];
      for (const issue of issues) {
        const field = issue.path.split('.')[0];
        if (field === 'userId' || field === 'email' || field === 'name') setError(field, { message: toSentence(issue.message) });
      }
      if (issues.length === 0) setMessage(describeRequestError(error));
    }
  });

  return (
    <Dialog open={open} onOpenChange={(_event, data) => (data.open ? setOpen(true) : !formState.isSubmitting && close())}>
      <DialogTrigger disableButtonEnhancement>
        <Button className={styles.control} icon={<PersonAdd20Regular />}>
          Add homeowner
        </Button>
      </DialogTrigger>
      <DialogSurface className={styles.surface}>
        <form onSubmit={(event) => void save(event)} noValidate aria-label="Add a homeowner">
          <DialogBody>
            <DialogTitle>Add a homeowner to {site.label}</DialogTitle>
            <DialogContent className={styles.form}>
              {message && (
                <MessageBar intent="error" layout="multiline">
                  <MessageBarBody>{message}</MessageBarBody>
                </MessageBar>
              )}
              <Controller
                control={control}
                name="how"
                render={({ field }) => (
                  <RadioGroup value={field.value} onChange={(_event, data) => field.onChange(data.value)} aria-label="How">
                    <Radio value="link" label="They already have a portal account" />
                    <Radio value="invite" label="Invite them by e-mail" />
                  </RadioGroup>
                )}
              />
              {how === 'link' ? (
                <Controller
                  control={control}
                  name="userId"
                  render={({ field, fieldState }) => (
                    <Field
                      label="Homeowner"
                      required
                      validationMessage={fieldState.error?.message}
                      hint={!users.isLoading && candidates.length === 0 ? 'No other homeowner account yet: invite them by e-mail.' : undefined}
                    >
                      <Select className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur}>
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
                  <Controller
                    control={control}
                    name="email"
                    render={({ field, fieldState }) => (
                      <Field label="E-mail" required validationMessage={fieldState.error?.message && toSentence(fieldState.error.message)}>
                        <Input className={styles.control} type="email" autoComplete="off" value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur} />
                      </Field>
                    )}
                  />
                  <Controller
                    control={control}
                    name="name"
                    render={({ field, fieldState }) => (
                      <Field label="Name" hint="Optional: they can fill it in when they accept." validationMessage={fieldState.error?.message}>
                        <Input className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur} />
                      </Field>
                    )}
                  />
                  <Text className={styles.muted}>
                    The e-mail has a link to set a password. When they accept, this site is linked to their account. Open invitations are listed
                    on the Users page.
                  </Text>
                </>
              )}
            </DialogContent>
            <DialogActions fluid>
              <Button className={styles.control} disabled={formState.isSubmitting} onClick={close}>
                Cancel
              </Button>
              <Button
                type="submit"
                appearance="primary"
                className={styles.control}
                disabled={formState.isSubmitting}
                icon={formState.isSubmitting ? <Spinner size="tiny" /> : undefined}
              >
                {how === 'link' ? 'Link homeowner' : 'Send invitation'}
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
