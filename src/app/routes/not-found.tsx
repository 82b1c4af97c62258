import { Link } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { paths } from '@/config/paths';

export default function NotFoundRoute() {
  return (
    <AuthLayout title="Page not found" description="The address may be mistyped, or the page has moved.">
      <Link to={paths.home} className="font-semibold text-primary-700 underline">
        Go to Porewise
      </Link>
    </AuthLayout>
  );
}
