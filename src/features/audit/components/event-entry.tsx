import { auditActionLabels, auditKindLabels } from '@shared/schemas/audit';
import type { AuditEventDto } from '@shared/types/audit';
import { EventChanges } from './event-changes';

/**
 * One change as a list item: when and who, the action (with the record's kind and label when
 * `showRecord`), and up to `max` of its field changes.
 */
export function EventEntry({ event: e, at, showRecord, max, className }: { event: AuditEventDto; at: string; showRecord: boolean; max: number; className: string }) {
  return (
    <li className={className}>
      <p className="text-sm text-ink-600">
        <time dateTime={e.at} className="num">
          {at}
        </time>{' '}
        · {e.userName || '—'}
      </p>
      <p className="[overflow-wrap:anywhere]">
        <span className="font-semibold text-ink-900">{auditActionLabels[e.action] ?? e.action}</span>
        {showRecord ? (
          <>
            {' '}
            {auditKindLabels[e.recordKind]?.toLowerCase()} <span className="text-ink-800">{e.recordLabel}</span>
          </>
        ) : null}
      </p>
      <EventChanges event={e} max={max} />
    </li>
  );
}
