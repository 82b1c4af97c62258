import { Fragment } from 'react';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { ApiError } from '@/lib/api-client';
import { useOutbox } from '../api/get-outbox';
import { formatDateTime } from '@/lib/dates';

/** Renders mail text with its links clickable (same-app links only). */
function MailText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/\S+)/g);
  return (
    <pre className="font-sans text-sm whitespace-pre-wrap text-ink-800">
      {parts.map((part, i) =>
        /^https?:\/\//.test(part) ? (
          <a key={i} href={part.startsWith(window.location.origin) ? part.slice(window.location.origin.length) : part} className="break-all text-primary-700 underline">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </pre>
  );
}

/** `outboxKey`: the secret from the link `npm start` prints; without it only a signed-in owner may read. */
export function OutboxPage({ outboxKey }: { outboxKey?: string }) {
  const outbox = useOutbox(outboxKey);
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Mail outbox"
        description="Development server: e-mail is not sent anywhere; it stays here. With a real SMTP server configured this page does not exist."
      />
      {outbox.isPending ? (
        <LoadingState />
      ) : outbox.isError ? (
        <ErrorState
          title={outbox.error instanceof ApiError && outbox.error.status === 404 ? 'The outbox is closed' : undefined}
          message={
            outbox.error instanceof ApiError && outbox.error.status === 404
              ? 'The outbox opens only for an owner who is signed in, or with the outbox link printed beside the address where Porewise was started (npm start).'
              : outbox.error.message
          }
          onRetry={() => outbox.refetch()}
        />
      ) : outbox.data.items.length === 0 ? (
        <EmptyState title="No mail yet">Invitations and password-reset links will appear here.</EmptyState>
      ) : (
        <ul className="flex flex-col gap-4">
          {outbox.data.items.map((m) => (
            <li key={m.id}>
              <Card title={m.subject} description={`To ${m.to.join(', ')} · ${formatDateTime(m.receivedAt)}`}>
                <MailText text={m.text} />
              </Card>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
