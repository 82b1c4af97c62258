import { and, asc, count, desc, eq, ilike, inArray, isNotNull, isNull, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import type { CartridgeListQuery, CartridgeSortKey } from '../../../shared/schemas/cartridges';
import type { DbOrTx } from '../../db/client';
import { cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, usersTable } from '../../db/schema';
import { findOwnRow, likePattern, lockedOwnRow, sortedPage } from '../../db/list';

export type CartridgeRow = typeof cartridgesTable.$inferSelect;
export type CartridgeInsert = typeof cartridgesTable.$inferInsert;
export type CartridgeEventInsert = typeof cartridgeEventsTable.$inferInsert;
export type CartridgeTypeRow = typeof cartridgeTypesTable.$inferSelect;
export type HousingRow = typeof housingsTable.$inferSelect;

/** The columns of a listed cartridge: its own, plus its type's and housing's names. */
const listColumns = {
  id: cartridgesTable.id,
  serial: cartridgesTable.serial,
  batch: cartridgesTable.batch,
  typeId: cartridgesTable.typeId,
  typeName: cartridgeTypesTable.name,
  typeKind: cartridgeTypesTable.kind,
  ratingUm: cartridgeTypesTable.ratingUm,
  lengthIn: cartridgesTable.lengthIn,
  status: cartridgesTable.status,
  housingId: cartridgesTable.housingId,
  housingName: housingsTable.name,
  position: cartridgesTable.position,
  receivedAt: cartridgesTable.receivedAt,
  litresFiltered: cartridgesTable.litresFiltered,
  steamCycles: cartridgesTable.steamCycles,
  hotWaterCycles: cartridgesTable.hotWaterCycles,
  chemicalCycles: cartridgesTable.chemicalCycles,
  retiredReason: cartridgesTable.retiredReason,
  notes: cartridgesTable.notes,
  createdAt: cartridgesTable.createdAt,
  updatedAt: cartridgesTable.updatedAt,
  archivedAt: cartridgesTable.archivedAt,
};

const sortColumns: Record<CartridgeSortKey, AnyColumn | SQL> = {
  serial: cartridgesTable.serial,
  batch: cartridgesTable.batch,
  type: sql`${cartridgeTypesTable.name}`,
  lengthIn: sql`${cartridgesTable.lengthIn}`,
  status: sql`${cartridgesTable.status}`,
  housing: sql`${housingsTable.name}`,
  receivedAt: sql`${cartridgesTable.receivedAt}`,
  litresFiltered: sql`${cartridgesTable.litresFiltered}`,
  createdAt: sql`${cartridgesTable.createdAt}`,
};

export const SERIAL_CONSTRAINT = 'cartridges_winery_serial_uq';

export function createCartridgesRepository(db: DbOrTx) {
  function listWhere(wineryId: string, query: CartridgeListQuery) {
    const conditions: SQL[] = [eq(cartridgesTable.wineryId, wineryId)];
    if (query.status) conditions.push(eq(cartridgesTable.status, query.status));
    if (query.typeId) conditions.push(eq(cartridgesTable.typeId, query.typeId));
    if (query.housingId) conditions.push(eq(cartridgesTable.housingId, query.housingId));
    if (query.batch) conditions.push(eq(cartridgesTable.batch, query.batch));
    if (query.lengthIn) conditions.push(eq(cartridgesTable.lengthIn, query.lengthIn));
    if (query.archived !== 'true') conditions.push(isNull(cartridgesTable.archivedAt));
    if (query.q) {
      const pattern = likePattern(query.q);
      conditions.push(or(ilike(cartridgesTable.serial, pattern), ilike(cartridgesTable.batch, pattern))!);
    }
    return and(...conditions)!;
  }

  const listPage = (where: SQL, query: CartridgeListQuery) =>
    sortedPage(
      db
        .select(listColumns)
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .leftJoin(housingsTable, eq(housingsTable.id, cartridgesTable.housingId))
        .where(where)
        .$dynamic(),
      query,
      sortColumns,
      cartridgesTable.id,
    );

  return {
    /** One page of the inventory (type and housing joined, no N+1) and the total matching. */
    async list(wineryId: string, query: CartridgeListQuery) {
      const where = listWhere(wineryId, query);
      const [items, [{ total }]] = await Promise.all([listPage(where, query), db.select({ total: count() }).from(cartridgesTable).where(where)]);
      return { items, total };
    },

    /** The list query's SQL text and parameters, for EXPLAIN in a performance check. */
    listSql(wineryId: string, query: CartridgeListQuery) {
      return listPage(listWhere(wineryId, query), query).toSQL();
    },

    async listRow(wineryId: string, id: string) {
      const [row] = await db
        .select(listColumns)
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .leftJoin(housingsTable, eq(housingsTable.id, cartridgesTable.housingId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
      return row ?? null;
    },

    /** The cartridge row, locked for the rest of the transaction when `lock` is set. */
    async byId(wineryId: string, id: string, opts: { lock?: boolean } = {}) {
      const q = db
        .select()
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
      const [row] = opts.lock ? await q.for('update') : await q;
      return row ?? null;
    },

    /** Counts per type, status and length in one grouped query. */
    async stockGroups(wineryId: string) {
      return db
        .select({
          typeId: cartridgeTypesTable.id,
          typeName: cartridgeTypesTable.name,
          kind: cartridgeTypesTable.kind,
          ratingUm: cartridgeTypesTable.ratingUm,
          status: cartridgesTable.status,
          lengthIn: cartridgesTable.lengthIn,
          count: count(cartridgesTable.id),
        })
        .from(cartridgeTypesTable)
        .leftJoin(cartridgesTable, and(eq(cartridgesTable.typeId, cartridgeTypesTable.id), eq(cartridgesTable.wineryId, wineryId)))
        .where(eq(cartridgeTypesTable.wineryId, wineryId))
        .groupBy(cartridgeTypesTable.id, cartridgeTypesTable.name, cartridgeTypesTable.kind, cartridgeTypesTable.ratingUm, cartridgesTable.status, cartridgesTable.lengthIn)
        .orderBy(asc(cartridgeTypesTable.kind), asc(cartridgeTypesTable.name));
    },

    /** History newest first, with the actor's name and the housing's name. */
    async events(wineryId: string, cartridgeId: string) {
      return db
        .select({
          id: cartridgeEventsTable.id,
          kind: cartridgeEventsTable.kind,
          at: cartridgeEventsTable.at,
          actorName: sql<string | null>`coalesce(${cartridgeEventsTable.actorName}, ${usersTable.name})`,
          housingId: cartridgeEventsTable.housingId,
          housingName: housingsTable.name,
          position: cartridgeEventsTable.position,
          details: cartridgeEventsTable.details,
        })
        .from(cartridgeEventsTable)
        .leftJoin(usersTable, eq(usersTable.id, cartridgeEventsTable.actorId))
        .leftJoin(housingsTable, eq(housingsTable.id, cartridgeEventsTable.housingId))
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.cartridgeId, cartridgeId)))
        .orderBy(desc(cartridgeEventsTable.at), desc(cartridgeEventsTable.id));
    },

    type: (wineryId: string, typeId: string) => findOwnRow(db, cartridgeTypesTable, wineryId, typeId),

    async typeNames(wineryId: string) {
      return db.select({ id: cartridgeTypesTable.id, name: cartridgeTypesTable.name }).from(cartridgeTypesTable).where(eq(cartridgeTypesTable.wineryId, wineryId));
    },

    async serialTaken(wineryId: string, serial: string) {
      const [row] = await db
        .select({ id: cartridgesTable.id })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.serial, serial)));
      return Boolean(row);
    },

    /** Which of `serials` the winery already has. */
    async existingSerials(wineryId: string, serials: string[]) {
      if (serials.length === 0) return new Set<string>();
      const found = new Set<string>();
      for (let i = 0; i < serials.length; i += 1000) {
        const rows = await db
          .select({ serial: cartridgesTable.serial })
          .from(cartridgesTable)
          .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.serial, serials.slice(i, i + 1000))));
        for (const r of rows) found.add(r.serial);
      }
      return found;
    },

    async insertMany(values: CartridgeInsert[]) {
      const rows: CartridgeRow[] = [];
      for (let i = 0; i < values.length; i += 1000) {
        rows.push(...(await db.insert(cartridgesTable).values(values.slice(i, i + 1000)).returning()));
      }
      return rows;
    },

    async insertEvents(values: CartridgeEventInsert[]) {
      for (let i = 0; i < values.length; i += 1000) {
        await db.insert(cartridgeEventsTable).values(values.slice(i, i + 1000));
      }
    },

    async update(wineryId: string, id: string, changes: Partial<CartridgeInsert>) {
      const [row] = await db
        .update(cartridgesTable)
        .set({ ...changes, updatedAt: new Date() })
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)))
        .returning();
      return row ?? null;
    },

    /** The housing row, locked (SELECT … FOR UPDATE) so concurrent installs into it run one after the other. */
    lockHousing: (wineryId: string, housingId: string) => lockedOwnRow(db, housingsTable, wineryId, housingId),

    /** Cartridges installed in one housing. */
    async installedIn(wineryId: string, housingId: string) {
      return db
        .select({ id: cartridgesTable.id, position: cartridgesTable.position })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.housingId, housingId), eq(cartridgesTable.status, 'installed')));
    },

    async housings(wineryId: string) {
      return db.select().from(housingsTable).where(eq(housingsTable.wineryId, wineryId)).orderBy(asc(housingsTable.name));
    },

    /** Every installed cartridge of the winery with its type's name (for the housing view). */
    async installed(wineryId: string) {
      return db
        .select({
          id: cartridgesTable.id,
          serial: cartridgesTable.serial,
          batch: cartridgesTable.batch,
          typeName: cartridgeTypesTable.name,
          lengthIn: cartridgesTable.lengthIn,
          status: cartridgesTable.status,
          housingId: cartridgesTable.housingId,
          position: cartridgesTable.position,
        })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), isNotNull(cartridgesTable.housingId), eq(cartridgesTable.status, 'installed')))
        .orderBy(asc(cartridgesTable.position));
    },
  };
}
export type CartridgesRepository = ReturnType<typeof createCartridgesRepository>;
export type CartridgeListRow = NonNullable<Awaited<ReturnType<CartridgesRepository['listRow']>>>;
export type CartridgeEventRow = Awaited<ReturnType<CartridgesRepository['events']>>[number];
