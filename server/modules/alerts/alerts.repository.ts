import { and, count, desc, eq, gte, inArray, isNull, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  alertPreferencesTable,
  alertsTable,
  calendarFeedsTable,
  cartridgeTypesTable,
  mailFailuresTable,
  membershipsTable,
  notificationsTable,
  plansTable,
  usersTable,
  wineriesTable,
} from '../../db/schema';

export type AlertRow = typeof alertsTable.$inferSelect;

export function createAlertsRepository(db: DbOrTx) {
  return {
    /** Serialises evaluations of one winery until the end of the transaction. */
    async lockWinery(wineryId: string) {
      await db.execute(sql`select pg_advisory_xact_lock(hashtext(${'alerts:' + wineryId}))`);
    },
    async winery(wineryId: string) {
      const [row] = await db.select().from(wineriesTable).where(eq(wineriesTable.id, wineryId));
      return row ?? null;
    },
    async allWineries() {
      return db.select({ id: wineriesTable.id, name: wineriesTable.name, settings: wineriesTable.settings }).from(wineriesTable);
    },
    async openAlerts(wineryId: string) {
      return db.select().from(alertsTable).where(and(eq(alertsTable.wineryId, wineryId), isNull(alertsTable.clearedAt)));
    },
    async openAlertsFor(wineryId: string, recordIds: string[]) {
      if (!recordIds.length) return [];
      return db
        .select()
        .from(alertsTable)
        .where(and(eq(alertsTable.wineryId, wineryId), isNull(alertsTable.clearedAt), inArray(alertsTable.recordId, recordIds)))
        .orderBy(desc(alertsTable.openedAt));
    },
    async insertAlert(values: typeof alertsTable.$inferInsert) {
      const [row] = await db.insert(alertsTable).values(values).onConflictDoNothing().returning();
      return row ?? null;
    },
    async clearAlerts(ids: string[], at: Date) {
      if (!ids.length) return;
      await db.update(alertsTable).set({ clearedAt: at }).where(inArray(alertsTable.id, ids));
    },
    async touchAlert(id: string, changes: Partial<Pick<AlertRow, 'title' | 'message' | 'details' | 'notifiedAt' | 'severity'>>) {
      await db.update(alertsTable).set(changes).where(eq(alertsTable.id, id));
    },
    /** Members with their role, e-mail and stored preferences in this winery. */
    async members(wineryId: string) {
      const people = await db
        .select({ userId: usersTable.id, name: usersTable.name, email: usersTable.email, role: membershipsTable.role })
        .from(membershipsTable)
        .innerJoin(usersTable, eq(usersTable.id, membershipsTable.userId))
        .where(eq(membershipsTable.wineryId, wineryId));
      const prefs = await db.select().from(alertPreferencesTable).where(eq(alertPreferencesTable.wineryId, wineryId));
      return people.map((p) => ({ ...p, prefs: Object.fromEntries(prefs.filter((x) => x.userId === p.userId).map((x) => [x.kind, x.channel])) }));
    },
    async insertNotifications(rows: (typeof notificationsTable.$inferInsert)[]) {
      if (!rows.length) return;
      await db.insert(notificationsTable).values(rows).onConflictDoNothing();
    },
    async resetNotifications(alertId: string) {
      await db.update(notificationsTable).set({ readAt: null, digestedAt: null }).where(eq(notificationsTable.alertId, alertId));
    },
    async notifications(userId: string, wineryId: string, opts: { unread: boolean; limit: number; offset: number }) {
      const where = and(eq(notificationsTable.userId, userId), eq(notificationsTable.wineryId, wineryId), opts.unread ? isNull(notificationsTable.readAt) : undefined);
      const items = await db
        .select({ notification: notificationsTable, alert: alertsTable })
        .from(notificationsTable)
        .innerJoin(alertsTable, eq(alertsTable.id, notificationsTable.alertId))
        .where(where)
        .orderBy(desc(alertsTable.notifiedAt), desc(notificationsTable.id))
        .limit(opts.limit)
        .offset(opts.offset);
      const [{ total }] = await db.select({ total: count() }).from(notificationsTable).where(where);
      const [{ unread }] = await db
        .select({ unread: count() })
        .from(notificationsTable)
        .where(and(eq(notificationsTable.userId, userId), eq(notificationsTable.wineryId, wineryId), isNull(notificationsTable.readAt)));
      return { items, total, unread };
    },
    async markRead(userId: string, wineryId: string, id: string | null, at: Date) {
      const rows = await db
        .update(notificationsTable)
        .set({ readAt: at })
        .where(
          and(
            eq(notificationsTable.userId, userId),
            eq(notificationsTable.wineryId, wineryId),
            id ? eq(notificationsTable.id, id) : isNull(notificationsTable.readAt),
          ),
        )
        .returning({ id: notificationsTable.id });
      return rows.length;
    },
    /** Open alerts of the winery (for Today). */
    async openAlertList(wineryId: string, limit: number) {
      return db.select().from(alertsTable).where(and(eq(alertsTable.wineryId, wineryId), isNull(alertsTable.clearedAt))).orderBy(desc(alertsTable.openedAt)).limit(limit);
    },
    /** Digest notifications not yet sent for one winery, with their alerts and people. */
    async pendingDigest(wineryId: string) {
      return db
        .select({ notification: notificationsTable, alert: alertsTable, email: usersTable.email, name: usersTable.name })
        .from(notificationsTable)
        .innerJoin(alertsTable, eq(alertsTable.id, notificationsTable.alertId))
        .innerJoin(usersTable, eq(usersTable.id, notificationsTable.userId))
        .where(and(eq(notificationsTable.wineryId, wineryId), eq(notificationsTable.channel, 'digest'), isNull(notificationsTable.digestedAt)));
    },
    async markDigested(ids: string[], at: Date) {
      if (!ids.length) return;
      await db.update(notificationsTable).set({ digestedAt: at }).where(inArray(notificationsTable.id, ids));
    },
    async preferences(userId: string, wineryId: string) {
      return db.select().from(alertPreferencesTable).where(and(eq(alertPreferencesTable.userId, userId), eq(alertPreferencesTable.wineryId, wineryId)));
    },
    async setPreferences(userId: string, wineryId: string, rows: { kind: string; channel: 'app' | 'email' | 'digest' | 'off' }[]) {
      await db.delete(alertPreferencesTable).where(and(eq(alertPreferencesTable.userId, userId), eq(alertPreferencesTable.wineryId, wineryId)));
      if (rows.length) await db.insert(alertPreferencesTable).values(rows.map((r) => ({ ...r, userId, wineryId })));
    },
    async insertMailFailure(values: typeof mailFailuresTable.$inferInsert) {
      await db.insert(mailFailuresTable).values(values).onConflictDoNothing();
    },
    async mailFailures(wineryId: string) {
      return db.select().from(mailFailuresTable).where(eq(mailFailuresTable.wineryId, wineryId)).orderBy(desc(mailFailuresTable.failedAt)).limit(200);
    },
    async mailFailure(wineryId: string, id: string) {
      const [row] = await db.select().from(mailFailuresTable).where(and(eq(mailFailuresTable.wineryId, wineryId), eq(mailFailuresTable.id, id)));
      return row ?? null;
    },
    async markResent(id: string, at: Date) {
      await db.update(mailFailuresTable).set({ resentAt: at }).where(eq(mailFailuresTable.id, id));
    },
    /** Cartridge type id → kind (prefilter or membrane). */
    async typeKinds(wineryId: string, ids: string[]) {
      if (!ids.length) return new Map<string, string>();
      const rows = await db
        .select({ id: cartridgeTypesTable.id, kind: cartridgeTypesTable.kind })
        .from(cartridgeTypesTable)
        .where(and(eq(cartridgeTypesTable.wineryId, wineryId), inArray(cartridgeTypesTable.id, ids)));
      return new Map(rows.map((r) => [r.id, r.kind as string]));
    },
    async approvedPlanIds(wineryId: string, fromDate: string) {
      const rows = await db
        .select({ id: plansTable.id })
        .from(plansTable)
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.status, 'approved'), gte(plansTable.plannedDate, fromDate)))
        .orderBy(plansTable.plannedDate);
      return rows.map((r) => r.id);
    },
    /** Approved plans of every winery the person belongs to (for their calendar feed). */
    async feedPlans(userId: string) {
      return db
        .select({ id: plansTable.id, wineryId: plansTable.wineryId, role: membershipsTable.role })
        .from(plansTable)
        .innerJoin(membershipsTable, and(eq(membershipsTable.wineryId, plansTable.wineryId), eq(membershipsTable.userId, userId)))
        .where(inArray(plansTable.status, ['approved', 'done']))
        .orderBy(plansTable.plannedDate)
        .limit(500);
    },
    async setFeed(userId: string, tokenHash: string) {
      await db
        .insert(calendarFeedsTable)
        .values({ userId, tokenHash })
        .onConflictDoUpdate({ target: calendarFeedsTable.userId, set: { tokenHash, createdAt: new Date() } });
    },
    async feedByHash(tokenHash: string) {
      const [row] = await db.select().from(calendarFeedsTable).where(eq(calendarFeedsTable.tokenHash, tokenHash));
      return row ?? null;
    },
  };
}
export type AlertsRepository = ReturnType<typeof createAlertsRepository>;
