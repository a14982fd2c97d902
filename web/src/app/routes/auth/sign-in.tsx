import { makeStyles, MessageBar, MessageBarBody, MessageBarTitle, Text, tokens } from '@fluentui/react-components';
import { Link, redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { restoreSession } from '../../../features/auth/api/restore-session';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { useSignupStatus } from '../../../features/signup/api/get-signup-status';
import { paths } from '../../../config/paths';
import { safeNextPath } from '../../../features/auth/utils/safe-next-path';
import { useSessionState } from '../../../lib/session';

const useStyles = makeStyles({
  notice: { marginBlockEnd: tokens.spacingVerticalS },
  footer: { margin: 0, textAlign: 'center' },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
});

export const clientLoader =
  () =>
  async ({ request }: LoaderFunctionArgs) => {
    // Someone already signed in (another tab, a bookmark) goes straight on.
    const user = await restoreSession().catch(() => undefined);
    if (user) throw redirect(safeNextPath(new URL(request.url).searchParams.get('next')));
    return null;
  };

export default function SignInRoute() {
  const styles = useStyles();
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const state = useSessionState();
  const next = safeNextPath(searchParams.get('next'));
  const hasExpired = state.status === 'signed-out' && state.reason === 'expired';
  // A fresh installation has no company yet: the way in is to create one.
  const signup = useSignupStatus();
  const isEmpty = signup.data?.hasCompanies === false;
  const mayCreate = signup.data !== undefined && signup.data.mode !== 'closed';

  return (
    <AuthLayout title="Sign in" description="Use the e-mail address your company invited you with.">
      {hasExpired && (
        <MessageBar intent="info" layout="multiline" className={styles.notice}>
          <MessageBarBody>Your session ended. Sign in again to carry on where you were.</MessageBarBody>
        </MessageBar>
      )}
      {isEmpty && (
        <MessageBar intent="info" layout="multiline" className={styles.notice}>
          <MessageBarBody>
            <MessageBarTitle>No company exists on this server yet.</MessageBarTitle>{' '}
            {signup.data?.mode === 'closed' ? (
              <>Its operator creates companies (npm run company:create); ask them for an invitation.</>
            ) : (
              <Link to={paths.signUp.getHref()} className={styles.link}>
                Create the first company
              </Link>
            )}
          </MessageBarBody>
        </MessageBar>
      )}
      <SignInForm onSignedIn={() => void navigate(next, { replace: true })} />
      {mayCreate && !isEmpty && (
        <Text as="p" block className={styles.footer}>
          New to Loamline?{' '}
          <Link to={paths.signUp.getHref()} className={styles.link}>
            Create a company
          </Link>
        </Text>
      )}
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
