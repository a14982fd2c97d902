import { Button, Field, Input, makeStyles, MessageBar, MessageBarBody, Spinner, tokens } from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import { CreateSignupSchema, type SignupAcceptedResponse, type SignupMode } from '@domain/signup/signup.schema';

import { PasswordInput } from '../../../components/password-input';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useRequestSignup } from '../api/request-signup';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  input: { minHeight: '44px' },
  submit: { minHeight: '48px', width: '100%' },
});

type FieldName = 'companyName' | 'name' | 'email' | 'password' | 'confirm' | 'inviteCode';

type SignUpFormProps = {
  mode: Exclude<SignupMode, 'closed'>;
  /** The request was accepted: a message is on its way to `email`. */
  onRequested: (answer: SignupAcceptedResponse, email: string) => void;
};

/** Company name, your name, e-mail and password (and the operator's code when sign-up is by invitation). */
export function SignUpForm({ mode, onRequested }: SignUpFormProps) {
  const styles = useStyles();
  const requestSignup = useRequestSignup();
  const [values, setValues] = useState({ companyName: '', name: '', email: '', password: '', confirm: '', inviteCode: '' });
  const [errors, setErrors] = useState<FieldErrors<FieldName>>({});

  const set = (field: keyof typeof values) => (_event: unknown, data: { value: string }) =>
    setValues((current) => ({ ...current, [field]: data.value }));

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = CreateSignupSchema.safeParse({
      companyName: values.companyName,
      name: values.name,
      email: values.email,
      password: values.password,
      inviteCode: mode === 'invite' && values.inviteCode.trim() !== '' ? values.inviteCode : undefined,
    });
    const found: FieldErrors<FieldName> = parsed.success ? {} : fieldErrorsFromZod<FieldName>(parsed.error);
    if (values.companyName.trim() === '') found.companyName = 'Enter the name of your company.';
    if (values.name.trim() === '') found.name = 'Enter your name.';
    if (values.email.trim() === '') found.email = 'Enter your e-mail address.';
    if (values.password === '') found.password = 'Choose a password.';
    if (!found.password && values.password !== values.confirm) found.confirm = 'The two passwords are not the same.';
    if (mode === 'invite' && values.inviteCode.trim() === '') found.inviteCode = 'Enter the invitation code you were given.';
    setErrors(found);
    if (!parsed.success || Object.keys(found).length > 0) return;

    requestSignup.mutate(parsed.data, {
      onSuccess: (answer) => onRequested(answer, parsed.data.email),
      onError: (error) => setErrors(fieldErrorsFromApi<FieldName>(error)),
    });
  };

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      {requestSignup.isError && Object.keys(errors).length === 0 && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeRequestError(requestSignup.error, 'The company could not be created. Try again.')}</MessageBarBody>
        </MessageBar>
      )}
      <Field label="Company name" required validationMessage={errors.companyName} hint="As your customers know it; you can change it later.">
        <Input className={styles.input} name="organization" autoComplete="organization" value={values.companyName} onChange={set('companyName')} />
      </Field>
      <Field label="Your name" required validationMessage={errors.name}>
        <Input className={styles.input} name="name" autoComplete="name" value={values.name} onChange={set('name')} />
      </Field>
      <Field label="E-mail" required validationMessage={errors.email} hint={errors.email ? undefined : 'You sign in with it; we send a link to confirm it.'}>
        <Input className={styles.input} type="email" name="email" autoComplete="email" value={values.email} onChange={set('email')} />
      </Field>
      <Field
        label="Password"
        required
        validationMessage={errors.password}
        hint={errors.password ? undefined : 'At least 10 characters. A few words you will remember work well.'}
      >
        <PasswordInput className={styles.input} name="new-password" autoComplete="new-password" value={values.password} onChange={set('password')} />
      </Field>
      <Field label="Type the password again" required validationMessage={errors.confirm}>
        <PasswordInput className={styles.input} name="confirm-password" autoComplete="new-password" value={values.confirm} onChange={set('confirm')} />
      </Field>
      {mode === 'invite' && (
        <Field label="Invitation code" required validationMessage={errors.inviteCode} hint={errors.inviteCode ? undefined : 'The code the operator of this server gave you.'}>
          <Input className={styles.input} name="invite-code" autoComplete="off" value={values.inviteCode} onChange={set('inviteCode')} />
        </Field>
      )}
      <Button
        type="submit"
        appearance="primary"
        size="large"
        className={styles.submit}
        disabled={requestSignup.isPending}
        icon={requestSignup.isPending ? <Spinner size="tiny" /> : undefined}
      >
        {requestSignup.isPending ? 'Sending…' : 'Create the company'}
      </Button>
    </form>
  );
}
