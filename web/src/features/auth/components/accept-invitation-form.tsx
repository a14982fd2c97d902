import {
  Button,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  tokens,
} from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { AcceptInvitationSchema, type InvitationPreviewResponse } from '@domain/auth/auth.schema';
import { ROLE_LABELS } from '@domain/auth/roles';

import { PasswordInput } from '../../../components/password-input';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import type { Session } from '../../../lib/session';
import { useAcceptInvitation } from '../api/accept-invitation';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  summary: {
    margin: 0,
    display: 'grid',
    gridTemplateColumns: 'auto minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorBrandBackground2,
  },
  term: { color: tokens.colorNeutralForeground2 },
  value: { margin: 0, fontWeight: tokens.fontWeightSemibold, overflowWrap: 'anywhere' },
  input: { minHeight: '44px' },
  submit: { minHeight: '48px', width: '100%' },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
});

type Field = 'name' | 'password' | 'confirm';

type AcceptInvitationFormProps = {
  token: string;
  invitation: InvitationPreviewResponse;
  onAccepted: (session: Session) => void;
  /** The link stopped working between opening the page and sending the form. */
  onLinkNotValid: () => void;
};

export function AcceptInvitationForm({ token, invitation, onAccepted, onLinkNotValid }: AcceptInvitationFormProps) {
  const styles = useStyles();
  const accept = useAcceptInvitation();
  const [name, setName] = useState(invitation.name ?? '');
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = AcceptInvitationSchema.safeParse({ token, name, password });
    const found: FieldErrors<Field> = parsed.success ? {} : fieldErrorsFromZod<Field>(parsed.error);
    if (name.trim() === '') found.name = 'Enter your name as your crew and customers know it.';
    if (password === '') found.password = 'Choose a password.';
    if (!found.password && password !== confirm) found.confirm = 'The two passwords are not the same.';
    setErrors(found);
    if (!parsed.success || found.confirm) return;

    accept.mutate(parsed.data, {
      onSuccess: onAccepted,
      onError: (error) => {
        if (isApiError(error) && error.code === 'LINK_NOT_VALID') onLinkNotValid();
        else setErrors(fieldErrorsFromApi<Field>(error));
      },
    });
  };

  const isEmailTaken = isApiError(accept.error) && accept.error.code === 'EMAIL_TAKEN';

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      <dl className={styles.summary} aria-label="Your invitation">
        <dt className={styles.term}>Company</dt>
        <dd className={styles.value}>{invitation.companyName}</dd>
        <dt className={styles.term}>E-mail</dt>
        <dd className={styles.value}>{invitation.email}</dd>
        <dt className={styles.term}>Role</dt>
        <dd className={styles.value}>{ROLE_LABELS[invitation.role]}</dd>
      </dl>
      {accept.isError && Object.keys(errors).length === 0 && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>
            {isEmailTaken ? (
              <>
                There is already an account for {invitation.email}.{' '}
                <Link to={paths.signIn.getHref()} reloadDocument className={styles.link}>
                  Sign in
                </Link>{' '}
                instead.
              </>
            ) : (
              describeRequestError(accept.error, 'Your account could not be set up. Try again.')
            )}
          </MessageBarBody>
        </MessageBar>
      )}
      <Field label="Your name" required validationMessage={errors.name}>
        <Input
          className={styles.input}
          name="name"
          autoComplete="name"
          value={name}
          onChange={(_event, data) => setName(data.value)}
        />
      </Field>
      <Field
        label="Password"
        required
        validationMessage={errors.password}
        hint={errors.password ? undefined : 'At least 10 characters. A few words you will remember work well.'}
      >
        <PasswordInput
          className={styles.input}
          name="new-password"
          autoComplete="new-password"
          value={password}
          onChange={(_event, data) => setPassword(data.value)}
        />
      </Field>
      <Field label="Type the password again" required validationMessage={errors.confirm}>
        <PasswordInput
          className={styles.input}
          name="confirm-password"
          autoComplete="new-password"
          value={confirm}
          onChange={(_event, data) => setConfirm(data.value)}
        />
      </Field>
      <Button
        type="submit"
        appearance="primary"
        size="large"
        className={styles.submit}
        disabled={accept.isPending}
        icon={accept.isPending ? <Spinner size="tiny" /> : undefined}
      >
        {accept.isPending ? 'Setting up your account…' : 'Join and sign in'}
      </Button>
    </form>
  );
}
