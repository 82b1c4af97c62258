// @vitest-environment node
// The alert rules added to the first set: a cartridge's life forecast spent before the next
// approved day that uses its housing, a care cycle above the housing's temperature rating, and
// the stock rule checked on approval and then once a day (not by the 10-minute sweep).
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { alertsTable, cartridgesTable, cartridgeTypesTable, housingsTable } from '../../server/db/schema';
import { registerSchedules, STOCK_CRON, SWEEP_CRON } from '../../server/jobs/workers';
import { ALERTS_STOCK_QUEUE } from '../../server/lib/queue';
import { STOCK_CHECK_HOUR } from '../../server/modules/alerts/alerts.service';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody, type PlanWorld } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { jobsSettled, type Client } from '../support/test-app';
import { until } from '../support/until';

const app = setupApiApp({ wineryName: 'Forecast Ridge Winery', members: ['technician', 'cellar-master'] });
let owner: Client;
let ownerEmail: string;
let wineryId: string;
let technician: { client: Client; email: string };
let cellarMaster: { client: Client; email: string };

const mailsTo = (email: string, subject: RegExp) => app.mail.messages.filter((m) => m.to.includes(email.toLowerCase()) && subject.test(m.subject));
const alertsOf = (kind: string, recordId: string) =>
  app.db.select().from(alertsTable).where(and(eq(alertsTable.wineryId, wineryId), eq(alertsTable.kind, kind), eq(alertsTable.recordId, recordId)));
const settle = async () => {
  await app.alerts.idle();
  await jobsSettled(app); // any (wrong) second mail is in the outbox by now
};
const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);

/** An approved plan on `date` running the world's lot through its two-stage train. */
async function approvedPlan(w: PlanWorld, date: string, volumeL = 6000) {
  const plan = await createPlan(owner, w.lineId, { plannedDate: date });
  const withLot = await addPlanLot(owner, plan.id, w.lotId, volumeL);
  const planLotId = withLot.lots[0].id;
  const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
  expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id })).status).toBe(200);
  const approved = await cellarMaster.client.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: cautions read and accepted.' });
  expect(approved.status).toBe(200);
  return { plan, planLotId, approved: approved.body };
}

beforeAll(() => {
  ({ owner, ownerEmail, wineryId } = app);
  technician = { client: app.members.technician, email: app.memberEmails.technician };
  cellarMaster = { client: app.members['cellar-master'], email: app.memberEmails['cellar-master'] };
});

