import { integer, jsonb, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';

/** Answers to writes sent with an Idempotency-Key, so a retried request is answered, not repeated. */
export const idempotencyKeysTable = pgTable(
  'idempotency_keys',
  {
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    key: text('key').notNull(),
    route: text('route').notNull(),
    status: integer('status').notNull(),
    body: jsonb('body'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.key] })],
);
