import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { wineriesTable } from './wineries';

export const usersTable = pgTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  units: text('units', { enum: ['metric', 'us'] }).notNull().default('metric'),
  activeWineryId: uuid('active_winery_id').references(() => wineriesTable.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const sessionsTable = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const passwordResetsTable = pgTable(
  'password_resets',
  {
    tokenHash: text('token_hash').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('password_resets_user_idx').on(t.userId)],
);

/**
 * A sign-up waiting for its e-mail link. Sign-up answers the same for a new and a taken address
 * (nothing tells a stranger which addresses have accounts); the account is created only when the
 * link mailed to the address is opened. The password is stored hashed, the token hashed.
 */
export const signUpRequestsTable = pgTable(
  'sign_up_requests',
  {
    tokenHash: text('token_hash').primaryKey(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    wineryName: text('winery_name').notNull(),
    passwordHash: text('password_hash').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('sign_up_requests_email_idx').on(t.email)],
);

/**
 * Rate-limit counters shared by every server instance: one row per limiter and key (e.g.
 * `signin-ip:203.0.113.7`) with its hits in the current window and when the window ends.
 */
export const rateLimitHitsTable = pgTable(
  'rate_limit_hits',
  {
    key: text('key').primaryKey(),
    hits: integer('hits').notNull().default(0),
    resetAt: timestamp('reset_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('rate_limit_hits_reset_idx').on(t.resetAt)],
);
