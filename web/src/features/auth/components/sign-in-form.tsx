import { Button, Field, Input, makeStyles, MessageBar, MessageBarBody, Spinner, tokens } from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { SignInSchema } from '@domain/auth/auth.schema';

import { PasswordInput } from '../../../components/password-input';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import type { Session } from '../../../lib/session';
import { useSignIn } from '../api/sign-in';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  input: { minHeight: '44px' },
  submit: { minHeight: '48px', width: '100%' },
  links: { display: 'flex', justifyContent: 'center' },
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
  },
});

type Field = 'email' | 'password';

function describeSignInError(error: unknown): string {
  if (isApiError(error) && error.code === 'SIGN_IN_FAILED') {
    return 'That e-mail and password do not match an account that can sign in. Check both and try again.';
  }
  if (isApiError(error) && error.status === 429) {
    return describeRequestError(error, 'Too many attempts. Wait a few minutes and try again.');
  }
  return describeRequestError(error, 'Signing in did not work. Try again.');
}

type SignInFormProps = {
  onSignedIn: (session: Session) => void;
};

export function SignInForm({ onSignedIn }: SignInFormProps) {
  const styles = useStyles();
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = SignInSchema.safeParse({ email, password });
    const found: FieldErrors<Field> = parsed.success ? {} : fieldErrorsFromZod<Field>(parsed.error);
    // Plainer words than the schema's for the commonest slip: a box left empty.
    if (email.trim() === '') found.email = 'Enter your e-mail address.';
    if (password === '') found.password = 'Enter your password.';
    setErrors(found);
    if (!parsed.success) return;

    signIn.mutate(parsed.data, {
      onSuccess: onSignedIn,
      onError: (error) => setErrors(fieldErrorsFromApi<Field>(error)),
    });
  };

  const hasFieldErrors = Object.keys(errors).length > 0;

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      {signIn.isError && !hasFieldErrors && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeSignInError(signIn.error)}</MessageBarBody>
        </MessageBar>
      )}
      <Field label="E-mail" required validationMessage={errors.email}>
        <Input
          className={styles.input}
          type="email"
          name="email"
          autoComplete="username"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          value={email}
          onChange={(_event, data) => setEmail(data.value)}
        />
      </Field>
      <Field label="Password" required validationMessage={errors.password}>
        <PasswordInput
          className={styles.input}
          name="password"
          autoComplete="current-password"
          value={password}
          onChange={(_event, data) => setPassword(data.value)}
        />
      </Field>
      <Button
        type="submit"
        appearance="primary"
        size="large"
        className={styles.submit}
        disabled={signIn.isPending}
        icon={signIn.isPending ? <Spinner size="tiny" /> : undefined}
      >
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
      <div className={styles.links}>
        <Link to={paths.forgotPassword.getHref(email.trim() || undefined)} className={styles.link}>
          Forgot your password?
        </Link>
      </div>
    </form>
  );
}
