import { sql } from 'drizzle-orm';
import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { wineriesTable } from './wineries';

/** One alert: a condition on one record (rule, record, threshold), open until it clears. */
export const alertsTable = pgTable(
  'alerts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    severity: text('severity', { enum: ['critical', 'warning', 'info'] }).notNull(),
    recordType: text('record_type').notNull(),
    recordId: uuid('record_id').notNull(),
    threshold: text('threshold').notNull(),
    title: text('title').notNull(),
    message: text('message').notNull(),
    nextStep: text('next_step').notNull(),
    link: text('link').notNull(),
    details: jsonb('details').$type<Record<string, unknown>>().notNull().default({}),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull().defaultNow(),
    notifiedAt: timestamp('notified_at', { withTimezone: true }).notNull().defaultNow(),
    clearedAt: timestamp('cleared_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('alerts_open_uq').on(t.wineryId, t.kind, t.recordId, t.threshold).where(sql`${t.clearedAt} is null`),
    index('alerts_winery_opened_idx').on(t.wineryId, t.openedAt),
  ],
);

/** An alert as it reaches one person: read or not, and how it went out. */
export const notificationsTable = pgTable(
  'notifications',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    alertId: uuid('alert_id')
      .notNull()
      .references(() => alertsTable.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    channel: text('channel', { enum: ['app', 'email', 'digest'] }).notNull(),
    /** Set when a digest has carried it (digest channel only). */
    digestedAt: timestamp('digested_at', { withTimezone: true }),
    readAt: timestamp('read_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('notifications_alert_user_uq').on(t.alertId, t.userId), index('notifications_user_idx').on(t.userId, t.wineryId, t.createdAt)],
);

/** A person's choice of channel for one kind of alert in one winery (absent: the role's default). */
export const alertPreferencesTable = pgTable(
  'alert_preferences',
  {
    userId: text('user_id')
      .notNull()
      .references(() => usersTable.id, { onDelete: 'cascade' }),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    channel: text('channel', { enum: ['app', 'email', 'digest', 'off'] }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.wineryId, t.kind] })],
);

/** Mail that could not be delivered after the last retry, kept for the owners to resend. */
export const mailFailuresTable = pgTable(
  'mail_failures',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id').references(() => wineriesTable.id, { onDelete: 'cascade' }),
    jobId: text('job_id').notNull().unique(),
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    error: text('error').notNull(),
    attempts: integer('attempts').notNull(),
    failedAt: timestamp('failed_at', { withTimezone: true }).notNull().defaultNow(),
    resentAt: timestamp('resent_at', { withTimezone: true }),
  },
  (t) => [index('mail_failures_winery_idx').on(t.wineryId, t.failedAt)],
);

/** A person's private calendar feed: the hash of the secret in its URL. */
export const calendarFeedsTable = pgTable('calendar_feeds', {
  userId: text('user_id')
    .primaryKey()
    .references(() => usersTable.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull().unique(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});
