import { Link } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';
import { paths } from '@/config/paths';

export default function ForgotPasswordRoute() {
  return (
    <AuthLayout
      title="Reset your password"
      description="Enter the e-mail you sign in with. We send a link to choose a new password."
      footer={
        <Link to={paths.signIn} className="text-primary-700 underline-offset-2 hover:underline">
          Back to sign-in
        </Link>
      }
    >
      <ForgotPasswordForm />
    </AuthLayout>
  );
}
