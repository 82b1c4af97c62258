import type { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import { can, type Role } from '../../../shared/permissions';
import {
  AUDIT_CSV_MAX_ROWS,
  auditActionLabels,
  auditKindLabels,
  auditKindReadAction,
  auditKinds,
  type AuditAction,
  type AuditFilter,
  type AuditKind,
  type AuditListQuery,
} from '../../../shared/schemas/audit';
import type { ListDto } from '../../../shared/types/api';
import type { AuditEventDto, AuditPersonDto } from '../../../shared/types/audit';
import type { Database, DbOrTx } from '../../db/client';
import { csvStream } from '../../lib/csv';
import { pageWindow } from '../../db/list';
import { fieldChanges } from './audit-diff';
import { createAuditRepository, inTransaction, type AuditEventRow, type AuditSnapshot } from './audit.repository';

/** Who made a change, in which winery (a TenantContext fits). */
export type AuditActor = { wineryId: string; userId: string | null };

export type AuditWhat = {
  action: AuditAction;
  kind: AuditKind;
  /** The record's id; for a create, leave it out and give `idOf` (from the write's result). */
  id?: string;
};

/**
 * Records one change in the change log, in the transaction `tx` the change was made in.
 * `before` is the record's snapshot before the change (from {@link auditSnapshot}; null for a
 * create); the state after is read here (none for a delete). The field diff is computed here.
 */
export async function recordChange(tx: DbOrTx, actor: AuditActor, what: Required<AuditWhat> & { before?: AuditSnapshot | null; label?: string }) {
  const repo = createAuditRepository(tx);
  const before = what.before ?? null;
  const after = what.action === 'delete' ? null : await repo.snapshot(what.kind, actor.wineryId, what.id);
  const shown = after ?? before;
  // Nothing there before or after (a missing or foreign id): nothing happened to log.
  if (!shown) return;
  await repo.insert([
    {
      wineryId: actor.wineryId,
      userId: actor.userId,
      action: what.action,
      recordKind: what.kind,
      recordId: what.id,
      recordLabel: what.label ?? shown?.label ?? '',
      parentKind: shown?.parentKind ?? null,
      parentId: shown?.parentId ?? null,
      changes: fieldChanges(before?.values ?? null, after?.values ?? null),
    },
  ]);
}

/** The record's state now, for `before` of {@link recordChange}. */
export const auditSnapshot = (tx: DbOrTx, kind: AuditKind, wineryId: string, id: string) => createAuditRepository(tx).snapshot(kind, wineryId, id);

/**
 * Runs a write and records it in the change log, both in one transaction (the open one when
 * `db` is a transaction). Snapshots the record before and after, so an update's event carries
 * each changed field. For a create give `idOf` to find the new id in the write's result. When
 * the write throws, nothing is written (the transaction rolls back).
 */
export function audited<T>(
  db: DbOrTx,
  actor: AuditActor,
  what: AuditWhat & { idOf?: (result: NoInfer<T>) => string },
  write: (tx: DbOrTx) => Promise<T>,
): Promise<T> {
  return inTransaction(db, async (tx) => {
    const before = what.id ? await auditSnapshot(tx, what.kind, actor.wineryId, what.id) : null;
    const result = await write(tx);
    // A write that answers false or null found nothing to change (the service answers 404): no event.
    if (result === false || result === null) return result;
    const id = what.id ?? what.idOf?.(result) ?? (typeof result === 'string' ? result : undefined);
    if (!id) throw new Error(`audited: no record id for ${what.kind} ${what.action}`);
    await recordChange(tx, actor, { action: what.action, kind: what.kind, id, before });
    return result;
  });
}

/** Several records created at once (an import): one event each, written in one statement, from the inserted rows. */
export async function recordCreated(tx: DbOrTx, actor: AuditActor, action: AuditAction, kind: AuditKind, records: { id: string; label: string; values: object }[]) {
  await createAuditRepository(tx).insert(
    records.map((r) => ({
      wineryId: actor.wineryId,
      userId: actor.userId,
      action,
      recordKind: kind,
      recordId: r.id,
      recordLabel: r.label,
      changes: fieldChanges(null, r.values as Record<string, unknown>),
    })),
  );
}

/** Owners and auditors read every event; the others the events of the kinds of record they may read. */
export function readableKinds(role: Role): readonly AuditKind[] | 'all' {
  if (role === 'owner' || role === 'auditor') return 'all';
  return auditKinds.filter((k) => can(role, auditKindReadAction[k]));
}

export function presentAuditEvent(row: AuditEventRow): AuditEventDto {
  return {
    id: row.id,
    at: row.at.toISOString(),
    userId: row.userId,
    userName: row.userName,
    action: row.action as AuditAction,
    recordKind: row.recordKind as AuditKind,
    recordId: row.recordId,
    recordLabel: row.recordLabel,
    parentKind: (row.parentKind as AuditKind | null) ?? null,
    parentId: row.parentId,
    changes: row.changes ?? null,
  };
}

const shortValue = (v: unknown) => (v === null ? '—' : typeof v === 'string' ? v : JSON.stringify(v));
/** The changes of an event as one line of text: "field: before → after; …". */
export const changesText = (changes: AuditEventRow['changes']) =>
  changes ? Object.entries(changes).map(([field, c]) => `${field}: ${shortValue(c.before)} → ${shortValue(c.after)}`).join('; ') : '';

export const AUDIT_CSV_HEADER = ['at', 'person', 'person_id', 'action', 'record_kind', 'record_id', 'record', 'changes'] as const;

type Reader = { wineryId: string; role: Role };

export function createAuditService(db: Database) {
  const repo = createAuditRepository(db);
  return {
    async list(reader: Reader, query: AuditListQuery): Promise<ListDto<AuditEventDto>> {
      const { rows, total } = await repo.page(reader.wineryId, query, readableKinds(reader.role), pageWindow(query));
      return { items: rows.map(presentAuditEvent), total };
    },

    async people(reader: Reader): Promise<{ items: AuditPersonDto[] }> {
      const rows = await repo.people(reader.wineryId);
      return { items: rows.filter((r) => r.userId).map((r) => ({ userId: r.userId!, userName: r.userName })).sort((a, b) => a.userName.localeCompare(b.userName)) };
    },

    /** Writes the filtered log as CSV to `out`, newest first, read in pages (never all at once). */
    async writeCsv(reader: Reader, filter: AuditFilter, out: Writable) {
      const rows = repo.stream(reader.wineryId, filter, readableKinds(reader.role), 500, AUDIT_CSV_MAX_ROWS);
      const lines = Readable.from(
        (async function* () {
          for await (const r of rows) {
            yield [
              r.at,
              r.userName,
              r.userId ?? '',
              auditActionLabels[r.action as AuditAction] ?? r.action,
              auditKindLabels[r.recordKind as AuditKind] ?? r.recordKind,
              r.recordId,
              r.recordLabel,
              changesText(r.changes),
            ];
          }
        })(),
      );
      await pipeline(lines, csvStream(AUDIT_CSV_HEADER), out);
    },
  };
}
export type AuditService = ReturnType<typeof createAuditService>;
