import { useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { ErrorState } from '@/components/ui/states';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form';
import { paths } from '@/config/paths';

export default function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token') ?? '';
  return (
    <AuthLayout title="Choose a new password" description="Every other sign-in of your account ends when you save.">
      {token ? (
        <ResetPasswordForm token={token} onDone={() => navigate(paths.home, { replace: true })} />
      ) : (
        <ErrorState title="This link is incomplete" message="Open the link from the e-mail again, or ask for a new one." />
      )}
    </AuthLayout>
  );
}
