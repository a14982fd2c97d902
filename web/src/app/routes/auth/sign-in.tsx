import { makeStyles, MessageBar, MessageBarBody, tokens } from '@fluentui/react-components';
import { redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { restoreSession } from '../../../features/auth/api/restore-session';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { safeNextPath } from '../../../features/auth/utils/safe-next-path';
import { useSessionState } from '../../../lib/session';

const useStyles = makeStyles({
  notice: { marginBlockEnd: tokens.spacingVerticalS },
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

  return (
    <AuthLayout title="Sign in" description="Use the e-mail address your company invited you with.">
      {hasExpired && (
        <MessageBar intent="info" layout="multiline" className={styles.notice}>
          <MessageBarBody>Your session ended. Sign in again to carry on where you were.</MessageBarBody>
        </MessageBar>
      )}
      <SignInForm onSignedIn={() => void navigate(next, { replace: true })} />
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
