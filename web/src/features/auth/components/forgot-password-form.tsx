import { Button, Field, Input, makeStyles, MessageBar, MessageBarBody, Spinner, tokens } from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { RequestPasswordResetSchema } from '@domain/auth/auth.schema';

import { paths } from '../../../config/paths';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useRequestPasswordReset } from '../api/request-password-reset';

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

type ForgotPasswordFormProps = { initialEmail?: string };

export function ForgotPasswordForm({ initialEmail = '' }: ForgotPasswordFormProps) {
  const styles = useStyles();
  const request = useRequestPasswordReset();
  const [email, setEmail] = useState(initialEmail);
  const [errors, setErrors] = useState<FieldErrors<'email'>>({});

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = RequestPasswordResetSchema.safeParse({ email });
    const found: FieldErrors<'email'> = parsed.success ? {} : fieldErrorsFromZod<'email'>(parsed.error);
    if (email.trim() === '') found.email = 'Enter the e-mail address you sign in with.';
    setErrors(found);
    if (!parsed.success) return;
    request.mutate(parsed.data, { onError: (error) => setErrors(fieldErrorsFromApi<'email'>(error)) });
  };

  if (request.isSuccess) {
    return (
      <div className={styles.form}>
        <MessageBar intent="success" layout="multiline">
          <MessageBarBody>
            {request.data.message} The link works for an hour. Check your spam folder if nothing arrives within a few
            minutes.
          </MessageBarBody>
        </MessageBar>
        <div className={styles.links}>
          <Link to={paths.signIn.getHref()} reloadDocument className={styles.link}>
            Back to sign in
          </Link>
        </div>
      </div>
    );
  }

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      {request.isError && !errors.email && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeRequestError(request.error, 'The link could not be sent. Try again.')}</MessageBarBody>
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
      <Button
        type="submit"
        appearance="primary"
        size="large"
        className={styles.submit}
        disabled={request.isPending}
        icon={request.isPending ? <Spinner size="tiny" /> : undefined}
      >
        Send me a reset link
      </Button>
      <div className={styles.links}>
        <Link to={paths.signIn.getHref()} reloadDocument className={styles.link}>
          Back to sign in
        </Link>
      </div>
    </form>
  );
}
