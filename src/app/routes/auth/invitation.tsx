import { useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { LoadingState } from '@/components/ui/states';
import { InvitationPanel } from '@/features/auth/components/invitation-panel';
import { paths } from '@/config/paths';
import { useMe } from '@/lib/session';

export default function InvitationRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  return (
    <AuthLayout title="You are invited">
      {me.isPending ? (
        <LoadingState />
      ) : (
        <InvitationPanel token={params.get('token') ?? ''} me={me.data ?? null} onJoined={() => navigate(paths.home, { replace: true })} />
      )}
    </AuthLayout>
  );
}
