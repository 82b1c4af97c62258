import { and, asc, eq } from 'drizzle-orm';
import type { AttachmentOwner, AttachmentOwnerKind } from '../../../shared/schemas/attachments';
import type { DbOrTx } from '../../db/client';
import {
  attachmentsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  labResultsTable,
  lotsTable,
  runsTable,
  usersTable,
} from '../../db/schema';

const ownerTables = {
  lot: lotsTable,
  'lab-result': labResultsTable,
  'cartridge-type': cartridgeTypesTable,
  cartridge: cartridgesTable,
  housing: housingsTable,
  run: runsTable,
} satisfies Record<AttachmentOwnerKind, unknown>;

const columns = {
  id: attachmentsTable.id,
  ownerKind: attachmentsTable.ownerKind,
  ownerId: attachmentsTable.ownerId,
  fileName: attachmentsTable.fileName,
  contentType: attachmentsTable.contentType,
  sizeBytes: attachmentsTable.sizeBytes,
  storageKey: attachmentsTable.storageKey,
  uploadedBy: usersTable.name,
  uploadedById: attachmentsTable.uploadedBy,
  createdAt: attachmentsTable.createdAt,
};

export function createAttachmentsRepository(db: DbOrTx) {
  return {
    /** Whether the record the file is attached to exists in this winery. */
    async ownerExists(wineryId: string, owner: AttachmentOwner) {
      const table = ownerTables[owner.ownerKind];
      const rows = await db
        .select({ id: table.id })
        .from(table)
        .where(and(eq(table.id, owner.ownerId), eq(table.wineryId, wineryId)));
      return rows.length > 0;
    },
    async list(wineryId: string, owner: AttachmentOwner) {
      return db
        .select(columns)
        .from(attachmentsTable)
        .leftJoin(usersTable, eq(usersTable.id, attachmentsTable.uploadedBy))
        .where(and(eq(attachmentsTable.wineryId, wineryId), eq(attachmentsTable.ownerKind, owner.ownerKind), eq(attachmentsTable.ownerId, owner.ownerId)))
        .orderBy(asc(attachmentsTable.createdAt));
    },
    async find(wineryId: string, id: string) {
      const [row] = await db
        .select(columns)
        .from(attachmentsTable)
        .leftJoin(usersTable, eq(usersTable.id, attachmentsTable.uploadedBy))
        .where(and(eq(attachmentsTable.wineryId, wineryId), eq(attachmentsTable.id, id)));
      return row ?? null;
    },
    async insert(values: typeof attachmentsTable.$inferInsert) {
      const [row] = await db.insert(attachmentsTable).values(values).returning({ id: attachmentsTable.id });
      return row.id;
    },
    async remove(wineryId: string, id: string) {
      await db.delete(attachmentsTable).where(and(eq(attachmentsTable.wineryId, wineryId), eq(attachmentsTable.id, id)));
    },
  };
}

export type AttachmentRow = NonNullable<Awaited<ReturnType<ReturnType<typeof createAttachmentsRepository>['find']>>>;
