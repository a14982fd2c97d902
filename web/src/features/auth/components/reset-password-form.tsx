import { Button, Field, makeStyles, MessageBar, MessageBarBody, Spinner, tokens } from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { ResetPasswordSchema } from '@domain/auth/auth.schema';

import { PasswordInput } from '../../../components/password-input';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useResetPassword } from '../api/reset-password';

import { LinkNotValid } from './link-not-valid';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  input: { minHeight: '44px' },
  submit: { minHeight: '48px', width: '100%' },
  primaryLink: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    minHeight: '48px',
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorBrandBackground,
    color: tokens.colorNeutralForegroundOnBrand,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorBrandBackgroundHover },
  },
});

type Field = 'password' | 'confirm';

export function ResetPasswordForm({ token }: { token: string }) {
  const styles = useStyles();
  const reset = useResetPassword();
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = ResetPasswordSchema.safeParse({ token, password });
    const found: FieldErrors<Field> = parsed.success ? {} : fieldErrorsFromZod<Field>(parsed.error);
    if (password === '') found.password = 'Choose a new password.';
    if (!found.password && password !== confirm) found.confirm = 'The two passwords are not the same.';
    setErrors(found);
    if (!parsed.success || found.confirm) return;
    reset.mutate(parsed.data, { onError: (error) => setErrors(fieldErrorsFromApi<Field>(error)) });
  };

  if (isApiError(reset.error) && reset.error.code === 'LINK_NOT_VALID') return <LinkNotValid kind="reset" />;
  // A link cut short when copied out of the e-mail would only fail on submit; say so at once.
  if (!ResetPasswordSchema.shape.token.safeParse(token).success) return <LinkNotValid kind="reset" />;

  if (reset.isSuccess) {
    return (
      <div className={styles.form}>
        <MessageBar intent="success" layout="multiline">
          <MessageBarBody>
            Your password is changed. For your safety you are signed out everywhere; sign in with the new password.
          </MessageBarBody>
        </MessageBar>
        <Link to={paths.signIn.getHref()} reloadDocument className={styles.primaryLink}>
          Sign in
        </Link>
      </div>
    );
  }

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      {reset.isError && Object.keys(errors).length === 0 && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeRequestError(reset.error, 'The password could not be changed. Try again.')}</MessageBarBody>
        </MessageBar>
      )}
      <Field
        label="New password"
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
      <Field label="Type the new password again" required validationMessage={errors.confirm}>
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
        disabled={reset.isPending}
        icon={reset.isPending ? <Spinner size="tiny" /> : undefined}
      >
        Set new password
      </Button>
    </form>
  );
}
