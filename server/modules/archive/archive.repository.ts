import { and, desc, eq, inArray, ne, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  lotsTable,
  planLotsTable,
  plansTable,
  runsTable,
  runStageCartridgesTable,
} from '../../db/schema';

export const archivableKinds = ['lots', 'plans', 'cartridges', 'housings', 'cartridge-types'] as const;
export type ArchivableKind = (typeof archivableKinds)[number];
export type HoldingRecord = { kind: 'run' | 'plan' | 'cartridge-history' | 'cartridge'; id: string; label: string };

const tables = {
  lots: lotsTable,
  plans: plansTable,
  cartridges: cartridgesTable,
  housings: housingsTable,
  'cartridge-types': cartridgeTypesTable,
} as const;

/** Care and use entries of a cartridge's history (registration and notes are not records of use). */
const historyKinds = ['installed', 'removed', 'retired', 'run', 'cycle', 'integrity'] as const;

export function createArchiveRepository(db: DbOrTx) {
  /** The latest run matching `where`, labelled for a person. */
  async function run(where: ReturnType<typeof and>, from: 'runs' | 'stints' = 'runs'): Promise<HoldingRecord | null> {
    const base = db
      .select({ id: runsTable.id, startedAt: runsTable.startedAt, lotCode: lotsTable.code, planName: plansTable.name })
      .from(runsTable)
      .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
      .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
      .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId));
    const q = from === 'stints' ? base.innerJoin(runStageCartridgesTable, eq(runStageCartridgesTable.runId, runsTable.id)) : base;
    const [row] = await q.where(where).orderBy(desc(runsTable.startedAt)).limit(1);
    if (!row) return null;
    return { kind: 'run', id: row.id, label: `the run of lot ${row.lotCode} (plan “${row.planName}”, started ${row.startedAt.toISOString().slice(0, 10)})` };
  }

  async function history(where: ReturnType<typeof and>): Promise<HoldingRecord | null> {
    const [row] = await db
      .select({ id: cartridgeEventsTable.id, kind: cartridgeEventsTable.kind, at: cartridgeEventsTable.at, serial: cartridgesTable.serial })
      .from(cartridgeEventsTable)
      .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
      .where(and(where, inArray(cartridgeEventsTable.kind, [...historyKinds])))
      .orderBy(desc(cartridgeEventsTable.at))
      .limit(1);
    if (!row) return null;
    return { kind: 'cartridge-history', id: row.id, label: `the history of cartridge ${row.serial} (${row.kind}, ${row.at.toISOString().slice(0, 10)})` };
  }

  return {
    /** The record that holds this row, or null when nothing does. */
    async holder(kind: ArchivableKind | 'plan-lots', wineryId: string, id: string): Promise<HoldingRecord | null> {
      switch (kind) {
        case 'lots': {
          const r = await run(and(eq(runsTable.wineryId, wineryId), eq(planLotsTable.lotId, id)));
          if (r) return r;
          const [p] = await db
            .select({ id: plansTable.id, name: plansTable.name, status: plansTable.status })
            .from(planLotsTable)
            .innerJoin(plansTable, eq(plansTable.id, planLotsTable.planId))
            .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.lotId, id), ne(plansTable.status, 'draft')))
            .limit(1);
          return p ? { kind: 'plan', id: p.id, label: `the ${p.status} plan “${p.name}”` } : null;
        }
        case 'plans':
          return run(and(eq(runsTable.wineryId, wineryId), eq(runsTable.planId, id)));
        case 'plan-lots':
          return run(and(eq(runsTable.wineryId, wineryId), eq(runsTable.planLotId, id)));
        case 'cartridges':
          return (
            (await run(and(eq(runsTable.wineryId, wineryId), eq(runStageCartridgesTable.cartridgeId, id)), 'stints')) ??
            (await history(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.cartridgeId, id))))
          );
        case 'housings':
          return (
            (await run(and(eq(runsTable.wineryId, wineryId), eq(runStageCartridgesTable.housingId, id)), 'stints')) ??
            (await history(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.housingId, id))))
          );
        case 'cartridge-types': {
          const r = await run(and(eq(runsTable.wineryId, wineryId), eq(runStageCartridgesTable.typeId, id)), 'stints');
          if (r) return r;
          const [c] = await db
            .select({ id: cartridgesTable.id, serial: cartridgesTable.serial })
            .from(cartridgesTable)
            .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.typeId, id)))
            .limit(1);
          return c ? { kind: 'cartridge', id: c.id, label: `cartridge ${c.serial}` } : null;
        }
      }
    },

    /** Sets or clears archived_at; false when the row is not this winery's. */
    async setArchived(kind: ArchivableKind, wineryId: string, id: string, at: Date | null) {
      const t = tables[kind];
      const rows = await db
        .update(t)
        .set({ archivedAt: at, updatedAt: new Date() })
        .where(and(eq(t.wineryId, wineryId), eq(t.id, id)))
        .returning({ id: t.id });
      return rows.length > 0;
    },

    /** Deletes a cartridge's own registration and note entries, so a cartridge registered by mistake can go. */
    async deleteBareCartridge(wineryId: string, id: string) {
      await db
        .delete(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.cartridgeId, id), sql`${cartridgeEventsTable.kind} in ('registered', 'note')`));
      const rows = await db
        .delete(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)))
        .returning({ id: cartridgesTable.id });
      return rows.length > 0;
    },
  };
}

export type ArchiveRepository = ReturnType<typeof createArchiveRepository>;
