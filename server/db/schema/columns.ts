import { doublePrecision, timestamp, uuid } from 'drizzle-orm/pg-core';
import { wineriesTable } from './wineries';

/** Columns every winery-owned table has. */
export const tenantColumns = () => ({
  id: uuid('id').primaryKey().defaultRandom(),
  wineryId: uuid('winery_id')
    .notNull()
    .references(() => wineriesTable.id, { onDelete: 'cascade' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const double = (name: string) => doublePrecision(name);
