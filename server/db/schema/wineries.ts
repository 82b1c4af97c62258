import { index, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { roles } from '../../../shared/permissions';
import { usersTable } from './auth';

export const wineriesTable = pgTable('wineries', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  settings: jsonb('settings').$type<Record<string, unknown>>().notNull().default({}),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const membershipsTable = pgTable(
  'memberships',
  {
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    role: text('role', { enum: roles }).notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.wineryId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);

export const invitationsTable = pgTable(
  'invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: text('role', { enum: roles }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    invitedBy: text('invited_by').references(() => usersTable.id, { onDelete: 'set null' }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    acceptedBy: text('accepted_by').references(() => usersTable.id, { onDelete: 'set null' }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('invitations_winery_idx').on(t.wineryId, t.email)],
);
