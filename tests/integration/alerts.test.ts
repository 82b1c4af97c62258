// @vitest-environment node
// Alerts end to end: rules raise one alert and one mail to the right people, never twice, clear
// themselves; preferences and the digest; mail retried and kept when it cannot be delivered;
// calendars read back with a real iCalendar parser; roles and another winery.
import { and, eq } from 'drizzle-orm';
import ical from 'node-ical';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alertsTable, cartridgeTypesTable } from '../../server/db/schema';
import { ALERTS_DIGEST_QUEUE } from '../../server/lib/queue';
import { insertCartridgeType, serialPrefix } from '../factories/cartridges';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { addMember, Client, jobsSettled, signUp, startTestApp, type TestApp } from '../support/test-app';
import { until } from '../support/until';

let app: TestApp;
let owner: Client;
let ownerEmail: string;
let wineryId: string;
const people: Record<'technician' | 'cellar-master' | 'winemaker' | 'auditor', { client: Client; email: string }> = {} as never;
let other: Client;
let membraneTypeId: string;
const prefix = serialPrefix();
let seq = 0;


async function registered(client: Client, typeId: string) {
  const res = await client.post('/api/cartridges', { serial: `${prefix}-${String(++seq).padStart(4, '0')}`, batch: 'B1', typeId, lengthIn: 30, receivedAt: '2024-11-05' });
  expect(res.status).toBe(201);
  return res.body as { id: string; serial: string };
}

const mailsTo = (email: string, subject: RegExp) => app.mail.messages.filter((m) => m.to.includes(email.toLowerCase()) && subject.test(m.subject));
const notificationsOf = async (c: Client, q = '') => (await c.get(`/api/notifications${q}`)).body as { items: any[]; total: number; unread: number };
const openAlerts = (kind: string, recordId: string) =>
  app.db.select().from(alertsTable).where(and(eq(alertsTable.wineryId, wineryId), eq(alertsTable.kind, kind), eq(alertsTable.recordId, recordId)));

beforeAll(async () => {
  app = await startTestApp();
  const a = await signUp(app.baseUrl, { wineryName: 'Alert Hill Winery' });
  owner = a.client;
  ownerEmail = a.email;
  wineryId = a.me.activeWineryId!;
  for (const role of ['technician', 'cellar-master', 'winemaker', 'auditor'] as const) {
    const m = await addMember(app, owner, role);
    people[role] = { client: m.client, email: m.email };
  }
  other = (await signUp(app.baseUrl, { wineryName: 'Elsewhere Cellars' })).client;
  membraneTypeId = (await insertCartridgeType(app.db, wineryId, { name: 'PES 0.45 alerts', bubblePointMinBar: 3.2, diffusionMaxMlMinPer10in: 15, ratedHotWaterCycles: 10 })).id;
});
afterAll(async () => {
  await app?.close();
});

