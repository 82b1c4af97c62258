import { MailCheck } from 'lucide-react';
import type { ReactNode } from 'react';
import { useAppInfo } from '@/lib/session';

/**
 * What a form shows once its mail is on the way: `headline`, then `note`, then (on a development
 * server, where mail stays in the outbox) `outboxNote`, then `after`.
 */
export function MailSent({ headline, note, outboxNote, after }: { headline: ReactNode; note?: ReactNode; outboxNote: ReactNode; after?: ReactNode }) {
  const appInfo = useAppInfo();
  return (
    <div className="flex flex-col gap-3 text-sm text-ink-700" role="status">
      <p className="flex items-start gap-2 text-base text-ink-900">
        <MailCheck aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-primary-600" />
        <span>{headline}</span>
      </p>
      {note}
      {appInfo.data?.mailOutbox ? <p>{outboxNote}</p> : null}
      {after}
    </div>
  );
}
