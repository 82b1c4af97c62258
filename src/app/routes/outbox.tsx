import { useSearchParams } from 'react-router-dom';
import { AppShell } from '@/components/layouts/app-shell';
import { Wordmark } from '@/components/layouts/brand-mark';
import { LoadingState } from '@/components/ui/states';
import { OutboxPage } from '@/features/outbox/components/outbox-page';
import { useMe } from '@/lib/session';

/** The development mail outbox: inside the shell when signed in, on its own when not (reset links). */
export default function OutboxRoute() {
  const me = useMe();
  const [params] = useSearchParams();
  const outboxKey = params.get('key') ?? undefined;
  if (me.isPending) return <LoadingState className="mt-24" />;
  if (me.data) {
    return (
      <AppShell me={me.data}>
        <OutboxPage outboxKey={outboxKey} />
      </AppShell>
    );
  }
  return (
    <div className="mx-auto max-w-4xl px-4 py-8">
      <Wordmark className="mb-6" />
      <OutboxPage outboxKey={outboxKey} />
    </div>
  );
}
