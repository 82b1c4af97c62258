// Demo data for Quillwater Estate's plans: one draft bottling day next week on the winery's
// line, with a ready white and a borderline one, each with a prefilter + membrane train, and a
// second train option to compare for the borderline lot. The chosen trains use the types that
// are installed in the housings, so the plan can be approved and started as it is.
// Invented figures; demo data.
import { and, asc, count, eq, inArray } from 'drizzle-orm';
import type { DbOrTx } from '../client';
import { cartridgesTable, cartridgeTypesTable, housingsTable, linesTable, lotsTable, planLotsTable, plansTable, planTrainsTable } from '../schema';

import { seedHosePresets } from './hose-presets';

const DAY_MS = 86_400_000;

/** Demo data for the plans of a winery (idempotent: does nothing when the winery already has a plan). */
export async function seedPlans(tx: DbOrTx, ctx: { wineryId: string; actorId: string }, now = new Date()) {
  await seedHosePresets(tx, ctx);
  const [{ n }] = await tx.select({ n: count() }).from(plansTable).where(eq(plansTable.wineryId, ctx.wineryId));
  if (n > 0) return;
  const [line] = await tx.select().from(linesTable).where(eq(linesTable.wineryId, ctx.wineryId)).orderBy(asc(linesTable.name)).limit(1);
  const lots = await tx
    .select()
    .from(lotsTable)
    .where(and(eq(lotsTable.wineryId, ctx.wineryId), inArray(lotsTable.code, ['QW-24-SB01', 'QW-24-CH02'])));
  const types = await tx.select().from(cartridgeTypesTable).where(eq(cartridgeTypesTable.wineryId, ctx.wineryId));
  const housings = await tx.select().from(housingsTable).where(eq(housingsTable.wineryId, ctx.wineryId));
  const ready = lots.find((l) => l.code === 'QW-24-SB01');
  const borderline = lots.find((l) => l.code === 'QW-24-CH02');
  const type = (name: string) => types.find((t) => t.name === name);
  const housing = (name: string) => housings.find((h) => h.name === name);
  const gf = type('Glass fibre 0.8 µm');
  const pes045 = type('PES membrane 0.45 µm');
  const pre = housing('Prefilter housing A');
  const mem = housing('Membrane housing B');
  if (!line || !ready || !borderline || !gf || !pes045 || !pre || !mem) return;
  // The type installed in a housing (the cartridge seed fills each housing with one type), so
  // the chosen trains match what is physically there; the planned one when the housing is empty.
  const installed = await tx
    .select({ housingId: cartridgesTable.housingId, typeId: cartridgesTable.typeId })
    .from(cartridgesTable)
    .where(and(eq(cartridgesTable.wineryId, ctx.wineryId), eq(cartridgesTable.status, 'installed'), inArray(cartridgesTable.housingId, [pre.id, mem.id])));
  const installedType = (housingId: string, fallback: string) => {
    const ids = [...new Set(installed.filter((c) => c.housingId === housingId).map((c) => c.typeId))];
    return ids.length === 1 ? ids[0] : fallback;
  };
  const preType = installedType(pre.id, gf.id);
  const memType = installedType(mem.id, pes045.id);

  // Next week, same weekday.
  const plannedDate = new Date(now.getTime() + 7 * DAY_MS).toISOString().slice(0, 10);
  const [plan] = await tx
    .insert(plansTable)
    .values({
      wineryId: ctx.wineryId,
      name: 'Whites bottling, week ahead',
      plannedDate,
      lineId: line.id,
      status: 'draft',
      startTime: '07:00',
      sanitationKind: 'hot-water',
      notes: 'Sauvignon first, then the Chardonnay. Check the Chardonnay prefilter before committing.',
      createdBy: ctx.actorId,
    })
    .returning({ id: plansTable.id });

  const [readyLot, borderlineLot] = await tx
    .insert(planLotsTable)
    .values([
      { wineryId: ctx.wineryId, planId: plan.id, lotId: ready.id, position: 1, volumeL: ready.volumeL },
      { wineryId: ctx.wineryId, planId: plan.id, lotId: borderline.id, position: 2, volumeL: borderline.volumeL },
    ])
    .returning({ id: planLotsTable.id });

  const trains = await tx
    .insert(planTrainsTable)
    .values([
      {
        wineryId: ctx.wineryId,
        planLotId: readyLot.id,
        name: 'Option A',
        stages: [
          { name: 'Prefilter', cartridgeTypeId: preType, housingId: pre.id, housingCount: 1, capacityLPerM2: 4000 },
          { name: 'Membrane', cartridgeTypeId: memType, housingId: mem.id, housingCount: 1, capacityLPerM2: 3000 },
        ],
      },
      {
        wineryId: ctx.wineryId,
        planLotId: borderlineLot.id,
        name: 'Option A',
        stages: [
          { name: 'Prefilter', cartridgeTypeId: preType, housingId: pre.id, housingCount: 1, capacityLPerM2: 600 },
          { name: 'Membrane', cartridgeTypeId: memType, housingId: mem.id, housingCount: 1, capacityLPerM2: 1200 },
        ],
      },
      {
        wineryId: ctx.wineryId,
        planLotId: borderlineLot.id,
        name: 'Option B',
        stages: [
          { name: 'Prefilter', cartridgeTypeId: preType, housingId: pre.id, housingCount: 1, capacityLPerM2: 2500 },
          { name: 'Membrane', cartridgeTypeId: memType, housingId: mem.id, housingCount: 2, capacityLPerM2: 2000 },
        ],
      },
    ])
    .returning({ id: planTrainsTable.id });
  await tx.update(planLotsTable).set({ chosenTrainId: trains[0].id }).where(eq(planLotsTable.id, readyLot.id));
  await tx.update(planLotsTable).set({ chosenTrainId: trains[1].id }).where(eq(planLotsTable.id, borderlineLot.id));
}
