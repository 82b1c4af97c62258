import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { paths, safeNext, withNext } from '@/config/paths';
import { useMe } from '@/lib/session';

export default function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  const next = safeNext(params.get('next'));
  if (me.data) return <Navigate to={next} replace />;
  return (
    <AuthLayout
      title="Sign in"
      description="Welcome back to the cellar."
      footer={
        <>
          New to Porewise?{' '}
          <Link to={withNext(paths.signUp, params.get('next'))} className="font-semibold text-primary-700 underline-offset-2 hover:underline">
            Create an account
          </Link>
        </>
      }
    >
      <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
    </AuthLayout>
  );
}
