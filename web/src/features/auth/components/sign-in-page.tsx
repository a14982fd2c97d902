import type { SignupStatusResponse } from '@domain/signup/signup.schema';
import { useEffect, useId, useState, type FormEvent, type InputHTMLAttributes, type ReactNode } from 'react';

import { LogoMark } from '../../../components/logo';
import { DiamondDismissFilled12Icon, DiamondDismissFilled20Icon, EyeIcon, EyeOffIcon, InfoFilledIcon } from '../../../components/plain/icons';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-error';
import { describeRequestError, fieldErrorsFromApi, type FieldErrors } from '../../../lib/describe-error';
import { hasSession, signInForCookie } from '../api/public-sign-in';

import styles from './sign-in-page.module.css';

/*
 * The sign-in page (web/sign-in.html, src/sign-in-main.tsx; issue 17): a page of its own with React and
 * this module only (no Fluent UI, router, query cache, zod or session code), drawn like the app's
 * AuthLayout with Fluent's Field, Input, Button and MessageBar from Fluent's token variables (locate.css).
 * After a sign-in it loads the app at `next`: the app restores the session from the refresh cookie the
 * sign-in set, as on any reload (features/auth/api/restore-session.ts).
 */

type Field = 'email' | 'password';

/** The e-mail check zod's `z.email()` makes (SignInSchema's EmailSchema), so the page refuses what the server would. */
const EMAIL = /^(?!\.)(?!.*\.\.)([A-Za-z0-9_'+\-.]*)[A-Za-z0-9_+-]@([A-Za-z0-9][A-Za-z0-9-]*\.)+[A-Za-z]{2,}$/;

/** The form's own checks, worded as the app's form was (SignInSchema's limits; the server checks again). */
export function checkSignInFields(email: string, password: string): FieldErrors<Field> {
  const found: FieldErrors<Field> = {};
  const trimmed = email.trim();
  // Plain words for the commonest slip: a box left empty.
  if (trimmed === '') found.email = 'Enter your e-mail address.';
  else if (trimmed.length > 254 || !EMAIL.test(trimmed)) found.email = 'Must be an e-mail address.';
  if (password === '') found.password = 'Enter your password.';
  else if (password.length > 200) found.password = 'Must be at most 200 characters.';
  return found;
}

function describeSignInError(error: unknown): string {
  if (isApiError(error) && error.code === 'SIGN_IN_FAILED') {
    return 'That e-mail and password do not match an account that can sign in. Check both and try again.';
  }
  if (isApiError(error) && error.status === 429) {
    return describeRequestError(error, 'Too many attempts. Wait a few minutes and try again.');
  }
  return describeRequestError(error, 'Signing in did not work. Try again.');
}

/**
 * Someone already signed in (the refresh cookie still holds a session: another tab, a bookmark) goes
 * straight on to `next`, as the app's sign-in route did before it drew anything; here the form is drawn
 * first and this runs beside it. With no signal it stays (nobody can be asked; the form says why if used).
 */
export async function goOnIfSignedIn(next: string, go: (url: string) => void, ask: () => Promise<boolean | undefined> = hasSession): Promise<void> {
  if ((await ask()) === true) go(next);
}

type SignInPageProps = {
  /** Where to go after signing in (already made safe: safeNextPath). */
  next: string;
  /** The session ended under the user (the app sent them here with `expired=1`). */
  expired: boolean;
  /** GET /api/signup/status, asked when the page starts. */
  signupStatus: Promise<SignupStatusResponse>;
  /** A full page load of the app (`window.location.replace`); tests pass a spy. */
  go: (url: string) => void;
};

export function SignInPage({ next, expired, signupStatus, go }: SignInPageProps) {
  const [signup, setSignup] = useState<SignupStatusResponse>();
  useEffect(() => {
    let live = true;
    // No answer: no notice (the form works without it).
    signupStatus.then((status) => live && setSignup(status)).catch(() => undefined);
    return () => {
      live = false;
    };
  }, [signupStatus]);
  // A fresh installation has no company yet: the way in is to create one.
  const isEmpty = signup?.hasCompanies === false;
  const mayCreate = signup !== undefined && signup.mode !== 'closed';

  return (
    <div className={styles.root}>
      <h1 className={styles.brand}>
        <LogoMark size={40} />
        Loamline
      </h1>
      <main className={styles.card}>
        <div className={styles.heading}>
          <h2 className={styles.title}>Sign in</h2>
          <p className={styles.description}>Use the e-mail address your company invited you with.</p>
        </div>
        {expired && (
          <Notice intent="info" className={styles.notice}>
            Your session ended. Sign in again to carry on where you were.
          </Notice>
        )}
        {isEmpty && (
          <Notice intent="info" className={styles.notice}>
            <span className={styles.noticeTitle}>No company exists on this server yet.</span>{' '}
            {signup.mode === 'closed' ? (
              <>Its operator creates companies (npm run company:create); ask them for an invitation.</>
            ) : (
              <a href={paths.signUp.getHref()} className={styles.link}>
                Create the first company
              </a>
            )}
          </Notice>
        )}
        <SignInForm onSignedIn={() => go(next)} />
        {mayCreate && !isEmpty && (
          <p className={styles.footerText}>
            New to Loamline?{' '}
            <a href={paths.signUp.getHref()} className={styles.link}>
              Create a company
            </a>
          </p>
        )}
      </main>
      <footer className={styles.footer}>
        <a href={paths.status.getHref()} className={styles.footerLink}>
          System status
        </a>
      </footer>
    </div>
  );
}

/** Fluent's MessageBar (multiline), info or error, as plain markup. */
function Notice({ intent, className, children }: { intent: 'info' | 'error'; className?: string; children: ReactNode }) {
  const Icon = intent === 'error' ? DiamondDismissFilled20Icon : InfoFilledIcon;
  return (
    <div role="group" className={[styles.messageBar, intent === 'error' ? styles.messageBarError : styles.messageBarInfo, className].filter(Boolean).join(' ')}>
      <span className={styles.messageBarIcon}>
        <Icon />
      </span>
      <div className={styles.messageBarBody} aria-live={intent === 'error' ? 'assertive' : 'polite'}>
        {children}
      </div>
    </div>
  );
}

function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [failure, setFailure] = useState<unknown>();
  const [isPending, setIsPending] = useState(false);

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (isPending) return;
    const found = checkSignInFields(email, password);
    setErrors(found);
    setFailure(undefined);
    if (Object.keys(found).length > 0) return;

    setIsPending(true);
    signInForCookie({ email: email.trim().toLowerCase(), password }).then(
      // Stays "Signing in…" while the app loads.
      () => onSignedIn(),
      (error: unknown) => {
        setIsPending(false);
        setErrors(fieldErrorsFromApi<Field>(error));
        setFailure(error ?? new Error('Signing in did not work.'));
      },
    );
  };

  const hasFieldErrors = Object.keys(errors).length > 0;
  const forgotHref = paths.forgotPassword.getHref(email.trim() || undefined);

  return (
    <form className={styles.form} onSubmit={handleSubmit} noValidate>
      {failure !== undefined && !hasFieldErrors && <Notice intent="error">{describeSignInError(failure)}</Notice>}
      <TextField
        label="E-mail"
        error={errors.email}
        input={{
          type: 'email',
          name: 'email',
          autoComplete: 'username',
          inputMode: 'email',
          autoCapitalize: 'none',
          spellCheck: false,
          value: email,
          onChange: (event) => setEmail(event.currentTarget.value),
        }}
      />
      <PasswordField error={errors.password} value={password} onChange={setPassword} />
      <button type="submit" className={styles.submit} disabled={isPending}>
        {isPending && <span className={styles.spinner} aria-hidden="true" />}
        {isPending ? 'Signing in…' : 'Sign in'}
      </button>
      <div className={styles.links}>
        <a href={forgotHref} className={styles.link + ' ' + styles.tallLink}>
          Forgot your password?
        </a>
      </div>
    </form>
  );
}

