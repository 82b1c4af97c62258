import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, usersTable } from '../../db/schema';

export type CareCartridgeRow = typeof cartridgesTable.$inferSelect;
export type CareTypeRow = typeof cartridgeTypesTable.$inferSelect;
export type CareHousingRow = typeof housingsTable.$inferSelect;
type EventInsert = typeof cartridgeEventsTable.$inferInsert;

const CARE_KINDS = ['cycle', 'integrity'] as const;

/** Columns of a care event as listed: the event, its cartridge's serial and type, who and where. */
const careEventColumns = {
  id: cartridgeEventsTable.id,
  kind: cartridgeEventsTable.kind,
  at: cartridgeEventsTable.at,
  details: cartridgeEventsTable.details,
  cartridgeId: cartridgeEventsTable.cartridgeId,
  serial: cartridgesTable.serial,
  typeName: cartridgeTypesTable.name,
  actorName: usersTable.name,
  housingName: housingsTable.name,
};

export type CareEventRow = {
  id: string;
  kind: string;
  at: Date;
  details: Record<string, unknown>;
  cartridgeId: string;
  serial: string;
  typeName: string;
  actorName: string | null;
  housingName: string | null;
};

export function createCareRepository(db: DbOrTx) {
  function eventsQuery() {
    return db
      .select(careEventColumns)
      .from(cartridgeEventsTable)
      .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
      .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
      .leftJoin(usersTable, eq(usersTable.id, cartridgeEventsTable.actorId))
      .leftJoin(housingsTable, eq(housingsTable.id, cartridgeEventsTable.housingId));
  }

  return {
    /** The cartridge of this winery with its type and (when installed) its housing; locked when `lock` is set. */
    async target(wineryId: string, id: string, opts: { lock?: boolean } = {}) {
      const q = db
        .select({ cartridge: cartridgesTable, type: cartridgeTypesTable, housing: housingsTable })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .leftJoin(housingsTable, and(eq(housingsTable.id, cartridgesTable.housingId), eq(housingsTable.wineryId, wineryId)))
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
      const [row] = opts.lock ? await q.for('update', { of: cartridgesTable }) : await q;
      return row ?? null;
    },

    /** Lengths (inches) of the cartridges installed in a housing: a housing test covers them all. */
    async installedLengths(wineryId: string, housingId: string) {
      const rows = await db
        .select({ lengthIn: cartridgesTable.lengthIn })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.housingId, housingId), eq(cartridgesTable.status, 'installed')));
      return rows.map((r) => r.lengthIn);
    },

    /** The as-new flow (registered event) and the water flows logged after cycles, oldest first. */
    async flowHistory(wineryId: string, cartridgeId: string) {
      return db
        .select({ kind: cartridgeEventsTable.kind, details: cartridgeEventsTable.details, at: cartridgeEventsTable.at })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.cartridgeId, cartridgeId), inArray(cartridgeEventsTable.kind, ['registered', 'cycle'])))
        .orderBy(cartridgeEventsTable.at, cartridgeEventsTable.id);
    },

    async insertEvent(values: EventInsert) {
      const [row] = await db.insert(cartridgeEventsTable).values(values).returning({ id: cartridgeEventsTable.id });
      return row.id;
    },

    /** Adds one to the cartridge's counter for this cycle kind (backflush has none). */
    async bumpCounter(wineryId: string, id: string, counter: 'steamCycles' | 'hotWaterCycles' | 'chemicalCycles') {
      const column = cartridgesTable[counter];
      await db
        .update(cartridgesTable)
        .set({ [counter]: sql`${column} + 1`, updatedAt: new Date() })
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
    },

    async counters(wineryId: string, id: string) {
      const [row] = await db
        .select({ steamCycles: cartridgesTable.steamCycles, hotWaterCycles: cartridgesTable.hotWaterCycles, chemicalCycles: cartridgesTable.chemicalCycles })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
      return row ?? null;
    },

    async event(wineryId: string, id: string): Promise<CareEventRow | null> {
      const [row] = await eventsQuery().where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.id, id)));
      return row ?? null;
    },

    /** The winery's latest care events (cycles and tests), newest first, in one query. */
    async recent(wineryId: string, limit: number): Promise<CareEventRow[]> {
      return eventsQuery()
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), inArray(cartridgeEventsTable.kind, [...CARE_KINDS])))
        .orderBy(desc(cartridgeEventsTable.at), desc(cartridgeEventsTable.id))
        .limit(limit);
    },
  };
}

export type CareRepository = ReturnType<typeof createCareRepository>;
