// Demo data for Quillwater Estate's equipment: housings, one bottling line and a small
// cartridge catalogue. The specifications are invented but plausible; they are demo data,
// not any maker's published figures. The prefilters are rated to 90 °C so the demo's hot-water
// sanitation (82 °C in plans, 85 °C in the care history) is within their rating.
import { and, count, eq, isNull } from 'drizzle-orm';
import type { DbOrTx } from '../client';
import { cartridgeTypesTable, housingsTable, linesTable } from '../schema';

/** Fixed ids, so other demo data (cartridges, plans) can point at these records. */
export const demoEquipmentIds = {
  prefilterHousing: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e01',
  membraneHousing: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e02',
  waterFilterHousing: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e03',
  line: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e11',
  pp5: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e21',
  pp1: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e22',
  glassFibre08: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e23',
  pes065: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e24',
  pes045: '3c2f7a10-4b6e-4d1a-9e55-0a1b2c3d4e25',
} as const;

type HousingSeed = Omit<typeof housingsTable.$inferInsert, 'wineryId'>;
type CartridgeTypeSeed = Omit<typeof cartridgeTypesTable.$inferInsert, 'wineryId'>;

const housings: HousingSeed[] = [
  {
    id: demoEquipmentIds.prefilterHousing,
    name: 'Prefilter housing A',
    rounds: 3,
    lengthIn: 30,
    maxPressureBar: 8,
    maxTempC: 140,
    holdUpL: 16,
    upstreamGasVolumeL: null,
    notes: 'Stainless, three rounds. First stage of the bottling train.',
  },
  {
    id: demoEquipmentIds.membraneHousing,
    name: 'Membrane housing B',
    rounds: 3,
    lengthIn: 30,
    maxPressureBar: 10,
    maxTempC: 140,
    holdUpL: 16,
    upstreamGasVolumeL: 12.5,
    notes: 'Final stage before the filler. Steamed before each bottling day.',
  },
  {
    id: demoEquipmentIds.waterFilterHousing,
    name: 'Water filter',
    rounds: 1,
    lengthIn: 10,
    maxPressureBar: 6,
    maxTempC: 80,
    holdUpL: 1.2,
    upstreamGasVolumeL: null,
    notes: 'Filters the rinse and sanitation water.',
  },
];

