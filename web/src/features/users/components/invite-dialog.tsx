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
  Spinner,
  tokens,
} from '@fluentui/react-components';
import { PersonAdd20Regular } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { CreateInvitationSchema } from '@domain/auth/auth.schema';
import { canInvite, ROLE_LABELS, ROLES, type Role } from '@domain/auth/roles';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useCreateInvitation } from '../api/create-invitation';
import { ROLE_DESCRIPTIONS } from '../utils/role-descriptions';

const useStyles = makeStyles({
  trigger: { minHeight: '44px' },
  surface: { maxWidth: '32rem' },
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  input: { minHeight: '44px' },
  radio: { minHeight: '44px', alignItems: 'flex-start' },
  radioLabel: { display: 'flex', flexDirection: 'column', color: tokens.colorNeutralForeground1 },
  radioName: { color: tokens.colorNeutralForeground1, fontWeight: tokens.fontWeightSemibold },
  radioDescription: { color: tokens.colorNeutralForeground2, fontSize: tokens.fontSizeBase200 },
  action: { minHeight: '44px' },
});

type Field = 'email' | 'name' | 'role';

type InviteDialogProps = {
  /** The role of whoever is inviting: it limits the roles on offer. */
  actorRole: Role;
};

/** "Invite someone": e-mail, optional name and a role; the server e-mails the invitation link. */
export function InviteDialog({ actorRole }: InviteDialogProps) {
  const styles = useStyles();
  const notify = useNotify();
  const invite = useCreateInvitation();
  const [open, setOpen] = useState(false);
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [role, setRole] = useState<Role | ''>('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});

  const roles = ROLES.filter((candidate) => canInvite(actorRole, candidate));

  const reset = () => {
    setEmail('');
    setName('');
    setRole('');
    setErrors({});
    invite.reset();
  };

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = CreateInvitationSchema.safeParse({ email, role, name: name.trim() === '' ? undefined : name });
    const found: FieldErrors<Field> = parsed.success ? {} : fieldErrorsFromZod<Field>(parsed.error);
    if (email.trim() === '') found.email = 'Enter the e-mail address to send the invitation to.';
    if (role === '') found.role = 'Choose what they will do in Loamline.';
    setErrors(found);
    if (!parsed.success) return;

    invite.mutate(parsed.data, {
      onSuccess: (invitation) => {
        notify.success('Invitation sent', `${invitation.email} can join as ${ROLE_LABELS[invitation.role]}.`);
        setOpen(false);
        reset();
      },
      onError: (error) => {
        if (isApiError(error) && error.code === 'EMAIL_TAKEN') {
          setErrors({ email: 'Someone already has an account with this e-mail.' });
        } else {
          setErrors(fieldErrorsFromApi<Field>(error));
        }
      },
    });
  };

  return (
    <Dialog
      open={open}
      onOpenChange={(_event, data) => {
        if (invite.isPending) return;
        setOpen(data.open);
        if (!data.open) reset();
      }}
    >
      <DialogTrigger disableButtonEnhancement>
        <Button appearance="primary" className={styles.trigger} icon={<PersonAdd20Regular />}>
          Invite someone
        </Button>
      </DialogTrigger>
      <DialogSurface className={styles.surface}>
        <form onSubmit={handleSubmit} noValidate>
          <DialogBody>
            <DialogTitle>Invite someone</DialogTitle>
            <DialogContent className={styles.form}>
              {invite.isError && Object.keys(errors).length === 0 && (
                <MessageBar intent="error" layout="multiline">
                  <MessageBarBody>
                    {describeRequestError(invite.error, 'The invitation could not be sent. Try again.')}
                  </MessageBarBody>
                </MessageBar>
              )}
              <Field label="E-mail" required validationMessage={errors.email}>
                <Input
                  className={styles.input}
                  type="email"
                  name="email"
                  autoComplete="off"
                  inputMode="email"
                  autoCapitalize="none"
                  spellCheck={false}
                  value={email}
                  onChange={(_event, data) => setEmail(data.value)}
                />
              </Field>
              <Field
                label="Name"
                hint={errors.name ? undefined : 'Optional. They can change it when they accept.'}
                validationMessage={errors.name}
              >
                <Input
                  className={styles.input}
                  name="name"
                  autoComplete="off"
                  value={name}
                  onChange={(_event, data) => setName(data.value)}
                />
              </Field>
              <Field label="Role" required validationMessage={errors.role}>
                <RadioGroup value={role} onChange={(_event, data) => setRole(data.value as Role)}>
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
            </DialogContent>
            <DialogActions fluid>
              <DialogTrigger disableButtonEnhancement>
                <Button className={styles.action} disabled={invite.isPending}>
                  Cancel
                </Button>
              </DialogTrigger>
              <Button
                type="submit"
                appearance="primary"
                className={styles.action}
                disabled={invite.isPending}
                icon={invite.isPending ? <Spinner size="tiny" /> : undefined}
              >
                Send invitation
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
