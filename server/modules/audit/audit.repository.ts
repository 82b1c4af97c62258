import { and, count, desc, eq, gte, inArray, lt, lte, or, sql, type SQL } from 'drizzle-orm';
import { PgTransaction } from 'drizzle-orm/pg-core';
import type { AuditFilter, AuditKind } from '../../../shared/schemas/audit';
import { fromInstant, toInstant } from '../../../shared/schemas/audit';
import type { DbOrTx } from '../../db/client';
import {
  attachmentsTable,
  auditEventsTable,
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  invitationsTable,
  labResultsTable,
  linesTable,
  lotsTable,
  membershipsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runsTable,
  tanksTable,
  usersTable,
  wineriesTable,
  type AuditFieldChange,
} from '../../db/schema';

export type AuditEventRow = typeof auditEventsTable.$inferSelect;
export type AuditEventInsert = {
  wineryId: string;
  userId: string | null;
  action: string;
  recordKind: AuditKind;
  recordId: string;
  recordLabel: string;
  parentKind?: AuditKind | null;
  parentId?: string | null;
  changes: Record<string, AuditFieldChange> | null;
  at?: Date;
};

/** What a record looked like at one moment: its fields, a human label, and the record it belongs to. */
export type AuditSnapshot = { values: Record<string, unknown>; label: string; parentKind?: AuditKind; parentId?: string };

const day = (d: Date | string | null | undefined) => (d instanceof Date ? d.toISOString().slice(0, 10) : (d ?? ''));

/** Runs `fn` in a transaction: the open one when `db` is already a transaction, else a new one. */
export function inTransaction<T>(db: DbOrTx, fn: (tx: DbOrTx) => Promise<T>): Promise<T> {
  if (db instanceof PgTransaction) return fn(db);
  return db.transaction((tx) => fn(tx));
}