const cartridgeTypes: CartridgeTypeSeed[] = [
  {
    id: demoEquipmentIds.pp5,
    name: 'Depth PP 5 µm',
    kind: 'prefilter',
    media: 'polypropylene',
    ratingUm: 5,
    areaM2Per10in: 0.45,
    waterFlowLhPer10in: 1500,
    waterDpBar: 0.1,
    maxDpForwardBar: 5,
    maxDpReverseBar: 2,
    maxTempC: 90,
    terminalDpBar: 1.5,
    designFluxLhPer10in: 600,
    nominalCapacityLPerM2: 3000,
    ratedSteamCycles: 20,
    ratedHotWaterCycles: 50,
    ratedChemicalCycles: 30,
    flowRecoveryMinPct: 70,
    pricePer10in: 14,
    currency: 'EUR',
    notes: 'Coarse prefilter for reds and lightly fined whites.',
  },
  {
    id: demoEquipmentIds.pp1,
    name: 'Depth PP 1 µm',
    kind: 'prefilter',
    media: 'polypropylene',
    ratingUm: 1,
    areaM2Per10in: 0.45,
    waterFlowLhPer10in: 900,
    waterDpBar: 0.15,
    maxDpForwardBar: 5,
    maxDpReverseBar: 2,
    maxTempC: 90,
    terminalDpBar: 1.5,
    designFluxLhPer10in: 500,
    nominalCapacityLPerM2: 2000,
    ratedSteamCycles: 20,
    ratedHotWaterCycles: 50,
    ratedChemicalCycles: 30,
    flowRecoveryMinPct: 70,
    pricePer10in: 16,
    currency: 'EUR',
    notes: '',
  },
  {
    id: demoEquipmentIds.glassFibre08,
    name: 'Glass fibre 0.8 µm',
    kind: 'prefilter',
    media: 'glass fibre',
    ratingUm: 0.8,
    areaM2Per10in: 0.7,
    waterFlowLhPer10in: 1000,
    waterDpBar: 0.2,
    maxDpForwardBar: 5,
    maxDpReverseBar: null,
    maxTempC: 90,
    terminalDpBar: 1.2,
    designFluxLhPer10in: 400,
    nominalCapacityLPerM2: 1500,
    ratedSteamCycles: 30,
    ratedHotWaterCycles: 30,
    ratedChemicalCycles: 10,
    flowRecoveryMinPct: 70,
    pricePer10in: 28,
    currency: 'EUR',
    notes: 'Pleated; protects the membrane. Not backwashable.',
  },
  {
    id: demoEquipmentIds.pes065,
    name: 'PES membrane 0.65 µm',
    kind: 'membrane',
    media: 'PES',
    ratingUm: 0.65,
    areaM2Per10in: 0.7,
    waterFlowLhPer10in: 1800,
    waterDpBar: 0.1,
    maxDpForwardBar: 5,
    maxDpReverseBar: 2,
    maxTempC: 140,
    terminalDpBar: 1.5,
    designFluxLhPer10in: 500,
    nominalCapacityLPerM2: 1200,
    ratedSteamCycles: 50,
    ratedHotWaterCycles: 100,
    ratedChemicalCycles: 30,
    flowRecoveryMinPct: 80,
    bubblePointMinBar: 2.4,
    diffusionMaxMlMinPer10in: 12,
    pricePer10in: 85,
    currency: 'EUR',
    notes: 'Yeast removal for dry wines.',
  },
  {
    id: demoEquipmentIds.pes045,
    name: 'PES membrane 0.45 µm',
    kind: 'membrane',
    media: 'PES',
    ratingUm: 0.45,
    areaM2Per10in: 0.7,
    waterFlowLhPer10in: 1200,
    waterDpBar: 0.1,
    maxDpForwardBar: 5,
    maxDpReverseBar: 2,
    maxTempC: 140,
    terminalDpBar: 1.5,
    designFluxLhPer10in: 400,
    nominalCapacityLPerM2: 900,
    ratedSteamCycles: 50,
    ratedHotWaterCycles: 100,
    ratedChemicalCycles: 30,
    flowRecoveryMinPct: 80,
    bubblePointMinBar: 3.2,
    diffusionMaxMlMinPer10in: 10,
    pricePer10in: 95,
    currency: 'EUR',
    notes: 'Final membrane for wines with residual sugar and for the sparkling base.',
  },
];

/** Demo data for the equipment of a winery (idempotent: does nothing when the winery already has some). */
export async function seedEquipment(tx: DbOrTx, ctx: { wineryId: string; actorId: string }) {
  const [{ n }] = await tx.select({ n: count() }).from(housingsTable).where(eq(housingsTable.wineryId, ctx.wineryId));
  const [{ t }] = await tx.select({ t: count() }).from(cartridgeTypesTable).where(eq(cartridgeTypesTable.wineryId, ctx.wineryId));
  const [{ l }] = await tx.select({ l: count() }).from(linesTable).where(eq(linesTable.wineryId, ctx.wineryId));
  if (n === 0) await tx.insert(housingsTable).values(housings.map((h) => ({ ...h, wineryId: ctx.wineryId })));
  if (l === 0) {
    await tx.insert(linesTable).values({
      id: demoEquipmentIds.line,
      wineryId: ctx.wineryId,
      name: 'Filler line 1',
      bottlesPerHour: 3000,
      bottleMl: 750,
      notes: 'Twelve-valve filler; 750 mL bottles most days.',
    });
  }
  if (t === 0) await tx.insert(cartridgeTypesTable).values(cartridgeTypes.map((c) => ({ ...c, wineryId: ctx.wineryId })));
  // Demo types seeded before the nominal capacity existed get theirs: only a demo row nobody has
  // edited since it was seeded and that has no figure yet, so a winery's own entry is never touched.
  for (const c of cartridgeTypes) {
    if (!c.id || c.nominalCapacityLPerM2 === undefined || c.nominalCapacityLPerM2 === null) continue;
    await tx
      .update(cartridgeTypesTable)
      .set({ nominalCapacityLPerM2: c.nominalCapacityLPerM2 })
      .where(
        and(
          eq(cartridgeTypesTable.wineryId, ctx.wineryId),
          eq(cartridgeTypesTable.id, c.id),
          isNull(cartridgeTypesTable.nominalCapacityLPerM2),
          eq(cartridgeTypesTable.updatedAt, cartridgeTypesTable.createdAt),
        ),
      );
  }
}
