import { makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { useEffect, useRef } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { useVerifySignup } from '../../../features/signup/api/verify-signup';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';

const useStyles = makeStyles({
  loading: { paddingBlock: tokens.spacingVerticalXL },
  actions: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
  },
});

/** Following the e-mail's link creates the company and its first admin, then opens the app signed in. */
export default function SignUpVerifyRoute() {
  const styles = useStyles();
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token');
  const verify = useVerifySignup();
  const started = useRef(false);

  useEffect(() => {
    // Once per page: the link works only once (and React may run effects twice in development).
    if (!token || started.current) return;
    started.current = true;
    verify.mutate(token, { onSuccess: () => void navigate(paths.home.getHref(), { replace: true }) });
  }, [token, verify, navigate]);

  if (!token || verify.isError) {
    const alreadyDone = isApiError(verify.error) && verify.error.code === 'SIGNUP_ALREADY_COMPLETED';
    return (
      <AuthLayout title={alreadyDone ? 'Your company is ready' : 'This link does not work'}>
        <MessageBar intent={alreadyDone ? 'info' : 'error'} layout="multiline">
          <MessageBarBody>
            {token ? describeRequestError(verify.error, 'The company could not be created. Try the link again.') : 'This link is missing its code. Open it again from the e-mail.'}
          </MessageBarBody>
        </MessageBar>
        <div className={styles.actions}>
          <Link to={paths.signIn.getHref()} reloadDocument className={styles.link}>
            Sign in
          </Link>
          {!alreadyDone && (
            <Link to={paths.signUp.getHref()} className={styles.link}>
              Start the sign-up again
            </Link>
          )}
        </div>
      </AuthLayout>
    );
  }
  return (
    <AuthLayout title="Creating your company">
      <Spinner className={styles.loading} label="Confirming your address and setting up the company…" />
      <Text as="p" block>
        This takes a moment.
      </Text>
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
