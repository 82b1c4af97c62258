import { asc, count, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { deleteOwnRow, findOwnRow, updateOwnRowReturning } from '../../db/list';
import { hosePresetsTable } from '../../db/schema';

export type HosePresetRow = typeof hosePresetsTable.$inferSelect;
export const HOSE_PRESET_NAME_UNIQUE = 'hose_presets_winery_name_uq';

type PresetValues = { name: string; diameterMm: number; lengthM: number; roughnessMm: number | null; sumK: number | null };

/** The winery's hose presets; every query filters by winery. */
export function createHosePresetsRepository(db: DbOrTx) {
  return {
    async list(wineryId: string) {
      return db.select().from(hosePresetsTable).where(eq(hosePresetsTable.wineryId, wineryId)).orderBy(asc(hosePresetsTable.name), asc(hosePresetsTable.id));
    },
    async count(wineryId: string) {
      const [row] = await db.select({ n: count() }).from(hosePresetsTable).where(eq(hosePresetsTable.wineryId, wineryId));
      return Number(row?.n ?? 0);
    },
    get: (wineryId: string, id: string) => findOwnRow(db, hosePresetsTable, wineryId, id),
    async insert(wineryId: string, values: PresetValues, by: { userId: string; userName: string | null }) {
      const [row] = await db
        .insert(hosePresetsTable)
        .values({ wineryId, ...values, createdBy: by.userId, createdByName: by.userName })
        .returning();
      return row;
    },
    update: (wineryId: string, id: string, changes: Partial<PresetValues>) =>
      updateOwnRowReturning(db, hosePresetsTable, wineryId, id, { ...changes, updatedAt: new Date() }),
    remove: (wineryId: string, id: string) => deleteOwnRow(db, hosePresetsTable, wineryId, id),
  };
}
