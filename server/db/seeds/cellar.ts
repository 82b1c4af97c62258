// Demo data: an invented cellar for the fictional Quillwater Estate. Tank names, lots and lab
// figures are made up to look plausible; they are not measurements of any real wine.
import { count, eq } from 'drizzle-orm';
import type { DbOrTx } from '../client';
import { labResultsTable, lotsTable, tanksTable, type DiscPoint } from '../schema';

const DAY_MS = 86_400_000;

/**
 * Points of a constant-pressure disc test that follows standard blocking, t/V = 1/Q0 + t/Vmax,
 * sampled every minute for `minutes` and rounded to the millilitre as a lab would write them.
 */
function discPoints(q0MlPerS: number, vmaxMl: number, minutes: number): DiscPoint[] {
  return Array.from({ length: minutes }, (_, i) => {
    const t = (i + 1) * 60;
    return { timeS: t, volumeMl: Math.round((q0MlPerS * t) / (1 + (q0MlPerS * t) / vmaxMl)) };
  });
}

type SeedResult = {
  daysAgo: number;
  turbidityNtu?: number;
  t200s?: number;
  t400s?: number;
  disc?: { q0: number; vmaxMl: number; minutes: number };
  freeSo2MgL?: number;
  notes?: string;
};

const tanks = [
  { name: 'T1 – 12 000 L', capacityL: 12_000, notes: 'Stainless, jacketed. Whites and rosé.' },
  { name: 'T2 – 8 000 L', capacityL: 8_000, notes: 'Stainless, jacketed.' },
  { name: 'T3 – 20 000 L', capacityL: 20_000, notes: 'Stainless, red blends.' },
  { name: 'T4 – 5 000 L', capacityL: 5_000, notes: 'Pressure tank for the sparkling base.' },
  { name: 'T5 – 2 500 L', capacityL: 2_500, notes: 'Small batches and the late-harvest wine.' },
];

const lots: {
  code: string;
  name: string;
  style: 'white' | 'rosé' | 'red' | 'sweet' | 'sparkling';
  vintage: number | null;
  volumeL: number;
  tank: number | null;
  ethanolPctVol: number;
  sugarGPerL: number;
  tempC: number;
  notes: string;
  results: SeedResult[];
}[] = [
  {
    code: 'QW-24-SB01',
    name: 'Sauvignon blanc, Lower Terrace',
    style: 'white',
    vintage: 2024,
    volumeL: 9_800,
    tank: 0,
    ethanolPctVol: 12.8,
    sugarGPerL: 2.1,
    tempC: 12,
    notes: 'Cold stabilised; bentonite fined.',
    results: [
      { daysAgo: 26, turbidityNtu: 4.8, freeSo2MgL: 22, notes: 'Before fining.' },
      { daysAgo: 12, turbidityNtu: 1.6, t200s: 32, t400s: 86, freeSo2MgL: 28 },
      { daysAgo: 3, turbidityNtu: 0.6, t200s: 29, t400s: 67, disc: { q0: 2.4, vmaxMl: 5200, minutes: 10 }, freeSo2MgL: 30, notes: 'After pad filtration.' },
    ],
  },
  {
    code: 'QW-24-CH02',
    name: 'Chardonnay, barrel selection',
    style: 'white',
    vintage: 2024,
    volumeL: 4_200,
    tank: 1,
    ethanolPctVol: 13.4,
    sugarGPerL: 1.4,
    tempC: 14,
    notes: 'Eight months on lees; lightly fined.',
    results: [
      { daysAgo: 20, turbidityNtu: 3.2, freeSo2MgL: 18 },
      { daysAgo: 5, turbidityNtu: 1.3, t200s: 34, t400s: 102, freeSo2MgL: 25, notes: 'Some colloids; check prefilter.' },
    ],
  },
  {
    code: 'QW-24-RS03',
    name: 'Rosé of Grenache',
    style: 'rosé',
    vintage: 2024,
    volumeL: 6_500,
    tank: 0,
    ethanolPctVol: 12.5,
    sugarGPerL: 3.5,
    tempC: 11,
    notes: '',
    results: [
      { daysAgo: 18, turbidityNtu: 2.1, t200s: 30, t400s: 78 },
      { daysAgo: 8, turbidityNtu: 0.9, t200s: 28, t400s: 66, freeSo2MgL: 32 },
      { daysAgo: 2, turbidityNtu: 0.7, t200s: 27, t400s: 62, disc: { q0: 2.6, vmaxMl: 4800, minutes: 10 }, freeSo2MgL: 31 },
    ],
  },
  {
    code: 'QW-23-PN04',
    name: 'Pinot noir, Quarry Block',
    style: 'red',
    vintage: 2023,
    volumeL: 14_000,
    tank: 2,
    ethanolPctVol: 13.6,
    sugarGPerL: 0.8,
    tempC: 16,
    notes: 'Racked twice; not fined.',
    results: [
      { daysAgo: 28, turbidityNtu: 38, notes: 'Straight from barrel.' },
      { daysAgo: 15, turbidityNtu: 14, t200s: 41, t400s: 190 },
      { daysAgo: 4, turbidityNtu: 9.5, t200s: 44, t400s: 214, freeSo2MgL: 19, notes: 'Still hazy; prefilter or re-treat before the membrane.' },
    ],
  },
  {
    code: 'QW-23-SY05',
    name: 'Syrah–Mourvèdre blend',
    style: 'red',
    vintage: 2023,
    volumeL: 5_600,
    tank: 2,
    ethanolPctVol: 14.1,
    sugarGPerL: 1.1,
    tempC: 17,
    notes: '',
    results: [
      { daysAgo: 16, turbidityNtu: 3.4, t200s: 35, t400s: 96 },
      { daysAgo: 6, turbidityNtu: 1.8, t200s: 33, t400s: 80, disc: { q0: 2.0, vmaxMl: 3100, minutes: 12 }, freeSo2MgL: 24 },
    ],
  },
  {
    code: 'QW-24-LH06',
    name: 'Late-harvest Riesling',
    style: 'sweet',
    vintage: 2024,
    volumeL: 1_900,
    tank: 4,
    ethanolPctVol: 10.5,
    sugarGPerL: 85,
    tempC: 12,
    notes: 'Must be sterile-filtered before bottling.',
    results: [
      { daysAgo: 21, turbidityNtu: 2.6, freeSo2MgL: 40 },
      { daysAgo: 7, turbidityNtu: 0.8, t200s: 38, t400s: 88, freeSo2MgL: 45 },
    ],
  },
  {
    code: 'QW-NV-SP07',
    name: 'Traditional-method base, cuvée',
    style: 'sparkling',
    vintage: null,
    volumeL: 4_600,
    tank: 3,
    ethanolPctVol: 11.2,
    sugarGPerL: 0.5,
    tempC: 10,
    notes: 'Base wine before tirage.',
    results: [
      { daysAgo: 14, turbidityNtu: 1.9, t200s: 27, t400s: 70 },
      { daysAgo: 3, turbidityNtu: 1.2, t200s: 26, t400s: 58, freeSo2MgL: 16 },
    ],
  },
  {
    code: 'QW-24-PG08',
    name: 'Pinot gris, young vines',
    style: 'white',
    vintage: 2024,
    volumeL: 2_300,
    tank: null,
    ethanolPctVol: 12.9,
    sugarGPerL: 4.0,
    tempC: 12,
    notes: 'In transit between tanks; no lab result yet.',
    results: [],
  },
];

