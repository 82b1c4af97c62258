import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { wineriesTable } from './wineries';

/** One changed field of an update: its value before and after (JSON values). */
export type AuditFieldChange = { before: unknown; after: unknown };

/**
 * The change log: one row per create, update, delete, archive or state change, written in the
 * same transaction as the change. Append-only: a trigger refuses UPDATE and DELETE (custom
 * migration). The person's name is kept as it was at the time; the user id is not a foreign key,
 * so removing a person never changes "who".
 */
export const auditEventsTable = pgTable(
  'audit_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'restrict' }),
    userId: text('user_id'),
    userName: text('user_name').notNull().default(''),
    action: text('action').notNull(),
    recordKind: text('record_kind').notNull(),
    /** Text, since members are named by their user id. */
    recordId: text('record_id').notNull(),
    recordLabel: text('record_label').notNull().default(''),
    /** The record this one belongs to (a lot for its lab results, a cartridge for its care), so its history shows both. */
    parentKind: text('parent_kind'),
    parentId: text('parent_id'),
    changes: jsonb('changes').$type<Record<string, AuditFieldChange>>(),
  },
  (t) => [
    index('audit_events_winery_at_idx').on(t.wineryId, t.at),
    index('audit_events_record_idx').on(t.wineryId, t.recordKind, t.recordId),
    index('audit_events_parent_idx').on(t.wineryId, t.parentKind, t.parentId),
    index('audit_events_user_idx').on(t.wineryId, t.userId),
  ],
);
