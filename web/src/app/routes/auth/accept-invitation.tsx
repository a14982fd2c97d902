import { Button, makeStyles, MessageBar, MessageBarBody, Spinner, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import {
  getInvitationPreviewQueryOptions,
  useInvitationPreview,
} from '../../../features/auth/api/get-invitation-preview';
import { AcceptInvitationForm } from '../../../features/auth/components/accept-invitation-form';
import { LinkNotValid } from '../../../features/auth/components/link-not-valid';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';

const useStyles = makeStyles({
  loading: { paddingBlock: tokens.spacingVerticalXL },
  retry: { minHeight: '44px', alignSelf: 'flex-start' },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const token = new URL(request.url).searchParams.get('token');
    // Never throws: a dead link is something this page explains.
    if (token) await queryClient.prefetchQuery(getInvitationPreviewQueryOptions(token));
    return null;
  };

function InvitationContent({ token }: { token: string }) {
  const styles = useStyles();
  const navigate = useNavigate();
  const preview = useInvitationPreview(token);
  const [isLinkGone, setIsLinkGone] = useState(false);

  if (isLinkGone || (isApiError(preview.error) && preview.error.status === 404)) {
    return (
      <AuthLayout title="This invitation link no longer works">
        <LinkNotValid kind="invitation" />
      </AuthLayout>
    );
  }
  if (preview.isPending) {
    return (
      <AuthLayout title="Join Loamline">
        <Spinner className={styles.loading} label="Opening your invitation…" />
      </AuthLayout>
    );
  }
  if (preview.isError) {
    return (
      <AuthLayout title="Join Loamline">
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{describeRequestError(preview.error, 'The invitation could not be opened.')}</MessageBarBody>
        </MessageBar>
        <Button className={styles.retry} onClick={() => void preview.refetch()}>
          Try again
        </Button>
      </AuthLayout>
    );
  }

  return (
    <AuthLayout
      title={`Join ${preview.data.companyName}`}
      description="Choose the name your crew and customers will see, and a password for signing in."
    >
      <AcceptInvitationForm
        token={token}
        invitation={preview.data}
        onAccepted={() => void navigate(paths.home.getHref(), { replace: true })}
        onLinkNotValid={() => setIsLinkGone(true)}
      />
    </AuthLayout>
  );
}

export default function AcceptInvitationRoute() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token');
  if (!token) {
    return (
      <AuthLayout title="This invitation link no longer works">
        <LinkNotValid kind="invitation" />
      </AuthLayout>
    );
  }
  return <InvitationContent token={token} />;
}

export const ErrorBoundary = RouteErrorPage;