/** Demo data for the cellar of a winery (idempotent: does nothing when the winery already has some). */
export async function seedCellar(tx: DbOrTx, ctx: { wineryId: string; actorId: string }, now = new Date()) {
  const [{ n }] = await tx.select({ n: count() }).from(lotsTable).where(eq(lotsTable.wineryId, ctx.wineryId));
  const [{ m }] = await tx.select({ m: count() }).from(tanksTable).where(eq(tanksTable.wineryId, ctx.wineryId));
  if (n > 0 || m > 0) return;

  const tankIds = await tx
    .insert(tanksTable)
    .values(tanks.map((t) => ({ wineryId: ctx.wineryId, ...t })))
    .returning({ id: tanksTable.id });

  // Samples are taken mid-morning, counted back from today so the history looks current.
  const day = new Date(now);
  day.setUTCHours(9, 30, 0, 0);
  for (const lot of lots) {
    const { results, tank, ...values } = lot;
    const [row] = await tx
      .insert(lotsTable)
      .values({ wineryId: ctx.wineryId, ...values, tankId: tank === null ? null : tankIds[tank].id })
      .returning({ id: lotsTable.id });
    if (results.length === 0) continue;
    await tx.insert(labResultsTable).values(
      results.map((r) => ({
        wineryId: ctx.wineryId,
        lotId: row.id,
        createdBy: ctx.actorId,
        sampledAt: new Date(day.getTime() - r.daysAgo * DAY_MS),
        turbidityNtu: r.turbidityNtu ?? null,
        t200s: r.t200s ?? null,
        t400s: r.t400s ?? null,
        discDiameterMm: r.disc ? 25 : null,
        discPressureBar: r.disc ? 2 : null,
        discPoints: r.disc ? discPoints(r.disc.q0, r.disc.vmaxMl, r.disc.minutes) : null,
        freeSo2MgL: r.freeSo2MgL ?? null,
        notes: r.notes ?? '',
      })),
    );
  }
}
