import { Button, Field, makeStyles, Radio, RadioGroup, tokens } from '@fluentui/react-components';
import { PersonAdd20Regular } from '@fluentui/react-icons';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { CreateInvitationSchema } from '@domain/auth/auth.schema';
import { canInvite, ROLE_LABELS, ROLES, type Role } from '@domain/auth/roles';

import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';
import { useCreateInvitation } from '../api/create-invitation';
import { ROLE_DESCRIPTIONS } from '../utils/role-descriptions';

const useStyles = makeStyles({
  trigger: { minHeight: '44px' },
  surface: { maxWidth: '32rem' },
  radio: { minHeight: '44px', alignItems: 'flex-start' },
  radioLabel: { display: 'flex', flexDirection: 'column', color: tokens.colorNeutralForeground1 },
  radioName: { color: tokens.colorNeutralForeground1, fontWeight: tokens.fontWeightSemibold },
  radioDescription: { color: tokens.colorNeutralForeground2, fontSize: tokens.fontSizeBase200 },
});

/** The usual mistakes (nothing typed, no role chosen) said for people; then the shared schema. */
const InviteFormSchema = z
  .object({
    email: z.string().trim().min(1, { error: 'Enter the e-mail address to send the invitation to.' }),
    name: z
      .string()
      .transform((value) => (value.trim() === '' ? undefined : value))
      .optional(),
    role: z.string().min(1, { error: 'Choose what they will do in Loamline.' }),
  })
  .pipe(CreateInvitationSchema);

const EMPTY = { email: '', name: '', role: '' };

type InviteDialogProps = {
  /** The role of whoever is inviting: it limits the roles on offer. */
  actorRole: Role;
};

/** "Invite someone": e-mail, optional name and a role; the server e-mails the invitation link. */
export function InviteDialog({ actorRole }: InviteDialogProps) {
  const styles = useStyles();
  const notify = useNotify();
  const invite = useCreateInvitation();
  const roles = ROLES.filter((candidate) => canInvite(actorRole, candidate));

  return (
    <FormDialog
      trigger={
        <Button appearance="primary" className={styles.trigger} icon={<PersonAdd20Regular />}>
          Invite someone
        </Button>
      }
      title="Invite someone"
      schema={InviteFormSchema}
      defaultValues={EMPTY}
      isPending={invite.isPending}
      submitLabel="Send invitation"
      surfaceClassName={styles.surface}
      onOpenChange={(open) => !open && invite.reset()}
      onSubmit={(input, { close, form, showFieldErrors, showMessage }) =>
        invite.mutate(input, {
          onSuccess: (invitation) => {
            notify.success('Invitation sent', `${invitation.email} can join as ${ROLE_LABELS[invitation.role]}.`);
            close();
          },
          onError: (error) => {
            if (isApiError(error) && error.code === 'EMAIL_TAKEN') {
              form.setError('email', { message: 'Someone already has an account with this e-mail.' });
            } else if (!showFieldErrors(error)) {
              showMessage(describeRequestError(error, 'The invitation could not be sent. Try again.'));
            }
          },
        })
      }
    >
      {(form, fieldError) => (
        <>
          <FormTextField
            form={form}
            name="email"
            label="E-mail"
            required
            type="email"
            autoComplete="off"
            inputMode="email"
            autoCapitalize="none"
            spellCheck={false}
            error={fieldError('email')}
          />
          <FormTextField form={form} name="name" label="Name" hint="Optional. They can change it when they accept." autoComplete="off" error={fieldError('name')} />
          <Controller
            control={form.control}
            name="role"
            render={({ field }) => (
              <Field label="Role" required validationMessage={fieldError('role')}>
                <RadioGroup ref={field.ref} value={field.value} onChange={(_event, data) => field.onChange(data.value)}>
                  {roles.map((candidate) => (
                    <Radio
                      key={candidate}
                      value={candidate}
                      className={styles.radio}
                      label={{
                        className: styles.radioLabel,
                        children: (
                          <>
                            <span className={styles.radioName}>{ROLE_LABELS[candidate]}</span>
                            <span className={styles.radioDescription}>{ROLE_DESCRIPTIONS[candidate]}</span>
                          </>
                        ),
                      }}
                    />
                  ))}
                </RadioGroup>
              </Field>
            )}
          />
        </>
      )}
    </FormDialog>
  );
}