/** Loads the current state of one record of a kind, within its winery; null when there is none. */
async function snapshotOf(db: DbOrTx, kind: AuditKind, wineryId: string, id: string): Promise<AuditSnapshot | null> {
  // Members are named by their user id and settings by the winery; every other record by a UUID.
  if (kind !== 'member' && kind !== 'settings' && !/^[0-9a-f-]{36}$/i.test(id)) return null;
  switch (kind) {
    case 'tank': {
      const [r] = await db.select().from(tanksTable).where(and(eq(tanksTable.wineryId, wineryId), eq(tanksTable.id, id)));
      return r ? { values: r, label: r.name } : null;
    }
    case 'lot': {
      const [r] = await db.select().from(lotsTable).where(and(eq(lotsTable.wineryId, wineryId), eq(lotsTable.id, id)));
      return r ? { values: r, label: `${r.code} ${r.name}` } : null;
    }
    case 'lab-result': {
      const [r] = await db
        .select({ result: labResultsTable, lotCode: lotsTable.code })
        .from(labResultsTable)
        .innerJoin(lotsTable, eq(lotsTable.id, labResultsTable.lotId))
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.id, id)));
      return r ? { values: r.result, label: `${r.lotCode}, sample of ${day(r.result.sampledAt)}`, parentKind: 'lot', parentId: r.result.lotId } : null;
    }
    case 'housing': {
      const [r] = await db.select().from(housingsTable).where(and(eq(housingsTable.wineryId, wineryId), eq(housingsTable.id, id)));
      return r ? { values: r, label: r.name } : null;
    }
    case 'line': {
      const [r] = await db.select().from(linesTable).where(and(eq(linesTable.wineryId, wineryId), eq(linesTable.id, id)));
      return r ? { values: r, label: r.name } : null;
    }
    case 'cartridge-type': {
      const [r] = await db.select().from(cartridgeTypesTable).where(and(eq(cartridgeTypesTable.wineryId, wineryId), eq(cartridgeTypesTable.id, id)));
      return r ? { values: r, label: r.name } : null;
    }
    case 'cartridge': {
      const [r] = await db
        .select({ cartridge: cartridgesTable, typeName: cartridgeTypesTable.name })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
      return r ? { values: r.cartridge, label: `${r.cartridge.serial} (${r.typeName})` } : null;
    }
    case 'care-cycle':
    case 'integrity-test': {
      const [r] = await db
        .select({ event: cartridgeEventsTable, serial: cartridgesTable.serial })
        .from(cartridgeEventsTable)
        .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.id, id)));
      if (!r) return null;
      const d = r.event.details ?? {};
      const what = kind === 'care-cycle' ? `${String(d.kind ?? 'care')} cycle` : `${String(d.method ?? d.test ?? 'integrity test')}, ${d.pass ? 'pass' : 'fail'}`;
      return { values: r.event, label: `${r.serial}: ${what}`, parentKind: 'cartridge', parentId: r.event.cartridgeId };
    }
    case 'plan': {
      const [r] = await db.select().from(plansTable).where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)));
      if (!r) return null;
      // The day's lots and their train options belong to the plan: an edit of either shows as a change of the plan.
      const lots = await db
        .select({ id: planLotsTable.id, code: lotsTable.code, position: planLotsTable.position, volumeL: planLotsTable.volumeL, chosenTrainId: planLotsTable.chosenTrainId })
        .from(planLotsTable)
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.planId, id)))
        .orderBy(planLotsTable.position);
      const trains = lots.length
        ? await db
            .select({ id: planTrainsTable.id, planLotId: planTrainsTable.planLotId, name: planTrainsTable.name, stages: planTrainsTable.stages, hoses: planTrainsTable.hoses })
            .from(planTrainsTable)
            .where(and(eq(planTrainsTable.wineryId, wineryId), inArray(planTrainsTable.planLotId, lots.map((l) => l.id))))
            .orderBy(planTrainsTable.createdAt, planTrainsTable.id)
        : [];
      const values = {
        ...r,
        lots: lots.map((l) => ({
          lot: l.code,
          position: l.position,
          volumeL: l.volumeL,
          chosenTrain: trains.find((t) => t.id === l.chosenTrainId)?.name ?? null,
          trains: trains.filter((t) => t.planLotId === l.id).map((t) => ({ name: t.name, stages: t.stages, hoses: t.hoses })),
        })),
      };
      return { values, label: `${r.name} (${r.plannedDate})` };
    }
    case 'run': {
      const [r] = await db
        .select({ run: runsTable, lotCode: lotsTable.code, planName: plansTable.name })
        .from(runsTable)
        .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
        .where(and(eq(runsTable.wineryId, wineryId), eq(runsTable.id, id)));
      return r ? { values: r.run, label: `Run of ${r.lotCode} (${r.planName})`, parentKind: 'plan', parentId: r.run.planId } : null;
    }
    case 'member': {
      const [r] = await db
        .select({ userId: membershipsTable.userId, role: membershipsTable.role, name: usersTable.name, email: usersTable.email })
        .from(membershipsTable)
        .innerJoin(usersTable, eq(usersTable.id, membershipsTable.userId))
        .where(and(eq(membershipsTable.wineryId, wineryId), eq(membershipsTable.userId, id)));
      return r ? { values: r, label: `${r.name} <${r.email}>` } : null;
    }
    case 'invitation': {
      const [r] = await db
        .select({
          email: invitationsTable.email,
          role: invitationsTable.role,
          invitedBy: invitationsTable.invitedBy,
          expiresAt: invitationsTable.expiresAt,
          acceptedAt: invitationsTable.acceptedAt,
          acceptedBy: invitationsTable.acceptedBy,
          revokedAt: invitationsTable.revokedAt,
        })
        .from(invitationsTable)
        .where(and(eq(invitationsTable.wineryId, wineryId), eq(invitationsTable.id, id)));
      return r ? { values: r, label: r.email } : null;
    }
    case 'settings': {
      const [r] = await db.select({ name: wineriesTable.name, settings: wineriesTable.settings }).from(wineriesTable).where(eq(wineriesTable.id, wineryId));
      return r ? { values: { name: r.name, ...r.settings }, label: r.name } : null;
    }
    case 'attachment': {
      const [r] = await db
        .select({
          id: attachmentsTable.id,
          ownerKind: attachmentsTable.ownerKind,
          ownerId: attachmentsTable.ownerId,
          fileName: attachmentsTable.fileName,
          contentType: attachmentsTable.contentType,
          sizeBytes: attachmentsTable.sizeBytes,
          uploadedBy: attachmentsTable.uploadedBy,
        })
        .from(attachmentsTable)
        .where(and(eq(attachmentsTable.wineryId, wineryId), eq(attachmentsTable.id, id)));
      return r ? { values: r, label: r.fileName, parentKind: r.ownerKind, parentId: r.ownerId } : null;
    }
  }
}

