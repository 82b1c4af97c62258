// Demo data for Quillwater Estate's cartridges: invented serials, batches and history (no
// real product or maker). Stands on the winery's own cartridge types and housings as they
// are in the database, so it works with whatever catalogue the equipment seed wrote.
import { and, asc, count, eq } from 'drizzle-orm';
import type { DbOrTx } from '../client';
import { cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, membershipsTable } from '../schema';

type TypeRow = typeof cartridgeTypesTable.$inferSelect;
type HousingRow = typeof housingsTable.$inferSelect;
type Status = (typeof cartridgesTable.$inferInsert)['status'];
type EventInsert = typeof cartridgeEventsTable.$inferInsert;
type CycleKind = 'steam' | 'hot-water' | 'chemical' | 'backflush';

const DAY = 86_400_000;

/** "QW-PP5-0001", "QW-GF08-0003", "QW-PES045-0002" from the type's media and rating. */
function serialCode(t: TypeRow) {
  const media = t.media === 'polypropylene' ? 'PP' : t.media === 'glass fibre' ? 'GF' : t.media === 'other' ? 'X' : t.media.toUpperCase();
  const rating = String(t.ratingUm).replace('.', '');
  return `QW-${media}${rating}`;
}

/** Cycle templates, with the water flow of a 10-inch module before and after (scaled by length). */
const CYCLES: Record<CycleKind, { tempC: number; durationMin: number; agent?: string }> = {
  'hot-water': { tempC: 85, durationMin: 30 },
  steam: { tempC: 121, durationMin: 20 },
  chemical: { tempC: 50, durationMin: 40, agent: 'sodium hydroxide 1 %, citric rinse' },
  backflush: { tempC: 40, durationMin: 10 },
};

type Plan = {
  type: TypeRow;
  lengthIn: number;
  status: Status;
  housing?: HousingRow;
  position?: number;
  retiredReason?: string;
  /** care cycles in order */
  cycles: CycleKind[];
  /** flow after each cycle as a fraction of new */
  recovery: number[];
  /** litres of each run, one run before each cycle */
  runs: number[];
  integrity: boolean[];
  batch: string;
  receivedDaysAgo: number;
};

