import { and, count, eq, ilike, isNull, or, sql, type SQL, max } from 'drizzle-orm';
import type { HousingSortKey, LineSortKey, CartridgeTypeSortKey } from '../../../shared/schemas/equipment';
import type { ListQuery } from '../../../shared/schemas/list';
import type { DbOrTx } from '../../db/client';
import { attachmentsTable, cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, linesTable } from '../../db/schema';
import { deleteOwnRow, findOwnRow, likePattern, lockOwnRow, ownRowExists, sortedPage, updateOwnRow, updateOwnRowReturning } from '../../db/list';

export type HousingRow = typeof housingsTable.$inferSelect;
export type LineRow = typeof linesTable.$inferSelect;
export type CartridgeTypeRow = typeof cartridgeTypesTable.$inferSelect;
export type HousingInsert = Omit<typeof housingsTable.$inferInsert, 'id' | 'createdAt' | 'updatedAt'>;
export type LineInsert = Omit<typeof linesTable.$inferInsert, 'id' | 'createdAt' | 'updatedAt'>;
export type CartridgeTypeInsert = Omit<typeof cartridgeTypesTable.$inferInsert, 'id' | 'createdAt' | 'updatedAt'>;
export type TypeCounts = { total: number; inStock: number; installed: number; regenerating: number; retired: number };

const emptyCounts: TypeCounts = { total: 0, inStock: 0, installed: 0, regenerating: 0, retired: 0 };