describe('a life forecast spent before the next day that needs the cartridge', () => {
  it('raises one alert and one mail per person when the plan is approved, never twice, and clears when the plan is reopened', async () => {
    const w = await createPlanWorld(owner);
    await app.db.update(cartridgeTypesTable).set({ ratedHotWaterCycles: 10 }).where(eq(cartridgeTypesTable.id, w.membraneTypeId));
    const { membranes } = await fillTrainHousings(owner, w);
    const worn = membranes[0];
    // 7 of 10 rated hot-water cycles (70 %: below the 90 % budget alert) over 1,400 L: 200 L a cycle,
    // so the forecast leaves 3 cycles ≈ 600 L.
    for (let i = 0; i < 7; i++) expect((await technician.client.post(`/api/cartridges/${worn.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 })).status).toBe(201);
    await app.db.update(cartridgesTable).set({ litresFiltered: 1400 }).where(eq(cartridgesTable.id, worn.id));
    await app.alerts.idle();
    await app.alerts.evaluate(wineryId);
    expect(await alertsOf('cartridge-end-of-life', worn.id)).toHaveLength(0);

    // A day ten days on: 6,000 L through a 3 × 30-inch membrane housing (9 ten-inch equivalents),
    // so this 30-inch cartridge's share is 6000 × 3 / 9 = 2,000 L, more than its ≈ 600 L left.
    const day = isoDay(10);
    const { plan } = await approvedPlan(w, day);
    const [raised] = await until('the forecast alert', async () => {
      const r = await alertsOf('cartridge-end-of-life', worn.id);
      return r.length ? r : null;
    });
    expect(raised).toMatchObject({ threshold: `forecast-before:${day}`, severity: 'warning', link: `/cartridges/${worn.id}`, clearedAt: null });
    expect(raised.message).toMatch(/about 600 L left, the day puts about 2000 L through it/);
    expect(raised.nextStep).toMatch(/replacement/);
    const subject = new RegExp(`${worn.serial} may be spent before ${day}`);
    await app.mail.waitFor(ownerEmail, { subject, timeoutMs: 10_000 });
    await app.mail.waitFor(cellarMaster.email, { subject, timeoutMs: 10_000 });
    // The other cartridges have no forecast of litres yet: nothing said about them.
    for (const m of membranes.slice(1)) expect(await alertsOf('cartridge-end-of-life', m.id)).toHaveLength(0);

    // Evaluated again (a later write, the sweep): still one alert, one mail each; the technician none by default.
    await app.alerts.evaluate(wineryId);
    await technician.client.post(`/api/cartridges/${membranes[1].id}/cycles`, { kind: 'backflush' });
    await settle();
    expect(await alertsOf('cartridge-end-of-life', worn.id)).toHaveLength(1);
    expect(mailsTo(ownerEmail, subject)).toHaveLength(1);
    expect(mailsTo(cellarMaster.email, subject)).toHaveLength(1);
    expect(mailsTo(technician.email, subject)).toHaveLength(0);

    // The plan is reopened: no approved day needs the housing, and the alert clears itself.
    expect((await cellarMaster.client.post(`/api/plans/${plan.id}/reopen`, {})).status).toBe(200);
    await app.alerts.idle();
    const [cleared] = await alertsOf('cartridge-end-of-life', worn.id);
    expect(cleared.clearedAt).toBeInstanceOf(Date);
  });
});

describe('a care cycle above the housing’s rating', () => {
  it('raises one alert (the cartridge is rated higher), one mail per person, and clears on a passing integrity test', async () => {
    const w = await createPlanWorld(owner);
    const { membranes } = await fillTrainHousings(owner, w);
    const c = membranes[0];
    // The cartridge type is rated 140 °C; the housing only 75 °C (its seals).
    await app.db.update(housingsTable).set({ maxTempC: 75 }).where(eq(housingsTable.id, w.membraneHousingId));
    const refused = await technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 85, durationMin: 20 });
    expect(refused.status).toBe(400);
    const logged = await technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 85, durationMin: 20, aboveRatingConfirmed: true });
    expect(logged.status).toBe(201);
    const [hot] = await until('the over-temperature alert', async () => {
      const r = await alertsOf('care-over-temperature', c.id);
      return r.length ? r : null;
    });
    expect(hot.title).toMatch(/cleaned at 85 °C, above its 75 °C rating/);
    const subject = new RegExp(`${c.serial} cleaned at 85 °C`);
    await app.mail.waitFor(ownerEmail, { subject, timeoutMs: 10_000 });
    await app.mail.waitFor(cellarMaster.email, { subject, timeoutMs: 10_000 });
    await app.alerts.evaluate(wineryId);
    await settle();
    expect(await alertsOf('care-over-temperature', c.id)).toHaveLength(1);
    expect(mailsTo(ownerEmail, subject)).toHaveLength(1);
    expect(mailsTo(technician.email, subject)).toHaveLength(0);

    expect((await technician.client.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.6, wettingFluid: 'water' })).status).toBe(201);
    await app.alerts.idle();
    expect((await alertsOf('care-over-temperature', c.id))[0].clearedAt).toBeInstanceOf(Date);
  });
});

describe('the stock rule', () => {
  it('is scheduled with pg-boss and runs once a day per winery, at its local hour', async () => {
    await registerSchedules(app.queue.boss);
    const schedules = await app.queue.boss.getSchedules();
    const stock = schedules.find((s) => s.name === ALERTS_STOCK_QUEUE);
    expect(stock).toMatchObject({ cron: STOCK_CRON, timezone: 'UTC' });
    expect(SWEEP_CRON).toBe('*/10 * * * *');
    // Of the 24 hourly runs of a day, exactly one checks this winery: 06:00 in its time zone (UTC+9 here).
    expect((await owner.put('/api/settings/winery', { timeZone: 'Asia/Tokyo' })).status).toBe(200);
    const midnight = Date.UTC(2031, 0, 15);
    const checkedAt: number[] = [];
    for (let h = 0; h < 24; h++) if ((await app.alerts.stockCheck(midnight + h * 3_600_000, wineryId)) > 0) checkedAt.push(h);
    expect(checkedAt).toEqual([(STOCK_CHECK_HOUR - 9 + 24) % 24]);
    expect((await owner.put('/api/settings/winery', { timeZone: 'UTC' })).status).toBe(200);
    for (const s of schedules) await app.queue.boss.unschedule(s.name);
  });

  it('a shortfall that arises after approval is raised by the daily job, not by the sweep; once; cleared by stock received', async () => {
    const w = await createPlanWorld(owner);
    const { membranes } = await fillTrainHousings(owner, w);
    const { plan, approved } = await approvedPlan(w, isoDay(20));
    expect(approved.needs.every((n: { shortfall: number }) => n.shortfall === 0)).toBe(true);
    await app.alerts.idle();
    expect(await alertsOf('stock-short', plan.id)).toHaveLength(0);

    // A membrane fails its integrity test: no longer usable, so the day is one short.
    expect((await technician.client.post(`/api/cartridges/${membranes[0].id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.0, wettingFluid: 'water' })).status).toBe(201);
    await app.alerts.idle();
    await app.alerts.sweep();
    expect(await alertsOf('stock-short', plan.id)).toHaveLength(0); // neither that write nor the 10-minute sweep checks stock

    // The daily job at 06:00 (UTC winery) raises it.
    const today = new Date().toISOString().slice(0, 10);
    const sixAm = Date.parse(`${today}T0${STOCK_CHECK_HOUR}:00:00Z`);
    await app.queue.boss.send(ALERTS_STOCK_QUEUE, { nowMs: sixAm, wineryId });
    const [short] = await until('the daily stock alert', async () => {
      const r = await alertsOf('stock-short', plan.id);
      return r.length ? r : null;
    });
    expect(short).toMatchObject({ severity: 'warning', link: `/plans/${plan.id}`, clearedAt: null });
    const subject = new RegExp(`${plan.name} is short of cartridges`);
    await app.mail.waitFor(ownerEmail, { subject, timeoutMs: 30_000 });
    await app.mail.waitFor(cellarMaster.email, { subject, timeoutMs: 30_000 });

    // The next day's check: still short, still one alert and one mail each.
    await app.queue.boss.send(ALERTS_STOCK_QUEUE, { nowMs: sixAm + 86_400_000, wineryId });
    await until('the second daily job', async () => (await app.queue.boss.getQueueSize?.(ALERTS_STOCK_QUEUE)) === 0);
    await settle();
    expect(await alertsOf('stock-short', plan.id)).toHaveLength(1);
    expect(mailsTo(ownerEmail, subject)).toHaveLength(1);
    expect(mailsTo(technician.email, subject)).toHaveLength(0);

    // Stock received: a new membrane registered clears it at once.
    const reg = await owner.post('/api/cartridges', { serial: `RCV-${Date.now().toString(36)}`, batch: 'B9', typeId: w.membraneTypeId, lengthIn: 30, receivedAt: today });
    expect(reg.status).toBe(201);
    await app.alerts.idle();
    expect((await alertsOf('stock-short', plan.id))[0].clearedAt).toBeInstanceOf(Date);
  });
});