export async function seedCartridges(tx: DbOrTx, ctx: { wineryId: string; actorId: string }) {
  const [{ n }] = await tx.select({ n: count() }).from(cartridgesTable).where(eq(cartridgesTable.wineryId, ctx.wineryId));
  if (n > 0) return;
  const types = await tx.select().from(cartridgeTypesTable).where(eq(cartridgeTypesTable.wineryId, ctx.wineryId)).orderBy(asc(cartridgeTypesTable.name));
  const housings = await tx.select().from(housingsTable).where(eq(housingsTable.wineryId, ctx.wineryId)).orderBy(asc(housingsTable.name));
  if (types.length === 0) return;
  const [tech] = await tx
    .select({ userId: membershipsTable.userId })
    .from(membershipsTable)
    .where(and(eq(membershipsTable.wineryId, ctx.wineryId), eq(membershipsTable.role, 'technician')));
  const technicianId = tech?.userId ?? ctx.actorId;

  const prefilters = types.filter((t) => t.kind === 'prefilter');
  const membranes = types.filter((t) => t.kind === 'membrane');
  const finest = (list: TypeRow[]) => [...list].sort((a, b) => a.ratingUm - b.ratingUm)[0];
  const coarsest = (list: TypeRow[]) => [...list].sort((a, b) => b.ratingUm - a.ratingUm)[0];

  const plans: Plan[] = [];
  const batches = ['B24-117', 'B24-142', 'B25-008', 'B25-031'];
  let k = 0;
  const stock = (type: TypeRow, lengthIn: number, howMany: number) => {
    for (let i = 0; i < howMany; i++) {
      k += 1;
      plans.push({ type, lengthIn, status: 'in-stock', cycles: [], recovery: [], runs: [], integrity: [], batch: batches[(k + i) % batches.length], receivedDaysAgo: 20 + ((k * 7) % 90) });
    }
  };

  // Fill every round of every housing with a cartridge of matching length and fitting kind.
  for (const h of housings) {
    const isMembrane = /membrane|final|sterile/i.test(h.name);
    const isWater = /water/i.test(h.name);
    const type = (isMembrane ? finest(membranes) : isWater ? coarsest(prefilters) : finest(prefilters)) ?? types[0];
    for (let p = 1; p <= h.rounds; p++) {
      const membrane = type.kind === 'membrane';
      // The water filter cleans rinse water, not wine: hot-water sanitation only, no wine runs.
      const cycles: CycleKind[] = membrane ? ['steam', 'hot-water', 'steam', 'hot-water', 'steam'] : isWater ? ['hot-water', 'hot-water'] : ['hot-water', 'backflush', 'hot-water', 'chemical'];
      plans.push({
        type,
        lengthIn: h.lengthIn,
        status: 'installed',
        housing: h,
        position: p,
        cycles,
        recovery: membrane ? [0.97, 0.95, 0.94, 0.92, 0.9] : isWater ? [0.96, 0.94] : [0.92, 0.88, 0.85, 0.86],
        runs: membrane ? [9000, 12000, 8000, 14000, 11000] : isWater ? [] : [9000, 12000, 8000, 14000],
        integrity: membrane ? [true, true, true] : [],
        batch: 'B24-117',
        receivedDaysAgo: 160,
      });
    }
  }

  // Stock on the shelf: most cartridges, across every type.
  const shelfLength = (t: TypeRow) => housings.find((h) => (t.kind === 'membrane') === /membrane|final|sterile/i.test(h.name))?.lengthIn ?? 30;
  for (const t of types) stock(t, shelfLength(t), t.kind === 'membrane' ? 7 : 6);
  const water = housings.find((h) => /water/i.test(h.name));
  if (water && prefilters.length) stock(coarsest(prefilters), water.lengthIn, 3);

  // Regenerating: one prefilter and one membrane, out for a chemical clean and a hot-water rinse.
  if (prefilters.length) {
    plans.push({ type: finest(prefilters), lengthIn: shelfLength(finest(prefilters)), status: 'regenerating', cycles: ['hot-water', 'hot-water', 'chemical'], recovery: [0.9, 0.84, 0.8], runs: [15000, 18000, 16000], integrity: [], batch: 'B24-142', receivedDaysAgo: 140 });
  }
  if (membranes.length) {
    plans.push({ type: membranes[membranes.length - 1], lengthIn: shelfLength(membranes[0]), status: 'regenerating', cycles: ['steam', 'hot-water', 'steam', 'hot-water'], recovery: [0.96, 0.93, 0.91, 0.89], runs: [10000, 12500, 9000, 11000], integrity: [true, true], batch: 'B24-142', receivedDaysAgo: 150 });
  }
  // Retired: a prefilter whose flow no longer recovered, a membrane that failed its bubble point.
  if (prefilters.length) {
    plans.push({
      type: coarsest(prefilters),
      lengthIn: shelfLength(coarsest(prefilters)),
      status: 'retired',
      retiredReason: 'Water flow recovered to only 55 % after a chemical clean.',
      cycles: ['hot-water', 'chemical', 'hot-water', 'chemical'],
      recovery: [0.82, 0.7, 0.62, 0.55],
      runs: [20000, 22000, 18000, 21000],
      integrity: [],
      batch: 'B23-090',
      receivedDaysAgo: 300,
    });
  }
  if (membranes.length) {
    plans.push({
      type: finest(membranes),
      lengthIn: shelfLength(finest(membranes)),
      status: 'retired',
      retiredReason: 'Failed the bubble-point test after steaming; re-wetted and re-tested, failed again.',
      cycles: ['steam', 'hot-water', 'steam', 'steam', 'hot-water', 'steam'],
      recovery: [0.97, 0.95, 0.93, 0.9, 0.88, 0.86],
      runs: [12000, 14000, 10000, 13000, 12000, 15000],
      integrity: [true, true, true, false, false],
      batch: 'B23-090',
      receivedDaysAgo: 320,
    });
  }

  const now = Date.now();
  const serialCount = new Map<string, number>();
  const events: EventInsert[] = [];
  const rows = plans.map((plan) => {
    const code = serialCode(plan.type);
    const nth = (serialCount.get(code) ?? 0) + 1;
    serialCount.set(code, nth);
    const id = crypto.randomUUID();
    const modules = plan.lengthIn / 10;
    const newFlowLh = Math.round(plan.type.waterFlowLhPer10in * modules);
    const receivedMs = now - plan.receivedDaysAgo * DAY;
    const receivedAt = new Date(receivedMs).toISOString().slice(0, 10);
    events.push({ wineryId: ctx.wineryId, cartridgeId: id, kind: 'registered', actorId: ctx.actorId, at: new Date(receivedMs + 3 * 3600_000), details: { source: 'demo', batch: plan.batch, receivedAt, waterFlowNewLh: newFlowLh } });

    // History: each run is followed by a care cycle, about a week apart, ending a few days ago.
    const steps = plan.cycles.length;
    const endMs = now - (plan.status === 'retired' ? 40 : 3) * DAY;
    const startMs = Math.max(receivedMs + 5 * DAY, endMs - steps * 9 * DAY);
    const stepMs = steps > 0 ? (endMs - startMs) / steps : 0;
    const housing = plan.housing;
    let litres = 0;
    let integrityIndex = 0;
    if (steps > 0 && housing) {
      events.push({ wineryId: ctx.wineryId, cartridgeId: id, kind: 'installed', actorId: technicianId, housingId: housing.id, position: plan.position, at: new Date(startMs - DAY), details: { from: 'in-stock' } });
    }
    let flowBefore = newFlowLh;
    // An event of the cartridge in its housing, logged by the technician.
    const inHousing = (kind: EventInsert['kind'], at: Date, details: EventInsert['details']): EventInsert => ({
      wineryId: ctx.wineryId,
      cartridgeId: id,
      kind,
      actorId: technicianId,
      housingId: housing?.id ?? null,
      position: plan.position ?? null,
      at,
      details,
    });
    plan.cycles.forEach((kind, i) => {
      const t = startMs + i * stepMs;
      const run = plan.runs[i] ?? 0;
      litres += run;
      if (run > 0) events.push(inHousing('run', new Date(t), { litres: run }));
      const after = Math.round(newFlowLh * plan.recovery[i]);
      const before = Math.round(Math.min(flowBefore, after) * 0.68);
      events.push(inHousing('cycle', new Date(t + 6 * 3600_000), { kind, ...CYCLES[kind], waterFlowBeforeLh: before, waterFlowAfterLh: after }));
      flowBefore = after;
      // Membranes are integrity-tested after the thermal cycles (a pass, or the failure that retired one).
      if (plan.type.kind === 'membrane' && kind === 'steam' && integrityIndex < plan.integrity.length) {
        const pass = plan.integrity[integrityIndex++];
        events.push(
          inHousing('integrity', new Date(t + 8 * 3600_000), {
            pass,
            method: 'bubble point',
            measuredBar: pass ? (plan.type.bubblePointMinBar ?? 3) + 0.3 : (plan.type.bubblePointMinBar ?? 3) - 0.6,
            minBar: plan.type.bubblePointMinBar,
          }),
        );
      }
    });
    // Any remaining integrity results (the re-test of the failed membrane).
    while (integrityIndex < plan.integrity.length) {
      const pass = plan.integrity[integrityIndex++];
      events.push({
        wineryId: ctx.wineryId,
        cartridgeId: id,
        kind: 'integrity',
        actorId: technicianId,
        at: new Date(endMs + 12 * 3600_000 + integrityIndex * 60_000),
        details: { pass, method: 'bubble point', note: 're-wetted and re-tested' },
      });
    }
    if (plan.status === 'retired') {
      events.push({ wineryId: ctx.wineryId, cartridgeId: id, kind: 'retired', actorId: ctx.actorId, at: new Date(endMs + DAY), details: { reason: plan.retiredReason } });
    }
    if (plan.status === 'regenerating') {
      events.push({ wineryId: ctx.wineryId, cartridgeId: id, kind: 'note', actorId: technicianId, at: new Date(endMs + 3600_000), details: { text: 'Out of the housing for regeneration.' } });
    }
    const countOf = (kind: CycleKind) => plan.cycles.filter((c) => c === kind).length;
    return {
      id,
      wineryId: ctx.wineryId,
      serial: `${code}-${String(nth).padStart(4, '0')}`,
      batch: plan.batch,
      typeId: plan.type.id,
      lengthIn: plan.lengthIn,
      status: plan.status,
      housingId: plan.status === 'installed' ? (housing?.id ?? null) : null,
      position: plan.status === 'installed' ? (plan.position ?? null) : null,
      receivedAt,
      litresFiltered: litres,
      steamCycles: countOf('steam'),
      hotWaterCycles: countOf('hot-water'),
      chemicalCycles: countOf('chemical'),
      retiredReason: plan.retiredReason ?? null,
      notes: plan.status === 'retired' ? 'Kept for the audit file; do not reinstall.' : '',
    };
  });

  await tx.insert(cartridgesTable).values(rows);
  await tx.insert(cartridgeEventsTable).values(events);
}
