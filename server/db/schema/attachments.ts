import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { wineriesTable } from './wineries';

export const attachmentOwnerKinds = ['lot', 'lab-result', 'cartridge-type', 'cartridge', 'housing', 'run'] as const;

export const attachmentsTable = pgTable(
  'attachments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    ownerKind: text('owner_kind', { enum: attachmentOwnerKinds }).notNull(),
    ownerId: uuid('owner_id').notNull(),
    fileName: text('file_name').notNull(),
    contentType: text('content_type').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    storageKey: text('storage_key').notNull(),
    uploadedBy: text('uploaded_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('attachments_owner_idx').on(t.wineryId, t.ownerKind, t.ownerId)],
);
