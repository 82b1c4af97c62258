import type { AuditAction, AuditKind } from '../schemas/audit';

/** One changed field: before → after (JSON values; null when absent). */
export type AuditFieldChangeDto = { before: unknown; after: unknown };

/** One event of the change log. */
export type AuditEventDto = {
  id: string;
  at: string;
  userId: string | null;
  /** The person's name as it was when the change was made. */
  userName: string;
  action: AuditAction;
  recordKind: AuditKind;
  recordId: string;
  recordLabel: string;
  parentKind: AuditKind | null;
  parentId: string | null;
  changes: Record<string, AuditFieldChangeDto> | null;
};

/** A person who appears in the change log (for the filter). */
export type AuditPersonDto = { userId: string; userName: string };
