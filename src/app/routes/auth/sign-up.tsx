import { Link, Navigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { SignUpForm } from '@/features/auth/components/sign-up-form';
import { paths, safeNext } from '@/config/paths';
import { useMe } from '@/lib/session';

export default function SignUpRoute() {
  const [params] = useSearchParams();
  const me = useMe();
  const next = safeNext(params.get('next'));
  if (me.data) return <Navigate to={next} replace />;
  return (
    <AuthLayout
      title="Create your winery's account"
      description="One account per person. You can invite the cellar team afterwards."
      footer={
        <>
          Already have an account?{' '}
          <Link to={paths.signIn} className="font-semibold text-primary-700 underline-offset-2 hover:underline">
            Sign in
          </Link>
        </>
      }
    >
      <SignUpForm />
    </AuthLayout>
  );
}