/** The WHERE of a filtered read: the winery, the kinds the reader may see, and the filters. */
function filterWhere(wineryId: string, filter: AuditFilter, kinds: readonly AuditKind[] | 'all'): SQL | undefined {
  const e = auditEventsTable;
  const byRecord =
    filter.recordId !== undefined
      ? filter.kind
        ? or(and(eq(e.recordKind, filter.kind), eq(e.recordId, filter.recordId)), and(eq(e.parentKind, filter.kind), eq(e.parentId, filter.recordId)))
        : or(eq(e.recordId, filter.recordId), eq(e.parentId, filter.recordId))
      : filter.kind
        ? eq(e.recordKind, filter.kind)
        : undefined;
  return and(
    eq(e.wineryId, wineryId),
    kinds === 'all' ? undefined : kinds.length ? inArray(e.recordKind, [...kinds]) : sql`false`,
    byRecord,
    filter.userId ? eq(e.userId, filter.userId) : undefined,
    filter.action ? eq(e.action, filter.action) : undefined,
    filter.from ? gte(e.at, new Date(fromInstant(filter.from))) : undefined,
    filter.to ? lte(e.at, new Date(toInstant(filter.to))) : undefined,
  );
}

export function createAuditRepository(db: DbOrTx) {
  return {
    snapshot: (kind: AuditKind, wineryId: string, id: string) => snapshotOf(db, kind, wineryId, id),

    /** Appends events; the person's name is copied from their account as it is now, in the same statement. */
    async insert(events: AuditEventInsert[]) {
      // In chunks, so a large import stays under PostgreSQL's limit of parameters per statement.
      for (let i = 0; i < events.length; i += 500) {
        await db.insert(auditEventsTable).values(
          events.slice(i, i + 500).map((ev) => ({
            ...ev,
            // Millisecond precision, so the keyset paging of the CSV (JavaScript dates) finds every event.
            at: ev.at ?? sql`date_trunc('milliseconds', clock_timestamp())`,
            userName: ev.userId ? sql`coalesce((select ${usersTable.name} from ${usersTable} where ${usersTable.id} = ${ev.userId}), '')` : '',
          })),
        );
      }
    },

    /** One page of events, newest first, and the count of all matching. */
    async page(wineryId: string, filter: AuditFilter, kinds: readonly AuditKind[] | 'all', window: { limit: number; offset: number }) {
      const where = filterWhere(wineryId, filter, kinds);
      const [rows, [{ total }]] = await Promise.all([
        db.select().from(auditEventsTable).where(where).orderBy(desc(auditEventsTable.at), desc(auditEventsTable.id)).limit(window.limit).offset(window.offset),
        db.select({ total: count() }).from(auditEventsTable).where(where),
      ]);
      return { rows, total };
    },

    /** Events newest first in pages of `size`, by keyset (at, id): a long log is never held in memory. */
    async *stream(wineryId: string, filter: AuditFilter, kinds: readonly AuditKind[] | 'all', size = 500, max = Number.POSITIVE_INFINITY) {
      const e = auditEventsTable;
      let cursor: { at: Date; id: string } | null = null;
      let sent = 0;
      while (sent < max) {
        const after: SQL | undefined = cursor ? or(lt(e.at, cursor.at), and(eq(e.at, cursor.at), lt(e.id, cursor.id))) : undefined;
        const rows = await db
          .select()
          .from(e)
          .where(and(filterWhere(wineryId, filter, kinds), after))
          .orderBy(desc(e.at), desc(e.id))
          .limit(Math.min(size, max - sent));
        if (rows.length === 0) return;
        for (const row of rows) yield row;
        sent += rows.length;
        const last: AuditEventRow = rows[rows.length - 1];
        cursor = { at: last.at, id: last.id };
        if (rows.length < size) return;
      }
    },

    /** People who appear in the winery's log (by their name at the latest change). */
    async people(wineryId: string) {
      return db
        .selectDistinctOn([auditEventsTable.userId], { userId: auditEventsTable.userId, userName: auditEventsTable.userName })
        .from(auditEventsTable)
        .where(and(eq(auditEventsTable.wineryId, wineryId), sql`${auditEventsTable.userId} is not null`))
        .orderBy(auditEventsTable.userId, desc(auditEventsTable.at));
    },
  };
}
export type AuditRepository = ReturnType<typeof createAuditRepository>;