describe('a failed integrity test', () => {
  let cartridge: { id: string; serial: string };
  it('raises one alert, one mail to each person whose role gets it, and an in-app notice by preference', async () => {
    cartridge = await registered(owner, membraneTypeId);
    const res = await people.technician.client.post(`/api/cartridges/${cartridge.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.5, wettingFluid: 'water' });
    expect(res.status).toBe(201);
    expect(res.body.pass).toBe(false);
    const subject = new RegExp(`Integrity test failed on ${cartridge.serial}`);
    // Owner, cellar master and technician by e-mail (role defaults); winemaker in the app; auditor nothing.
    for (const email of [ownerEmail, people['cellar-master'].email, people.technician.email]) await app.mail.waitFor(email, { subject, timeoutMs: 10_000 });
    const mail = mailsTo(ownerEmail, subject)[0];
    expect(mail.subject).toContain('[Alert Hill Winery]');
    expect(mail.text).toContain('Re-wet and re-test the membrane before filtering; do not bottle through it.');
    expect(mail.text).toContain(`${app.baseUrl}/cartridges/${cartridge.id}`);
    expect(mail.text).toContain(`${app.baseUrl}/settings#alert-preferences`);
    expect(mail.html).toContain('<a href=');
    const n = await notificationsOf(owner);
    const item = n.items.find((i) => i.record.id === cartridge.id);
    expect(item).toMatchObject({ kind: 'integrity-failed', severity: 'critical', link: `/cartridges/${cartridge.id}`, readAt: null, clearedAt: null });
    expect(item.nextStep).toMatch(/do not bottle through it/);
    expect((await notificationsOf(people.winemaker.client)).items.some((i) => i.record.id === cartridge.id)).toBe(true);
    expect(mailsTo(people.winemaker.email, subject)).toHaveLength(0);
    expect((await notificationsOf(people.auditor.client)).items.some((i) => i.record.id === cartridge.id)).toBe(false);
  });

  it('a second failure of the same cartridge raises nothing new', async () => {
    await people.technician.client.post(`/api/cartridges/${cartridge.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.4, wettingFluid: 'water' });
    await app.alerts.idle();
    await app.alerts.evaluate(wineryId);
    await jobsSettled(app); // any (wrong) second mail is in the outbox by now
    expect(await openAlerts('integrity-failed', cartridge.id)).toHaveLength(1);
    expect(mailsTo(ownerEmail, new RegExp(`Integrity test failed on ${cartridge.serial}`))).toHaveLength(1);
  });

  it('clears itself on a passing re-test; a later failure is a new alert', async () => {
    await people.technician.client.post(`/api/cartridges/${cartridge.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.6, wettingFluid: 'water' });
    await app.alerts.idle();
    const rows = await openAlerts('integrity-failed', cartridge.id);
    expect(rows).toHaveLength(1);
    expect(rows[0].clearedAt).toBeInstanceOf(Date);
    const item = (await notificationsOf(owner)).items.find((i) => i.record.id === cartridge.id);
    expect(item.clearedAt).toEqual(expect.any(String));
    await people.technician.client.post(`/api/cartridges/${cartridge.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.0, wettingFluid: 'water' });
    await until('a second alert', async () => (await openAlerts('integrity-failed', cartridge.id)).length === 2);
    await until('a second mail', async () => mailsTo(ownerEmail, new RegExp(`Integrity test failed on ${cartridge.serial}`)).length === 2);
  });

  it('marks one read and all read; the unread count follows', async () => {
    const before = await notificationsOf(owner);
    expect(before.unread).toBeGreaterThan(0);
    const first = before.items[0];
    expect((await owner.post(`/api/notifications/${first.id}/read`)).status).toBe(204);
    expect((await notificationsOf(owner)).unread).toBe(before.unread - 1);
    expect((await notificationsOf(owner, '?unread=true')).items.some((i) => i.id === first.id)).toBe(false);
    const all = await owner.post('/api/notifications/read-all');
    expect(all.status).toBe(200);
    expect((await notificationsOf(owner)).unread).toBe(0);
    expect((await owner.get('/api/notifications?page=0')).status).toBe(400);
    expect((await owner.get('/api/notifications?unread=maybe')).body.error.fields).toHaveProperty('unread');
  });

  it('another winery sees none of these alerts and gets 404 for their ids', async () => {
    const mine = (await notificationsOf(owner)).items[0];
    const theirs = await notificationsOf(other);
    expect(theirs.items.some((i) => i.alertId === mine.alertId)).toBe(false);
    expect((await other.post(`/api/notifications/${mine.id}/read`)).status).toBe(404);
    // Nor may a colleague mark someone else's notice.
    expect((await people.technician.client.post(`/api/notifications/${mine.id}/read`)).status).toBe(404);
    expect((await other.post('/api/notifications/not-a-uuid/read')).status).toBe(404);
  });
});

describe('a cartridge near the end of its rated life', () => {
  it('raises one alert at 90 % of a rated budget, and another at 100 %', async () => {
    const c = await registered(owner, membraneTypeId);
    for (let i = 0; i < 8; i++) expect((await people.technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 })).status).toBe(201);
    await app.alerts.idle();
    expect(await openAlerts('cartridge-end-of-life', c.id)).toHaveLength(0);
    await people.technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 });
    const rows = await until('the 90 % alert', async () => {
      const r = await openAlerts('cartridge-end-of-life', c.id);
      return r.length ? r : null;
    });
    expect(rows).toMatchObject([{ threshold: 'budget:hot-water cycles:90', severity: 'warning' }]);
    await app.mail.waitFor(people['cellar-master'].email, { subject: new RegExp(`${c.serial}: 90 % of rated hot-water cycles used`) });
    await people.technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 });
    await until('the 100 % alert', async () => (await openAlerts('cartridge-end-of-life', c.id)).some((r) => r.threshold.endsWith(':100')));
    // The technician does not get cartridge-life alerts by default.
    expect(mailsTo(people.technician.email, new RegExp(c.serial))).toHaveLength(0);
  });
});

describe('a care cycle above the rating', () => {
  it('raises an alert until a passing integrity test after it', async () => {
    const type = await insertCartridgeType(app.db, wineryId, { name: `PES hot ${Date.now()}`, maxTempC: 85, bubblePointMinBar: 3.2 });
    const c = await registered(owner, type.id);
    expect((await people.technician.client.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 84, durationMin: 20 })).status).toBe(201);
    await app.alerts.idle();
    expect(await openAlerts('care-over-temperature', c.id)).toHaveLength(0);
    // The maker's rating is corrected downwards in the catalogue: the logged 84 °C is now above it.
    await app.db.update(cartridgeTypesTable).set({ maxTempC: 80 }).where(eq(cartridgeTypesTable.id, type.id));
    await app.alerts.evaluate(wineryId);
    const [hot] = await openAlerts('care-over-temperature', c.id);
    expect(hot.title).toMatch(/cleaned at 84 °C, above its 80 °C rating/);
    expect(hot.nextStep).toMatch(/integrity test/);
    await people.technician.client.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.6, wettingFluid: 'water' });
    await app.alerts.idle();
    expect((await openAlerts('care-over-temperature', c.id))[0].clearedAt).toBeInstanceOf(Date);
  });
});

describe('an approved plan', () => {
  it('short of cartridges raises a stock alert on approval, and a lot not ready two days before; stock received clears it', async () => {
    const w = await createPlanWorld(owner);
    const inTwoDays = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
    const plan = await createPlan(owner, w.lineId, { plannedDate: inTwoDays });
    const withLot = await addPlanLot(owner, plan.id, w.lotId);
    const planLotId = withLot.lots[0].id;
    const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
    await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id });
    const approved = await people['cellar-master'].client.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' });
    expect(approved.status).toBe(200);
    expect(approved.body.needs.some((n: { shortfall: number }) => n.shortfall > 0)).toBe(true);
    const [short] = await until('the stock alert', async () => {
      const r = await openAlerts('stock-short', plan.id);
      return r.length ? r : null;
    });
    expect(short).toMatchObject({ severity: 'critical', link: `/plans/${plan.id}` }); // two days away: within the 10-day lead time
    expect(short.nextStep).toMatch(/Order the missing cartridges today/);
    await app.mail.waitFor(ownerEmail, { subject: new RegExp(`${plan.name} is short of cartridges`) });
    const [notReady] = await until('the lot alert', async () => {
      const r = await openAlerts('lot-not-ready', w.lotId);
      return r.length ? r : null;
    });
    expect(notReady).toMatchObject({ link: `/cellar/lots/${w.lotId}` });
    expect(notReady.nextStep).toMatch(/sample/);

    // Stock received: register what the train needs, then the next evaluation clears the alert.
    for (const need of approved.body.needs as { cartridgeTypeId: string; lengthIn: number; shortfall: number }[]) {
      for (let i = 0; i < need.shortfall; i++) {
        const r = await owner.post('/api/cartridges', { serial: `${prefix}-S${String(++seq).padStart(4, '0')}`, batch: 'B2', typeId: need.cartridgeTypeId, lengthIn: need.lengthIn, receivedAt: '2025-01-05' });
        expect(r.status).toBe(201);
      }
    }
    await app.alerts.idle();
    await app.alerts.evaluate(wineryId);
    const after = await openAlerts('stock-short', plan.id);
    expect(after).toHaveLength(1);
    expect(after[0].clearedAt).toBeInstanceOf(Date);
    expect(mailsTo(ownerEmail, new RegExp(`${plan.name} is short of cartridges`))).toHaveLength(1);
  });
});

describe('a running run', () => {
  it('raises a terminal-ΔP alarm and a flat-ΔP alarm at once, does not repeat a worsening within 30 minutes, and clears on close', async () => {
    const w = await createPlanWorld(owner);
    await fillTrainHousings(owner, w);
    const plan = await createPlan(owner, w.lineId, { plannedDate: '2031-05-05' });
    const withLot = await addPlanLot(owner, plan.id, w.lotId, 6000);
    const planLotId = withLot.lots[0].id;
    const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
    await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id });
    expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
    const run = await people.technician.client.post('/api/runs', { planLotId });
    expect(run.status).toBe(201);
    const runId = run.body.id as string;
    const log = (stageIndex: number, volumeL: number, dpBar: number) =>
      people.technician.client.post(`/api/runs/${runId}/readings`, { clientKey: `${stageIndex}-${volumeL}-${dpBar}`, stageIndex, volumeL, upstreamBar: 2 + dpBar, downstreamBar: 2 });
    // Stage 1 (prefilter) climbs fast towards its 1.5 bar terminal ΔP; stage 2 (membrane) stays flat.
    for (const [v, dp] of [[500, 0.2], [1000, 0.5], [1500, 0.85], [2000, 1.2]] as const) expect((await log(0, v, dp)).status).toBe(201);
    for (const [v, dp] of [[500, 0.3], [1000, 0.3], [1500, 0.31], [2000, 0.3]] as const) expect((await log(1, v, dp)).status).toBe(201);
    const detail = (await owner.get(`/api/runs/${runId}`)).body;
    expect(detail.stages[0].alarm.alarm).toBe(true);
    const [terminal] = await until('the terminal ΔP alarm', async () => {
      const r = await openAlerts('run-terminal-dp', runId);
      return r.length ? r : null;
    });
    expect(terminal).toMatchObject({ threshold: 'stage:0', severity: 'critical', link: `/runs/${runId}` });
    expect(terminal.title).toMatch(/will block \d+ L before/);
    const [flat] = await until('the flat ΔP alarm', async () => {
      const r = await openAlerts('stage-flat-dp', runId);
      return r.length ? r : null;
    });
    expect(flat).toMatchObject({ threshold: 'stage:1' });
    expect(flat.nextStep).toMatch(/integrity test/);
    await app.mail.waitFor(people.technician.email, { subject: /will block/ });
    await app.mail.waitFor(people.technician.email, { subject: /ΔP flat over/ });

    // Worse, but within 30 minutes of the first notice: the alert stays, no second mail.
    expect((await log(0, 2010, 1.48)).status).toBe(201);
    await app.alerts.idle();
    expect(mailsTo(people.technician.email, /will block/)).toHaveLength(1);
    // Half an hour later (the sweep's clock), still worse: noticed again, once.
    await app.alerts.evaluate(wineryId, new Date(Date.now() + 31 * 60_000));
    await until('the second notice', async () => mailsTo(people.technician.email, /will block/).length === 2);
    expect(await openAlerts('run-terminal-dp', runId)).toHaveLength(1);

    expect((await people.technician.client.post(`/api/runs/${runId}/close`, {})).status).toBe(200);
    await app.alerts.idle();
    const closed = [...(await openAlerts('run-terminal-dp', runId)), ...(await openAlerts('stage-flat-dp', runId))];
    expect(closed.every((a) => a.clearedAt instanceof Date)).toBe(true);
  });
});

describe('preferences', () => {
  it('show the role defaults, take a personal choice, and refuse bad input with field messages', async () => {
    const tech = (await people.technician.client.get('/api/me/alert-preferences')).body.items as { kind: string; channel: string; roleDefault: string }[];
    expect(tech.find((i) => i.kind === 'integrity-failed')).toMatchObject({ channel: 'email', roleDefault: 'email' });
    expect(tech.find((i) => i.kind === 'stock-short')).toMatchObject({ channel: 'off' });
    const aud = (await people.auditor.client.get('/api/me/alert-preferences')).body.items as { channel: string }[];
    expect(aud.every((i) => i.channel === 'off')).toBe(true);
    const bad = await owner.put('/api/me/alert-preferences', { items: [{ kind: 'integrity-failed', channel: 'pigeon' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('items.0.channel');
    expect((await owner.put('/api/me/alert-preferences', { items: [{ kind: 'no-such', channel: 'app' }] })).status).toBe(400);
  });

  it('a digest collects instead of sending, and goes at 07:00 in the winery time zone', async () => {
    const zone = 'Pacific/Auckland';
    expect((await owner.put('/api/settings/winery', { timeZone: zone })).body).toMatchObject({ timeZone: zone, orderLeadTimeDays: 10 });
    expect((await owner.put('/api/settings/winery', { timeZone: 'Mars/Olympus' })).status).toBe(400);
    const put = await owner.put('/api/me/alert-preferences', { items: [{ kind: 'integrity-failed', channel: 'digest' }] });
    expect(put.status).toBe(200);
    expect(put.body.items.find((i: { kind: string }) => i.kind === 'integrity-failed').channel).toBe('digest');

    const c = await registered(owner, membraneTypeId);
    await people.technician.client.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.1, wettingFluid: 'water' });
    const subject = new RegExp(`Integrity test failed on ${c.serial}`);
    await app.mail.waitFor(people.technician.email, { subject, timeoutMs: 10_000 });
    await app.alerts.idle();
    await jobsSettled(app);
    expect(mailsTo(ownerEmail, subject)).toHaveLength(0); // collected for the digest
    expect((await notificationsOf(owner)).items.some((i) => i.record.id === c.id)).toBe(true);

    // 2025-01-14 18:30 UTC is 07:30 on the 15th in Auckland (NZDT, UTC+13); 12:00 UTC is 01:00 there.
    expect(await app.alerts.digest(Date.UTC(2025, 0, 14, 12, 0), wineryId)).toBe(0);
    await app.queue.enqueue(ALERTS_DIGEST_QUEUE, { nowMs: Date.UTC(2025, 0, 14, 18, 30), wineryId });
    const digest = await app.mail.waitFor(ownerEmail, { subject: /daily digest/, timeoutMs: 10_000 });
    expect(digest.subject).toContain('[Alert Hill Winery]');
    expect(digest.text).toContain(`Integrity test failed on ${c.serial}`);
    expect(digest.text).toContain('2025-01-15, Pacific/Auckland');
    expect(digest.text).toContain(`${app.baseUrl}/settings#alert-preferences`);
    // Sent once: a second run in the same hour finds nothing new.
    expect(await app.alerts.digest(Date.UTC(2025, 0, 14, 18, 40), wineryId)).toBe(0);
    await owner.put('/api/me/alert-preferences', { items: [] });
  });
});

describe('mail delivery', () => {
  it('retries a mail the SMTP server refuses twice, with back-off, and delivers it once', async () => {
    await app.alerts.idle();
    await until('an empty mail queue', async () => (await app.queue.boss.getQueueSize('mail')) === 0 || null);
    app.mail.refuseNext(2);
    const before = app.mail.refused;
    const email = `retry-${Date.now()}@example.test`;
    const inv = await owner.post('/api/team/invitations', { email, role: 'winemaker' });
    expect(inv.status).toBe(201);
    const mail = await app.mail.waitFor(email, { timeoutMs: 20_000 });
    expect(app.mail.refused - before).toBe(2);
    expect(mail.subject).toMatch(/invited you to Alert Hill Winery/);
    // The very job of this mail was retried twice, then completed (once the queue has settled:
    // the mail can arrive a moment before its job is marked done).
    await jobsSettled(app);
    const { rows } = await app.pool.query(`select retry_count, state from ${app.queue.schema}.job where name = 'mail' and data->>'to' = $1`, [email]);
    expect(rows).toEqual([{ retry_count: 2, state: 'completed' }]);
    expect(mailsTo(email, /invited you/)).toHaveLength(1);
  });

  it('keeps mail that fails its last retry for the owners, who resend it', async () => {
    const strict = await startTestApp({ mailRetryLimit: 1 });
    try {
      const s = await signUp(strict.baseUrl, { wineryName: 'Strict Mail Winery' });
      const tech = await addMember(strict, s.client, 'technician');
      strict.mail.refuseNext(2);
      const email = `lost-${Date.now()}@example.test`;
      expect((await s.client.post('/api/team/invitations', { email, role: 'auditor' })).status).toBe(201);
      const failures = await until(
        'a kept failure',
        async () => {
          const r = await s.client.get('/api/settings/mail-failures');
          return r.body.items.length ? r.body.items : null;
        },
        20_000,
      );
      expect(failures[0]).toMatchObject({ to: email, attempts: 2, resentAt: null });
      expect(failures[0].error).toMatch(/try again later/);
      expect((await tech.client.get('/api/settings/mail-failures')).status).toBe(403);
      expect((await tech.client.post(`/api/settings/mail-failures/${failures[0].id}/resend`)).status).toBe(403);
      const stranger = (await signUp(strict.baseUrl, { wineryName: 'Nosy Winery' })).client;
      expect((await stranger.get('/api/settings/mail-failures')).body.items).toEqual([]);
      expect((await stranger.post(`/api/settings/mail-failures/${failures[0].id}/resend`)).status).toBe(404);
      expect((await s.client.post(`/api/settings/mail-failures/${failures[0].id}/resend`)).status).toBe(202);
      await strict.mail.waitFor(email, { timeoutMs: 10_000 });
      expect((await s.client.get('/api/settings/mail-failures')).body.items[0].resentAt).toEqual(expect.any(String));
    } finally {
      await strict.close();
    }
  });
});

describe('calendars', () => {
  it('a plan day as .ics with each step at the winery time zone, read back by an iCalendar parser; another winery 404', async () => {
    await owner.put('/api/settings/winery', { timeZone: 'America/Los_Angeles' });
    const w = await createPlanWorld(owner);
    const plan = await createPlan(owner, w.lineId, { plannedDate: '2031-07-10', startTime: '07:00', sanitationKind: 'steam' });
    const withLot = await addPlanLot(owner, plan.id, w.lotId);
    const planLotId = withLot.lots[0].id;
    const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
    const chosen = await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id });
    const blocks = chosen.body.timeline.blocks as { kind: string; label: string }[];
    const res = await people.auditor.client.get(`/api/plans/${plan.id}/calendar`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/calendar/);
    const events = Object.values(ical.sync.parseICS(res.text)).filter((e) => e.type === 'VEVENT') as ical.VEvent[];
    expect(events).toHaveLength(blocks.length);
    const first = events.sort((a, b) => +a.start - +b.start)[0];
    // 07:00 in Los Angeles on 10 July (PDT, UTC−7) is 14:00 UTC.
    expect(new Date(first.start).toISOString()).toBe('2031-07-10T14:00:00.000Z');
    expect(String(first.summary)).toMatch(/Sanitation|sanitation/);
    expect(String(first.description)).toMatch(/Steam: burns and pressure/);
    expect(events.some((e) => /Push-out|push-out/i.test(String(e.summary)))).toBe(true);
    expect((await other.get(`/api/plans/${plan.id}/calendar`)).status).toBe(404);
    await owner.put('/api/settings/winery', { timeZone: 'UTC' });
  });

  it('a private feed of approved days at a secret URL; rotating it stops the old one', async () => {
    const w = await createPlanWorld(owner);
    const plan = await createPlan(owner, w.lineId, { plannedDate: '2031-08-01' });
    const withLot = await addPlanLot(owner, plan.id, w.lotId);
    const planLotId = withLot.lots[0].id;
    const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
    await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id });
    const draftOnly = await createPlan(owner, w.lineId, { plannedDate: '2031-08-02' });
    expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);

    const feed = await people.technician.client.post('/api/me/calendar-feed');
    expect(feed.status).toBe(201);
    const url = new URL(feed.body.url);
    const anonymous = new Client(app.baseUrl, null);
    const read = await anonymous.get(url.pathname);
    expect(read.status).toBe(200);
    const events = Object.values(ical.sync.parseICS(read.text)).filter((e) => e.type === 'VEVENT') as ical.VEvent[];
    expect(events.some((e) => String(e.uid).startsWith(plan.id))).toBe(true);
    expect(events.some((e) => String(e.uid).startsWith(draftOnly.id))).toBe(false);
    // Someone in another winery never sees these days in their feed.
    const theirs = await other.post('/api/me/calendar-feed');
    const theirEvents = Object.values(ical.sync.parseICS((await anonymous.get(new URL(theirs.body.url).pathname)).text)).filter((e) => e.type === 'VEVENT');
    expect(theirEvents).toHaveLength(0);

    const rotated = await people.technician.client.post('/api/me/calendar-feed');
    expect(rotated.body.url).not.toBe(feed.body.url);
    expect((await anonymous.get(url.pathname)).status).toBe(404);
    expect((await anonymous.get(new URL(rotated.body.url).pathname)).status).toBe(200);
    expect((await anonymous.get('/api/calendar/short')).status).toBe(404);
  });
});
