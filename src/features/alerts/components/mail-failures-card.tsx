import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useMailFailures } from '../api/get-mail-failures';
import { useResendMail } from '../api/resend-mail';
import { formatDayMonthTime } from '@/lib/dates';

/** Owners: mail that could not be delivered after every retry, with a resend. */
export function MailFailuresCard() {
  const list = useMailFailures({ enabled: true });
  const resend = useResendMail();
  const toast = useToast();
  return (
    <Card title="Mail that could not be delivered" description="Porewise retries each message several times, waiting longer each time. What still failed is kept here.">
      {list.isPending ? (
        <LoadingState />
      ) : list.isError ? (
        <ErrorState message={errorMessage(list.error)} onRetry={() => list.refetch()} />
      ) : list.data.items.length === 0 ? (
        <p className="text-sm text-ink-600">Every message was delivered.</p>
      ) : (
        <ul className="divide-y divide-ink-100">
          {list.data.items.map((m) => (
            <li key={m.id} className="flex flex-col gap-2 py-2 sm:flex-row sm:items-center sm:justify-between" data-testid="mail-failure">
              <div className="min-w-0">
                <p className="truncate font-semibold text-ink-900">{m.subject}</p>
                <p className="text-sm text-ink-700">
                  To {m.to} · {m.attempts} attempts · last {formatDayMonthTime(m.failedAt)}
                </p>
                <p className="text-xs text-ink-600">{m.error}</p>
                {m.resentAt ? <p className="text-xs text-ok-700">Sent again {formatDayMonthTime(m.resentAt)}</p> : null}
              </div>
              <Button
                size="sm"
                variant="secondary"
                loading={resend.isPending && resend.variables === m.id}
                onClick={() =>
                  resend.mutate(m.id, {
                    onSuccess: () => toast.success('Queued to send again'),
                    onError: (e) => toast.error('Not queued', errorMessage(e)),
                  })
                }
              >
                Resend
              </Button>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