type InputProps = InputHTMLAttributes<HTMLInputElement>;

/** Fluent's Field (vertical, required) around an outline Input, as plain markup. */
function TextField({ label, error, input, after }: { label: string; error?: string; input: InputProps; after?: ReactNode }) {
  const id = useId();
  const messageId = `${id}-message`;
  return (
    <div className={styles.field}>
      <label htmlFor={id} className={styles.label}>
        {label}
        <span className={styles.required} aria-hidden="true">
          *
        </span>
      </label>
      <span className={[styles.inputBox, error && styles.inputBoxInvalid].filter(Boolean).join(' ')}>
        <input
          {...input}
          id={id}
          className={styles.input}
          required
          aria-required="true"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? messageId : undefined}
        />
        {after}
      </span>
      {error && (
        <div id={messageId} role="alert" className={styles.validationMessage}>
          <span className={styles.validationIcon}>
            <DiamondDismissFilled12Icon />
          </span>
          {error}
        </div>
      )}
    </div>
  );
}

/**
 * The password box with a button to show what was typed (as components/password-input.tsx): on a phone
 * in the sun, seeing the password beats typing it twice.
 */
function PasswordField({ error, value, onChange }: { error?: string; value: string; onChange: (value: string) => void }) {
  const [isVisible, setIsVisible] = useState(false);
  return (
    <TextField
      label="Password"
      error={error}
      input={{
        type: isVisible ? 'text' : 'password',
        name: 'password',
        autoComplete: 'current-password',
        value,
        onChange: (event) => onChange(event.currentTarget.value),
      }}
      after={
        <button
          type="button"
          className={styles.toggle}
          aria-label={isVisible ? 'Hide password' : 'Show password'}
          aria-pressed={isVisible}
          onClick={() => setIsVisible((visible) => !visible)}
        >
          {isVisible ? <EyeOffIcon /> : <EyeIcon />}
        </button>
      }
    />
  );
}
