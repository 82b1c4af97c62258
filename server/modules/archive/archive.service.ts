import type { Database, DbOrTx } from '../../db/client';
import { inRecord, notFound } from '../../lib/errors';
import type { AuditKind } from '../../../shared/schemas/audit';
import type { TenantContext } from '../../middleware/authorize';
import { audited } from '../audit/audit.service';
import { createArchiveRepository, type ArchivableKind } from './archive.repository';

const names: Record<ArchivableKind | 'plan-lots', string> = {
  lots: 'lot',
  plans: 'plan',
  'plan-lots': 'lot of this plan',
  cartridges: 'cartridge',
  housings: 'housing',
  'cartridge-types': 'cartridge type',
};
const auditKindOf: Record<ArchivableKind, AuditKind> = {
  lots: 'lot',
  plans: 'plan',
  cartridges: 'cartridge',
  housings: 'housing',
  'cartridge-types': 'cartridge-type',
};
const notFoundNames: Record<ArchivableKind, string> = {
  lots: 'Lot',
  plans: 'Plan',
  cartridges: 'Cartridge',
  housings: 'Housing',
  'cartridge-types': 'Cartridge type',
};

/**
 * Throws 409 in_record when a run or care history holds the row, naming the record and
 * offering to archive instead. Call it inside the delete's transaction (`tx`), before deleting.
 */
export async function refuseIfInRecord(tx: DbOrTx, kind: ArchivableKind | 'plan-lots', wineryId: string, id: string) {
  const holder = await createArchiveRepository(tx).holder(kind, wineryId, id);
  if (!holder) return;
  const archive = kind === 'plan-lots' ? '' : ' Archive it instead: it leaves the lists and stays in every record.';
  throw inRecord(`This ${names[kind]} is part of ${holder.label}, so it cannot be deleted.${archive}`, holder);
}

/** The record that holds the row (a run, a care history…), or null: for a delete that decides by the kind of holder. */
export function recordHolder(tx: DbOrTx, kind: ArchivableKind | 'plan-lots', wineryId: string, id: string) {
  return createArchiveRepository(tx).holder(kind, wineryId, id);
}

/** Deletes a cartridge no record holds, inside the caller's transaction (after `refuseIfInRecord`). */
export function deleteBareCartridge(tx: DbOrTx, wineryId: string, id: string) {
  return createArchiveRepository(tx).deleteBareCartridge(wineryId, id);
}

/** Archive and unarchive: hidden from lists by default, still in every record. */
export function createArchiveService(db: Database) {
  return {
    async setArchived(t: TenantContext, kind: ArchivableKind, id: string, archived: boolean) {
      const at = archived ? new Date() : null;
      // The change log gets one event in the same transaction (none when nothing was found).
      const done = await audited(db, t, { action: archived ? 'archive' : 'unarchive', kind: auditKindOf[kind], id }, (tx) =>
        createArchiveRepository(tx).setArchived(kind, t.wineryId, id, at),
      );
      if (!done) throw notFound(notFoundNames[kind]);
      return { id, archived, archivedAt: at ? at.toISOString() : null };
    },
  };
}