export function createEquipmentRepository(db: DbOrTx) {
  /** Installed cartridges per housing of the winery, as a grouped subquery joined to the housings. */
  const installedPerHousing = (wineryId: string) =>
    db
      .select({ housingId: cartridgesTable.housingId, n: count().as('installed_n') })
      .from(cartridgesTable)
      .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.status, 'installed')))
      .groupBy(cartridgesTable.housingId)
      .as('installed_per_housing');

  /** Cartridges per type of the winery, by status, as a grouped subquery. */
  const countsPerType = (wineryId: string) =>
    db
      .select({
        typeId: cartridgesTable.typeId,
        total: count().as('c_total'),
        inStock: sql<number>`count(*) filter (where ${cartridgesTable.status} = 'in-stock')`.as('c_in_stock'),
        installed: sql<number>`count(*) filter (where ${cartridgesTable.status} = 'installed')`.as('c_installed'),
        regenerating: sql<number>`count(*) filter (where ${cartridgesTable.status} = 'regenerating')`.as('c_regenerating'),
        retired: sql<number>`count(*) filter (where ${cartridgesTable.status} = 'retired')`.as('c_retired'),
      })
      .from(cartridgesTable)
      .where(eq(cartridgesTable.wineryId, wineryId))
      .groupBy(cartridgesTable.typeId)
      .as('counts_per_type');

  function housingsWithCounts(wineryId: string, where: SQL | undefined, query?: ListQuery<HousingSortKey>) {
    const installed = installedPerHousing(wineryId);
    const installedCount = sql<number>`coalesce(${installed.n}, 0)`.mapWith(Number);
    const base = db
      .select({ housing: housingsTable, installedCount })
      .from(housingsTable)
      .leftJoin(installed, eq(installed.housingId, housingsTable.id))
      .where(and(eq(housingsTable.wineryId, wineryId), where))
      .$dynamic();
    if (!query) return base;
    return sortedPage(
      base,
      query,
      {
        name: housingsTable.name,
        rounds: housingsTable.rounds,
        lengthIn: housingsTable.lengthIn,
        maxPressureBar: housingsTable.maxPressureBar,
        maxTempC: housingsTable.maxTempC,
        holdUpL: housingsTable.holdUpL,
        installedCount,
        createdAt: housingsTable.createdAt,
      },
      housingsTable.id,
    );
  }

  function typesWithCounts(wineryId: string, where: SQL | undefined, query?: ListQuery<CartridgeTypeSortKey>) {
    const c = countsPerType(wineryId);
    const n = (col: SQL.Aliased<number>) => sql<number>`coalesce(${col}, 0)`.mapWith(Number);
    const cartridgeCount = n(c.total);
    const base = db
      .select({
        type: cartridgeTypesTable,
        total: cartridgeCount,
        inStock: n(c.inStock),
        installed: n(c.installed),
        regenerating: n(c.regenerating),
        retired: n(c.retired),
      })
      .from(cartridgeTypesTable)
      .leftJoin(c, eq(c.typeId, cartridgeTypesTable.id))
      .where(and(eq(cartridgeTypesTable.wineryId, wineryId), where))
      .$dynamic();
    if (!query) return base;
    return sortedPage(
      base,
      query,
      {
        name: cartridgeTypesTable.name,
        kind: cartridgeTypesTable.kind,
        media: cartridgeTypesTable.media,
        ratingUm: cartridgeTypesTable.ratingUm,
        areaM2Per10in: cartridgeTypesTable.areaM2Per10in,
        maxTempC: cartridgeTypesTable.maxTempC,
        pricePer10in: cartridgeTypesTable.pricePer10in,
        cartridgeCount,
        createdAt: cartridgeTypesTable.createdAt,
      },
      cartridgeTypesTable.id,
    );
  }

  const splitCounts = (r: { total: number; inStock: number; installed: number; regenerating: number; retired: number }): TypeCounts => ({
    ...emptyCounts,
    total: r.total,
    inStock: r.inStock,
    installed: r.installed,
    regenerating: r.regenerating,
    retired: r.retired,
  });

  return {
    // ---- housings -------------------------------------------------------------------
    async listHousings(wineryId: string, query: ListQuery<HousingSortKey>) {
      const where = and(
        query.q ? or(ilike(housingsTable.name, likePattern(query.q)), ilike(housingsTable.notes, likePattern(query.q))) : undefined,
        query.archived === 'true' ? undefined : isNull(housingsTable.archivedAt),
      );
      const [rows, [{ total }]] = await Promise.all([
        housingsWithCounts(wineryId, where, query),
        db
          .select({ total: count() })
          .from(housingsTable)
          .where(and(eq(housingsTable.wineryId, wineryId), where)),
      ]);
      return { rows, total };
    },
    async housing(wineryId: string, id: string) {
      const [row] = await housingsWithCounts(wineryId, eq(housingsTable.id, id));
      return row ?? null;
    },
    async insertHousing(values: HousingInsert) {
      const [row] = await db.insert(housingsTable).values(values).returning({ id: housingsTable.id });
      return row.id;
    },
    updateHousing: (wineryId: string, id: string, changes: Partial<HousingInsert>) =>
      updateOwnRow(db, housingsTable, wineryId, id, { ...changes, updatedAt: new Date() }),
    deleteHousing: (wineryId: string, id: string) => deleteOwnRow(db, housingsTable, wineryId, id),
    /** Locks the housing row so a concurrent install cannot slip in between the check and the delete. */
    lockHousing: (wineryId: string, id: string) => lockOwnRow(db, housingsTable, wineryId, id),
    /** The highest round holding a cartridge (0 when empty). */
    async highestUsedRound(wineryId: string, housingId: string) {
      const [row] = await db
        .select({ n: max(cartridgesTable.position) })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.housingId, housingId)));
      return row?.n ?? 0;
    },
    async cartridgesInHousing(wineryId: string, housingId: string) {
      const [row] = await db
        .select({ n: count() })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.housingId, housingId)));
      return row.n;
    },
    async historyEventsForHousing(wineryId: string, housingId: string) {
      const [row] = await db
        .select({ n: count() })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.housingId, housingId)));
      return row.n;
    },

    // ---- lines ----------------------------------------------------------------------
    async listLines(wineryId: string, query: ListQuery<LineSortKey>) {
      const where = and(
        eq(linesTable.wineryId, wineryId),
        query.q ? or(ilike(linesTable.name, likePattern(query.q)), ilike(linesTable.notes, likePattern(query.q))) : undefined,
      );
      const [rows, [{ total }]] = await Promise.all([
        sortedPage(
          db.select().from(linesTable).where(where).$dynamic(),
          query,
          { name: linesTable.name, bottlesPerHour: linesTable.bottlesPerHour, bottleMl: linesTable.bottleMl, createdAt: linesTable.createdAt },
          linesTable.id,
        ),
        db.select({ total: count() }).from(linesTable).where(where),
      ]);
      return { rows, total };
    },
    line: (wineryId: string, id: string) => findOwnRow(db, linesTable, wineryId, id),
    async insertLine(values: LineInsert) {
      const [row] = await db.insert(linesTable).values(values).returning();
      return row;
    },
    updateLine: (wineryId: string, id: string, changes: Partial<LineInsert>) =>
      updateOwnRowReturning(db, linesTable, wineryId, id, { ...changes, updatedAt: new Date() }),
    deleteLine: (wineryId: string, id: string) => deleteOwnRow(db, linesTable, wineryId, id),

    // ---- cartridge types ------------------------------------------------------------
    async listCartridgeTypes(wineryId: string, query: ListQuery<CartridgeTypeSortKey> & { kind?: 'prefilter' | 'membrane' }) {
      const where = and(
        query.q
          ? or(
              ilike(cartridgeTypesTable.name, likePattern(query.q)),
              ilike(cartridgeTypesTable.media, likePattern(query.q)),
              ilike(cartridgeTypesTable.notes, likePattern(query.q)),
            )
          : undefined,
        query.kind ? eq(cartridgeTypesTable.kind, query.kind) : undefined,
        query.archived === 'true' ? undefined : isNull(cartridgeTypesTable.archivedAt),
      );
      const [rows, [{ total }]] = await Promise.all([
        typesWithCounts(wineryId, where, query),
        db
          .select({ total: count() })
          .from(cartridgeTypesTable)
          .where(and(eq(cartridgeTypesTable.wineryId, wineryId), where)),
      ]);
      return { rows: rows.map((r) => ({ type: r.type, counts: splitCounts(r) })), total };
    },
    async cartridgeType(wineryId: string, id: string) {
      const [row] = await typesWithCounts(wineryId, eq(cartridgeTypesTable.id, id));
      return row ? { type: row.type, counts: splitCounts(row) } : null;
    },
    async insertCartridgeType(values: CartridgeTypeInsert) {
      const [row] = await db.insert(cartridgeTypesTable).values(values).returning({ id: cartridgeTypesTable.id });
      return row.id;
    },
    updateCartridgeType: (wineryId: string, id: string, changes: Partial<CartridgeTypeInsert>) =>
      updateOwnRow(db, cartridgeTypesTable, wineryId, id, { ...changes, updatedAt: new Date() }),
    lockCartridgeType: (wineryId: string, id: string) => lockOwnRow(db, cartridgeTypesTable, wineryId, id),
    async cartridgesOfType(wineryId: string, typeId: string) {
      const [row] = await db
        .select({ n: count() })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.typeId, typeId)));
      return row.n;
    },
    deleteCartridgeType: (wineryId: string, id: string) => deleteOwnRow(db, cartridgeTypesTable, wineryId, id),
    /** Whether an attachment of this winery exists (a certificate must be the winery's own file). */
    attachmentExists: (wineryId: string, id: string) => ownRowExists(db, attachmentsTable, wineryId, id),
  };
}

export type EquipmentRepository = ReturnType<typeof createEquipmentRepository>;
