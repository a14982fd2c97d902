import { Button, makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router';
import type { SignupAcceptedResponse } from '@domain/signup/signup.schema';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { getSignupStatusQueryOptions, useSignupStatus } from '../../../features/signup/api/get-signup-status';
import { CheckYourMail } from '../../../features/signup/components/check-your-mail';
import { SignUpForm } from '../../../features/signup/components/sign-up-form';
import { describeRequestError } from '../../../lib/form-errors';

const useStyles = makeStyles({
  loading: { paddingBlock: tokens.spacingVerticalXL },
  retry: { minHeight: '44px', alignSelf: 'flex-start' },
  footer: { margin: 0, textAlign: 'center' },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
});

export const clientLoader = (queryClient: QueryClient) => async () => {
  // Never throws: a failure is shown by the page, with a way to try again.
  await queryClient.prefetchQuery(getSignupStatusQueryOptions());
  return null;
};

function SignInInstead() {
  const styles = useStyles();
  return (
    <Text as="p" block className={styles.footer}>
      Already have an account?{' '}
      <Link to={paths.signIn.getHref()} reloadDocument className={styles.link}>
        Sign in
      </Link>
    </Text>
  );
}

export default function SignUpRoute() {
  const styles = useStyles();
  const status = useSignupStatus();
  const [requested, setRequested] = useState<{ answer: SignupAcceptedResponse; email: string }>();

  if (status.isPending) {
    return (
      <AuthLayout title="Create a company">
        <Spinner className={styles.loading} label="Loading…" />
      </AuthLayout>
    );
  }
  if (status.isError) {
    return (
      <AuthLayout title="Create a company">
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeRequestError(status.error, 'This page could not be loaded.')}</MessageBarBody>
        </MessageBar>
        <Button className={styles.retry} onClick={() => void status.refetch()}>
          Try again
        </Button>
      </AuthLayout>
    );
  }
  const { mode, contact, mailCaptured } = status.data;
  if (mode === 'closed') {
    return (
      <AuthLayout title="Sign-up is closed" description="On this server, companies are created by its operator.">
        <Text as="p" block>
          {contact
            ? `Ask ${contact} to create your company; you will get an e-mail invitation to set your password.`
            : 'Ask the person who runs this Loamline server to create your company; you will get an e-mail invitation to set your password.'}
        </Text>
        <SignInInstead />
      </AuthLayout>
    );
  }
  if (requested) {
    return (
      <AuthLayout title="Check your e-mail">
        <CheckYourMail
          email={requested.email}
          message={requested.answer.message}
          receipt={requested.answer.receipt}
          mailCaptured={mailCaptured}
        />
        <SignInInstead />
      </AuthLayout>
    );
  }
  return (
    <AuthLayout
      title="Create a company"
      description={
        mode === 'invite'
          ? `Sign-up on this server needs an invitation code${contact ? ` from ${contact}` : ''}. You become the company's administrator.`
          : "Start your company in Loamline. You become its administrator and invite your office and crews."
      }
    >
      <SignUpForm mode={mode} onRequested={(answer, email) => setRequested({ answer, email })} />
      <SignInInstead />
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
