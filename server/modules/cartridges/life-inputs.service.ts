import type { Database } from '../../db/client';
import { createLifeInputsRepository, type LifeCartridgeRow, type LifeEventTuple, type LifeHousingRow, type LifeTypeRow } from './life-inputs.repository';

/** One stored event as the life forecast reads it, with the housing the cartridge was in. */
export type LifeEvent = { kind: LifeEventTuple[0]; at: Date; details: Record<string, unknown>; housingId: string | null };

/** One cartridge's life inputs: the cartridge, its housing's name, its type's ratings and its events. */
export type LifeInput = { cartridge: LifeCartridgeRow['cartridge']; housingName: string | null; type: LifeTypeRow; history: LifeEvent[] };

/**
 * The life inputs of every cartridge worth forecasting in a winery, for the pages and rules that
 * judge many cartridges at once (Today, the alert rules). Cartridges whose type is gone are left out.
 */
export function createLifeInputsService(db: Database) {
  const repo = createLifeInputsRepository(db);
  return {
    /** The ratings the life forecast reads, and the name shown, of every cartridge type of the winery (Today's stored life checks read them too). */
    lifeTypes: (wineryId: string): Promise<LifeTypeRow[]> => repo.lifeTypes(wineryId),

    async lifeInputs(wineryId: string, opts: { housings?: boolean } = {}): Promise<{ items: LifeInput[]; housings: Map<string, LifeHousingRow> }> {
      const [types, rows, housings] = await Promise.all([
        repo.lifeTypes(wineryId),
        repo.cartridgesInUse(wineryId),
        opts.housings ? repo.housingRatings(wineryId) : Promise.resolve([] as LifeHousingRow[]),
      ]);
      const typeById = new Map(types.map((t) => [t.id, t]));
      const items: LifeInput[] = [];
      for (const row of rows) {
        const type = typeById.get(row.cartridge.typeId);
        if (!type) continue;
        const history = (row.events ?? []).map(([kind, atMs, details, housingId]) => ({ kind, at: new Date(atMs), details: details ?? {}, housingId: housingId ?? null }));
        items.push({ cartridge: row.cartridge, housingName: row.housingName, type, history });
      }
      return { items, housings: new Map(housings.map((h) => [h.id, h])) };
    },
  };
}
export type LifeInputsService = ReturnType<typeof createLifeInputsService>;
