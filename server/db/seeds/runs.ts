// Demo data for Quillwater Estate's runs: a bottling day two days ago with two closed runs and
// full records — the cartridges in each stage, readings, a passing integrity test before and
// after on each membrane, a hot-water sanitation before the day, one reading corrected, and
// in the second run a change of the prefilters at terminal ΔP. Invented figures; demo data.
import { createRunsRepository } from '../../modules/runs/runs.repository';
import { and, asc, count, eq, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../client';
import {
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  linesTable,
  lotsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runChangesTable,
  runReadingCorrectionsTable,
  runReadingsTable,
  runsTable,
  runStageCartridgesTable,
  usersTable,
} from '../schema';
import { readinessAtStart } from '../../modules/records/readiness-at-start';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

type Cartridge = typeof cartridgesTable.$inferSelect;
type TypeRow = typeof cartridgeTypesTable.$inferSelect;
type HousingRow = typeof housingsTable.$inferSelect;

/** Demo runs of a winery (idempotent: does nothing when the winery already has a run). */
export async function seedRuns(tx: DbOrTx, ctx: { wineryId: string; actorId: string }, now = new Date()) {
  const [{ n }] = await tx.select({ n: count() }).from(runsTable).where(eq(runsTable.wineryId, ctx.wineryId));
  if (n > 0) return;
  const w = ctx.wineryId;
  const [line] = await tx.select().from(linesTable).where(eq(linesTable.wineryId, w)).orderBy(asc(linesTable.name)).limit(1);
  const housings = await tx.select().from(housingsTable).where(eq(housingsTable.wineryId, w));
  const pre = housings.find((h) => h.name === 'Prefilter housing A');
  const mem = housings.find((h) => h.name === 'Membrane housing B');
  const lots = await tx.select().from(lotsTable).where(and(eq(lotsTable.wineryId, w), inArray(lotsTable.code, ['QW-24-RS03', 'QW-23-PN04'])));
  const rose = lots.find((l) => l.code === 'QW-24-RS03');
  const pinot = lots.find((l) => l.code === 'QW-23-PN04');
  const people = await tx.select({ id: usersTable.id, name: usersTable.name, email: usersTable.email }).from(usersTable);
  const tech = people.find((p) => p.email === 'tech@quillwater.test') ?? { id: ctx.actorId, name: null };
  const master = people.find((p) => p.id === ctx.actorId) ?? { id: ctx.actorId, name: null };
  if (!line || !pre || !mem || !rose || !pinot) return;

  const types = await tx.select().from(cartridgeTypesTable).where(eq(cartridgeTypesTable.wineryId, w));
  const all = await tx.select().from(cartridgesTable).where(eq(cartridgesTable.wineryId, w));
  const byId = new Map(all.map((c) => [c.id, { ...c }]));
  const typeOf = (c: Cartridge) => types.find((t) => t.id === c.typeId) as TypeRow;
  const inHousing = (h: HousingRow) => all.filter((c) => c.status === 'installed' && c.housingId === h.id).sort((a, b) => (a.position ?? 0) - (b.position ?? 0));
  const preIn = inHousing(pre);
  const memIn = inHousing(mem);
  if (preIn.length === 0 || memIn.length === 0) return;
  const preType = typeOf(preIn[0]);
  const memType = typeOf(memIn[0]);
  // Spares for the change: in-stock cartridges of the same type and length as the prefilters.
  const spares = all.filter((c) => c.status === 'in-stock' && c.typeId === preType.id && c.lengthIn === pre.lengthIn).slice(0, preIn.length);

  const day = new Date(now.getTime() - 2 * DAY);
  day.setUTCHours(6, 0, 0, 0);
  const at = (hours: number) => new Date(day.getTime() + hours * HOUR);
  const events: (typeof cartridgeEventsTable.$inferInsert)[] = [];
  const event = (c: Cartridge, kind: (typeof cartridgeEventsTable.$inferInsert)['kind'], when: Date, details: Record<string, unknown>, housing: HousingRow | null) =>
    events.push({ wineryId: w, cartridgeId: c.id, kind, housingId: housing?.id ?? null, position: c.position, actorId: tech.id, actorName: tech.name, at: when, details });

  // The plan of the day, approved the day before and done.
  const [plan] = await tx
    .insert(plansTable)
    .values({
      wineryId: w,
      name: 'Rosé and Pinot bottling',
      plannedDate: day.toISOString().slice(0, 10),
      lineId: line.id,
      status: 'done',
      startTime: '07:00',
      sanitationKind: 'hot-water',
      notes: 'Rosé first, then the Pinot. Spare prefilters at the line.',
      createdBy: master.id,
      createdByName: master.name,
      approvedBy: master.id,
      approvedByName: master.name,
      approvedAt: new Date(day.getTime() - 20 * HOUR),
    })
    .returning({ id: plansTable.id });
  const stages = [
    { name: 'Prefilter', cartridgeTypeId: preType.id, housingId: pre.id, housingCount: 1, capacityLPerM2: 2500 },
    { name: 'Membrane', cartridgeTypeId: memType.id, housingId: mem.id, housingCount: 1, capacityLPerM2: 2000 },
  ];

  // Hot-water sanitation of the train before the day, and a passing integrity test on each membrane.
  for (const c of [...preIn, ...memIn]) {
    event(c, 'cycle', at(0), { kind: 'hot-water', tempC: 85, durationMin: 30 }, c.housingId === pre.id ? pre : mem);
    byId.get(c.id)!.hotWaterCycles += 1;
  }
  for (const c of memIn) {
    event(c, 'integrity', at(0.5), { pass: true, method: 'bubble point', measuredBar: (memType.bubblePointMinBar ?? 3.2) + 0.3, minBar: memType.bubblePointMinBar }, mem);
  }

  const flowLh = 2200;
  const lotRuns = [
    { lot: rose, startH: 1, endH: 4.5, litres: Math.min(rose.volumeL, 5400), change: false, correct: true },
    { lot: pinot, startH: 5, endH: 9, litres: Math.min(pinot.volumeL, 7200), change: spares.length === preIn.length, correct: false },
  ];
  let position = 1;
  for (const r of lotRuns) {
    const [planLot] = await tx.insert(planLotsTable).values({ wineryId: w, planId: plan.id, lotId: r.lot.id, position: position++, volumeL: r.litres }).returning({ id: planLotsTable.id });
    const [train] = await tx.insert(planTrainsTable).values({ wineryId: w, planLotId: planLot.id, name: 'Option A', stages }).returning({ id: planTrainsTable.id });
    await tx.update(planLotsTable).set({ chosenTrainId: train.id }).where(eq(planLotsTable.id, planLot.id));
    const [run] = await tx
      .insert(runsTable)
      .values({
        wineryId: w,
        planId: plan.id,
        planLotId: planLot.id,
        status: 'closed',
        startedAt: at(r.startH),
        closedAt: at(r.endH),
        // the lot's readiness as a run keeps it at its start
        readinessAtStart: await readinessAtStart(tx, w, r.lot, at(r.startH)),
        startedBy: tech.id,
        startedByName: tech.name,
        closedBy: tech.id,
        closedByName: tech.name,
        notes: r.change ? 'Prefilters reached terminal ΔP part-way; changed for spares from the same batch, then finished.' : 'Clear all through; no alarms.',
      })
      .returning({ id: runsTable.id });

    // What was physically in the train at start.
    const stint = (c: Cartridge, stageIndex: number, housing: HousingRow, installedAtVolumeL: number, changeId: string | null) => {
      const cur = byId.get(c.id)!;
      const t = typeOf(c);
      return {
        wineryId: w,
        runId: run.id,
        stageIndex,
        housingId: housing.id,
        housingName: housing.name,
        cartridgeId: c.id,
        serial: c.serial,
        batch: c.batch || null,
        typeId: t.id,
        typeName: t.name,
        ratingUm: t.ratingUm,
        lengthIn: c.lengthIn,
        litresAtStart: cur.litresFiltered,
        cyclesAtStart: cur.steamCycles + cur.hotWaterCycles + cur.chemicalCycles,
        installedAtVolumeL,
        changeId,
      };
    };
    const currentPre = inHousing(pre).map((c) => byId.get(c.id)!);
    const rows = [...currentPre.map((c) => stint(c, 0, pre, 0, null)), ...memIn.map((c) => stint(c, 1, mem, 0, null))];
    const changeAt = Math.round(r.litres * 0.55);

    // Readings: ΔP rising with the litres, each stage every ~1,000 L.
    const readings: (typeof runReadingsTable.$inferInsert)[] = [];
    const steps = 6;
    for (let i = 1; i <= steps; i++) {
      const v = Math.round((r.litres * i) / steps);
      const hours = r.startH + ((r.endH - r.startH) * i) / (steps + 0.5);
      // after the change the prefilter stage starts again from a clean ΔP
      const sinceClean = r.change && v > changeAt ? v - changeAt : v;
      const preDp = 0.12 + 0.00004 * sinceClean + (r.change ? 4e-8 : 2e-8) * sinceClean * sinceClean;
      const memDp = 0.08 + 0.00002 * v + 4e-9 * v * v;
      readings.push(
        { wineryId: w, runId: run.id, stageIndex: 0, at: at(hours), volumeL: v, upstreamBar: 2.6, downstreamBar: Number((2.6 - preDp).toFixed(3)), flowLh, tempC: 13, clientKey: `demo-${run.id}-0-${String(i)}`, createdBy: tech.id, createdByName: tech.name },
        { wineryId: w, runId: run.id, stageIndex: 1, at: at(hours + 0.02), volumeL: v, upstreamBar: Number((2.6 - preDp).toFixed(3)), downstreamBar: Number((2.6 - preDp - memDp).toFixed(3)), flowLh, tempC: 13, clientKey: `demo-${run.id}-1-${String(i)}`, createdBy: tech.id, createdByName: tech.name },
      );
    }
    // One reading typed wrong (3.6 for 2.6 upstream), corrected below.
    const wrong = r.correct ? readings[4] : null;
    const rightUpstream = wrong?.upstreamBar ?? 0;
    if (wrong) wrong.upstreamBar = 3.6;
    const stored = await tx.insert(runReadingsTable).values(readings).returning({ id: runReadingsTable.id, clientKey: runReadingsTable.clientKey });
    if (wrong) {
      const id = stored.find((s) => s.clientKey === wrong.clientKey)!.id;
      await tx.insert(runReadingCorrectionsTable).values({
        wineryId: w,
        runId: run.id,
        readingId: id,
        kind: 'correct',
        volumeL: wrong.volumeL,
        upstreamBar: rightUpstream,
        downstreamBar: wrong.downstreamBar,
        flowLh: wrong.flowLh ?? null,
        tempC: wrong.tempC ?? null,
        reason: 'Typed 3.6 for 2.6 bar upstream; the gauge photo shows 2.6.',
        createdBy: master.id,
        createdByName: master.name,
        createdAt: at(r.endH + 0.5),
      });
    }
    // The run's stored counters, as the app keeps them when readings are logged and corrected.
    await createRunsRepository(tx).recountRun(w, run.id);

    // The prefilter change at terminal ΔP: the old ones out to stock, the spares in.
    let changeId: string | null = null;
    if (r.change) {
      const [change] = await tx
        .insert(runChangesTable)
        .values({
          wineryId: w,
          runId: run.id,
          stageIndex: 0,
          kind: 'change',
          atVolumeL: changeAt,
          removedCartridgeIds: currentPre.map((c) => c.id),
          installedCartridgeIds: spares.map((c) => c.id),
          createdBy: tech.id,
          createdByName: tech.name,
          createdAt: at((r.startH + r.endH) / 2),
        })
        .returning({ id: runChangesTable.id });
      changeId = change.id;
      const when = at((r.startH + r.endH) / 2);
      for (const [i, old] of currentPre.entries()) {
        const spare = byId.get(spares[i].id)!;
        event(old, 'removed', when, { from: 'installed', runId: run.id }, pre);
        spare.status = 'installed';
        spare.housingId = pre.id;
        spare.position = old.position;
        events.push({ wineryId: w, cartridgeId: spare.id, kind: 'installed', housingId: pre.id, position: old.position, actorId: tech.id, actorName: tech.name, at: new Date(when.getTime() + 1), details: { from: 'in-stock', runId: run.id } });
        old.status = 'in-stock';
        old.housingId = null;
        old.position = null;
      }
      for (const row of rows) if (row.stageIndex === 0) Object.assign(row, { removedAtVolumeL: changeAt });
      rows.push(...spares.map((c) => stint(byId.get(c.id)!, 0, pre, changeAt, changeId)));
    }

    // Close: each cartridge gets the litres it carried.
    const withCarried = rows.map((row) => {
      const end = (row as { removedAtVolumeL?: number }).removedAtVolumeL ?? r.litres;
      return { ...row, litresCarried: end - row.installedAtVolumeL };
    });
    await tx.insert(runStageCartridgesTable).values(withCarried);
    for (const row of withCarried) {
      const c = byId.get(row.cartridgeId)!;
      c.litresFiltered += row.litresCarried;
      events.push({ wineryId: w, cartridgeId: c.id, kind: 'run', housingId: row.housingId, position: c.position, actorId: tech.id, actorName: tech.name, at: at(r.endH), details: { litres: row.litresCarried, runId: run.id, lotCode: r.lot.code, stageIndex: row.stageIndex } });
    }
    // A passing integrity test on each membrane after the run.
    for (const c of memIn) {
      event(c, 'integrity', at(r.endH + 0.25), { pass: true, method: 'bubble point', measuredBar: (memType.bubblePointMinBar ?? 3.2) + 0.25, minBar: memType.bubblePointMinBar }, mem);
    }
  }

  await tx.insert(cartridgeEventsTable).values(events);
  for (const c of byId.values()) {
    const before = all.find((a) => a.id === c.id)!;
    if (
      before.litresFiltered === c.litresFiltered &&
      before.hotWaterCycles === c.hotWaterCycles &&
      before.status === c.status &&
      before.housingId === c.housingId
    ) {
      continue;
    }
    await tx
      .update(cartridgesTable)
      .set({ litresFiltered: c.litresFiltered, hotWaterCycles: c.hotWaterCycles, status: c.status, housingId: c.housingId, position: c.position, updatedAt: sql`now()` })
      .where(eq(cartridgesTable.id, c.id));
  }
}
