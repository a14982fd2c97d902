import { useSearchParams } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { ForgotPasswordForm } from '../../../features/auth/components/forgot-password-form';

export default function ForgotPasswordRoute() {
  const [searchParams] = useSearchParams();
  return (
    <AuthLayout
      title="Reset your password"
      description="Enter the e-mail address you sign in with. We will send you a link to choose a new password."
    >
      <ForgotPasswordForm initialEmail={searchParams.get('email') ?? ''} />
    </AuthLayout>
  );
}

export const ErrorBoundary = RouteErrorPage;
