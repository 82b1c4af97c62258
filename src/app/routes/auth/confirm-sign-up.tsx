import { useEffect, useRef } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useConfirmSignUp } from '@/features/auth/api/sign-up';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';

/** The page the sign-up mail links to: creates the account once, then opens the app. */
export default function ConfirmSignUpRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token') ?? '';
  const confirm = useConfirmSignUp();
  const sent = useRef(false);
  useEffect(() => {
    if (!token || sent.current) return;
    sent.current = true;
    confirm.mutateAsync({ token }).then(
      () => navigate(paths.home, { replace: true }),
      () => {},
    );
  }, [token, confirm, navigate]);
  return (
    <AuthLayout title="Finishing your account" description="One moment while your winery's account is created.">
      {!token ? (
        <ErrorState title="This link is incomplete" message="Open the link from the e-mail again, or sign up again." />
      ) : confirm.isError ? (
        <div className="flex flex-col gap-3">
          <ErrorState title="The account could not be created" message={errorMessage(confirm.error)} />
          <Link to={paths.signIn} className="text-sm text-primary-700 underline">
            Go to sign-in
          </Link>
        </div>
      ) : (
        <LoadingState />
      )}
    </AuthLayout>
  );
}
