import { useSearchParams } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { ResetPasswordForm } from '../../../features/auth/components/reset-password-form';

export default function ResetPasswordRoute() {
  const [searchParams] = useSearchParams();
  return (
    <AuthLayout title="Choose a new password">
      <ResetPasswordForm token={searchParams.get('token') ?? ''} />
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
