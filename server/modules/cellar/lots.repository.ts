import { and, count, desc, eq, ilike, inArray, isNull, or, sql } from 'drizzle-orm';
import type { LotSortKey, LotsListQuery } from '../../../shared/schemas/cellar';
import type { WineStyle } from '../../../shared/engine';
import type { DbOrTx } from '../../db/client';
import { attachmentsTable, labResultsTable, lotsTable, planLotsTable, plansTable, tanksTable } from '../../db/schema';

import { deleteOwnRow, likePattern, ownRow, ownRowExists, sortedPage, updateOwnRow } from '../../db/list';

/** A lot's tank, and only within the same winery (a second guard beside the write-time check). */
const sameWineryTank = and(eq(tanksTable.id, lotsTable.tankId), eq(tanksTable.wineryId, lotsTable.wineryId));

export const LOT_CODE_UNIQUE = 'lots_winery_code_uq';

export type LotValues = {
  code: string;
  name: string;
  style: WineStyle;
  vintage: number | null;
  volumeL: number;
  tankId: string | null;
  ethanolPctVol: number;
  sugarGPerL: number;
  tempC: number;
  notes: string;
};

export type LotRow = typeof lotsTable.$inferSelect & { tankName: string | null };

export function createLotsRepository(db: DbOrTx) {
  const lotColumns = {
    id: lotsTable.id,
    wineryId: lotsTable.wineryId,
    code: lotsTable.code,
    name: lotsTable.name,
    style: lotsTable.style,
    vintage: lotsTable.vintage,
    volumeL: lotsTable.volumeL,
    tankId: lotsTable.tankId,
    ethanolPctVol: lotsTable.ethanolPctVol,
    sugarGPerL: lotsTable.sugarGPerL,
    tempC: lotsTable.tempC,
    notes: lotsTable.notes,
    createdAt: lotsTable.createdAt,
    updatedAt: lotsTable.updatedAt,
    archivedAt: lotsTable.archivedAt,
    tankName: tanksTable.name,
  };

  function listWhere(wineryId: string, query: LotsListQuery) {
    const q = query.q ? likePattern(query.q) : null;
    return and(
      eq(lotsTable.wineryId, wineryId),
      q ? or(ilike(lotsTable.code, q), ilike(lotsTable.name, q), ilike(tanksTable.name, q)) : undefined,
      query.style ? eq(lotsTable.style, query.style) : undefined,
      query.tankId ? eq(lotsTable.tankId, query.tankId) : undefined,
      query.archived === 'true' ? undefined : isNull(lotsTable.archivedAt),
    );
  }

  return {
    /**
     * One page of lots with their tank and latest lab result (one DISTINCT ON subquery joined
     * once, so no query per row), and the count of all matching lots.
     */
    async list(wineryId: string, query: LotsListQuery) {
      const latest = db
        .selectDistinctOn([labResultsTable.lotId], {
          lotId: labResultsTable.lotId,
          sampledAt: labResultsTable.sampledAt,
          turbidityNtu: labResultsTable.turbidityNtu,
          t200s: labResultsTable.t200s,
          t400s: labResultsTable.t400s,
          discDiameterMm: labResultsTable.discDiameterMm,
          discPoints: labResultsTable.discPoints,
        })
        .from(labResultsTable)
        .where(eq(labResultsTable.wineryId, wineryId))
        .orderBy(labResultsTable.lotId, desc(labResultsTable.sampledAt), desc(labResultsTable.createdAt))
        .as('latest');
      const sortColumns: Record<LotSortKey, any> = {
        code: lotsTable.code,
        name: lotsTable.name,
        style: lotsTable.style,
        vintage: lotsTable.vintage,
        volumeL: lotsTable.volumeL,
        tank: tanksTable.name,
        sampledAt: latest.sampledAt,
        turbidityNtu: latest.turbidityNtu,
      };
      const where = listWhere(wineryId, query);
      const [rows, [{ total }]] = await Promise.all([
        sortedPage(
          db
            .select({
              ...lotColumns,
              latestSampledAt: latest.sampledAt,
              latestTurbidityNtu: latest.turbidityNtu,
              latestT200s: latest.t200s,
              latestT400s: latest.t400s,
              latestDiscDiameterMm: latest.discDiameterMm,
              latestDiscPoints: latest.discPoints,
            })
            .from(lotsTable)
            .leftJoin(tanksTable, sameWineryTank)
            .leftJoin(latest, eq(latest.lotId, lotsTable.id))
            .where(where)
            .$dynamic(),
          query,
          sortColumns,
          lotsTable.id,
        ),
        db
          .select({ total: count() })
          .from(lotsTable)
          .leftJoin(tanksTable, sameWineryTank)
          .where(where),
      ]);
      return { rows, total };
    },
    async find(wineryId: string, id: string): Promise<(LotRow & { labResultCount: number }) | null> {
      const [row] = await db
        .select({
          ...lotColumns,
          labResultCount: sql<number>`(select cast(count(*) as int) from ${labResultsTable} where ${labResultsTable.lotId} = ${lotsTable.id} and ${labResultsTable.wineryId} = ${lotsTable.wineryId})`,
        })
        .from(lotsTable)
        .leftJoin(tanksTable, sameWineryTank)
        .where(ownRow(lotsTable, wineryId, id));
      return row ?? null;
    },
    exists: (wineryId: string, id: string) => ownRowExists(db, lotsTable, wineryId, id),
    async insert(wineryId: string, values: LotValues) {
      const [row] = await db.insert(lotsTable).values({ wineryId, ...values }).returning({ id: lotsTable.id });
      return row.id;
    },
    update: (wineryId: string, id: string, values: LotValues, now: Date) => updateOwnRow(db, lotsTable, wineryId, id, { ...values, updatedAt: now }),
    /** Files attached to the lot or to any of its lab results. */
    async attachmentCount(wineryId: string, id: string) {
      const resultIds = db.select({ id: labResultsTable.id }).from(labResultsTable).where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, id)));
      const [{ n }] = await db
        .select({ n: count() })
        .from(attachmentsTable)
        .where(
          and(
            eq(attachmentsTable.wineryId, wineryId),
            or(
              and(eq(attachmentsTable.ownerKind, 'lot'), eq(attachmentsTable.ownerId, id)),
              and(eq(attachmentsTable.ownerKind, 'lab-result'), inArray(attachmentsTable.ownerId, resultIds)),
            ),
          ),
        );
      return n;
    },
    /**
     * Deletes a lot that no record holds, with its lab results and its places in draft plans
     * (records restrict these deletes, so they go explicitly, in the caller's transaction).
     */
    async delete(wineryId: string, id: string) {
      const drafts = db
        .select({ id: plansTable.id })
        .from(plansTable)
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.status, 'draft')));
      await db.delete(planLotsTable).where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.lotId, id), inArray(planLotsTable.planId, drafts)));
      await db.delete(labResultsTable).where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, id)));
      return deleteOwnRow(db, lotsTable, wineryId, id);
    },
  };
}
export type LotsRepository = ReturnType<typeof createLotsRepository>;
