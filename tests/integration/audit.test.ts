// @vitest-environment node
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { and, desc, eq, getTableName, sql } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEventsTable } from '../../server/db/schema';
import { neutraliseCell, toCsv } from '../../server/lib/csv';
import { fieldChanges } from '../../server/modules/audit/audit-diff';
import { exportTables, notExported } from '../../server/modules/export/export.repository';
import type { Role } from '../../shared/permissions';
import { deliveryCsv, serialPrefix } from '../factories/cartridges';
import { createLot, createTank, labResultBody, lotBody, tankBody } from '../factories/cellar';
import { cartridgeTypeInput, housingInput, lineInput } from '../factories/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, planBody, trainBody, type PlanWorld } from '../factories/plans';
import { addMember, signUp, startTestApp, uniqueEmail, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let wineryId: string;
let ownerId: string;
let other: Client;
let otherWineryId: string;
let world: PlanWorld;
const members = {} as Record<Exclude<Role, 'owner'>, { client: Client; userId: string }>;

const pdf = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n%%EOF\n');

beforeAll(async () => {
  app = await startTestApp({ withStorage: true });
  const signed = await signUp(app.baseUrl, { name: 'Ana Audit', wineryName: 'Audit Test Winery' });
  owner = signed.client;
  wineryId = signed.me.activeWineryId!;
  ownerId = signed.me.user.id;
  const second = await signUp(app.baseUrl, { wineryName: 'Other Audit Winery' });
  other = second.client;
  otherWineryId = second.me.activeWineryId!;
  for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
    const m = await addMember(app, owner, role);
    members[role] = { client: m.client, userId: m.userId };
  }
  world = await createPlanWorld(owner);
});
afterAll(async () => {
  await app?.close();
});

async function eventCount(winery = wineryId) {
  const [{ n }] = await app.db.select({ n: sql<number>`cast(count(*) as int)` }).from(auditEventsTable).where(eq(auditEventsTable.wineryId, winery));
  return n;
}
async function latestEvents(n: number) {
  return app.db.select().from(auditEventsTable).where(eq(auditEventsTable.wineryId, wineryId)).orderBy(desc(auditEventsTable.at), desc(auditEventsTable.id)).limit(n);
}

async function upload(client: Client, fields: Record<string, string>, file: { name: string; bytes: Uint8Array; type: string }) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set('file', new Blob([file.bytes.slice()], { type: file.type }), file.name);
  const headers: Record<string, string> = { origin: client.baseUrl, cookie: [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') };
  const res = await fetch(`${client.baseUrl}/api/attachments`, { method: 'POST', headers, body: form });
  return { status: res.status, body: await res.json().catch(() => null), text: '' };
}

type Res = { status: number; body: any; text: string };
type Case = {
  name: string;
  run: () => Promise<Res>;
  status: number;
  kind: string;
  action: string;
  /** The record the event names (from the answer or the test's state). */
  id: (res: Res) => string;
  /** Fields the event must list as changed. */
  changed?: string[];
};

const state: Record<string, string> = {};

describe('the change log: one event per change, in the same transaction', () => {
  const cases: Case[] = [
    { name: 'create a tank', run: () => owner.post('/api/tanks', tankBody({ name: `Audit tank ${serialPrefix()}` })), status: 201, kind: 'tank', action: 'create', id: (r) => (state.tank = r.body.id), changed: ['name', 'capacityL'] },
    { name: 'update a tank', run: () => owner.put(`/api/tanks/${state.tank}`, tankBody({ name: `Audit tank renamed ${serialPrefix()}`, capacityL: 9000 })), status: 200, kind: 'tank', action: 'update', id: () => state.tank, changed: ['name', 'capacityL'] },
    { name: 'create a lot', run: () => owner.post('/api/lots', lotBody()), status: 201, kind: 'lot', action: 'create', id: (r) => (state.lot = r.body.id) },
    { name: 'update a lot', run: async () => owner.put(`/api/lots/${state.lot}`, lotBody({ code: (await owner.get(`/api/lots/${state.lot}`)).body.code, name: 'Renamed in audit', volumeL: 4321 })), status: 200, kind: 'lot', action: 'update', id: () => state.lot, changed: ['name', 'volumeL'] },
    { name: 'add a lab result', run: () => members.winemaker.client.post(`/api/lots/${state.lot}/lab-results`, labResultBody()), status: 201, kind: 'lab-result', action: 'create', id: (r) => (state.lab = r.body.id) },
    { name: 'update a lab result', run: () => members.winemaker.client.put(`/api/lots/${state.lot}/lab-results/${state.lab}`, labResultBody({ turbidityNtu: 0.9 })), status: 200, kind: 'lab-result', action: 'update', id: () => state.lab, changed: ['turbidityNtu'] },
    { name: 'delete a lab result', run: () => owner.delete(`/api/lots/${state.lot}/lab-results/${state.lab}`), status: 204, kind: 'lab-result', action: 'delete', id: () => state.lab },
    { name: 'create a housing', run: () => owner.post('/api/housings', housingInput()), status: 201, kind: 'housing', action: 'create', id: (r) => (state.housing = r.body.id) },
    { name: 'update a housing', run: () => owner.patch(`/api/housings/${state.housing}`, { maxPressureBar: 7 }), status: 200, kind: 'housing', action: 'update', id: () => state.housing, changed: ['maxPressureBar'] },
    { name: 'delete a housing', run: () => owner.delete(`/api/housings/${state.housing}`), status: 204, kind: 'housing', action: 'delete', id: () => state.housing },
    { name: 'create a line', run: () => owner.post('/api/lines', lineInput()), status: 201, kind: 'line', action: 'create', id: (r) => (state.line = r.body.id) },
    { name: 'update a line', run: () => owner.patch(`/api/lines/${state.line}`, { bottlesPerHour: 2500 }), status: 200, kind: 'line', action: 'update', id: () => state.line, changed: ['bottlesPerHour'] },
    { name: 'delete a line', run: () => owner.delete(`/api/lines/${state.line}`), status: 204, kind: 'line', action: 'delete', id: () => state.line },
    { name: 'create a cartridge type', run: () => owner.post('/api/cartridge-types', cartridgeTypeInput()), status: 201, kind: 'cartridge-type', action: 'create', id: (r) => (state.type = r.body.id) },
    { name: 'update a cartridge type', run: () => owner.patch(`/api/cartridge-types/${state.type}`, { terminalDpBar: 1.8 }), status: 200, kind: 'cartridge-type', action: 'update', id: () => state.type, changed: ['terminalDpBar'] },
    { name: 'register a cartridge', run: () => owner.post('/api/cartridges', { serial: `${serialPrefix()}-A`, batch: 'B1', typeId: world.membraneTypeId, lengthIn: 30 }), status: 201, kind: 'cartridge', action: 'register', id: (r) => (state.cartridge = r.body.id) },
    { name: 'edit a cartridge', run: () => owner.patch(`/api/cartridges/${state.cartridge}`, { batch: 'B2' }), status: 200, kind: 'cartridge', action: 'update', id: () => state.cartridge, changed: ['batch'] },
    { name: 'install a cartridge', run: () => members.technician.client.post(`/api/cartridges/${state.cartridge}/install`, { housingId: world.weakHousingId }), status: 200, kind: 'cartridge', action: 'install', id: () => state.cartridge, changed: ['status', 'housingId', 'position'] },
    { name: 'log a care cycle', run: () => members.technician.client.post(`/api/cartridges/${state.cartridge}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 }), status: 201, kind: 'care-cycle', action: 'create', id: (r) => r.body.event.id },
    { name: 'record an integrity test', run: () => members.technician.client.post(`/api/cartridges/${state.cartridge}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.6, wettingFluid: 'water' }), status: 201, kind: 'integrity-test', action: 'create', id: (r) => r.body.event.id },
    { name: 'remove a cartridge', run: () => members.technician.client.post(`/api/cartridges/${state.cartridge}/remove`), status: 200, kind: 'cartridge', action: 'remove', id: () => state.cartridge, changed: ['status'] },
    { name: 'retire a cartridge', run: () => owner.post(`/api/cartridges/${state.cartridge}/retire`, { reason: 'Failed flow recovery' }), status: 200, kind: 'cartridge', action: 'retire', id: () => state.cartridge, changed: ['status', 'retiredReason'] },
    { name: 'create a plan', run: () => owner.post('/api/plans', planBody(world.lineId)), status: 201, kind: 'plan', action: 'create', id: (r) => (state.plan = r.body.id) },
    { name: 'edit a plan (add a lot)', run: () => owner.post(`/api/plans/${state.plan}/lots`, { lotId: world.lotId, volumeL: 6000 }), status: 201, kind: 'plan', action: 'update', id: () => state.plan, changed: ['lots'] },
    { name: 'update the winery settings', run: async () => owner.put('/api/settings/winery', { name: 'Audit Test Winery (renamed)' }), status: 200, kind: 'settings', action: 'update', id: () => wineryId, changed: ['name'] },
    { name: 'attach a file', run: () => upload(members.technician.client, { ownerKind: 'lot', ownerId: state.lot }, { name: 'report.pdf', bytes: pdf, type: 'application/pdf' }), status: 201, kind: 'attachment', action: 'create', id: (r) => (state.attachment = r.body.id) },
    { name: 'delete a file', run: () => owner.delete(`/api/attachments/${state.attachment}`), status: 204, kind: 'attachment', action: 'delete', id: () => state.attachment },
    { name: 'invite a person', run: () => owner.post('/api/team/invitations', { email: (state.email = uniqueEmail('audit')), role: 'technician' }), status: 201, kind: 'invitation', action: 'invite', id: (r) => (state.invitation = r.body.id) },
    { name: 'revoke an invitation', run: () => owner.delete(`/api/team/invitations/${state.invitation}`), status: 204, kind: 'invitation', action: 'revoke', id: () => state.invitation, changed: ['revokedAt'] },
    { name: 'change a role', run: () => owner.patch(`/api/team/${members.winemaker.userId}`, { role: 'cellar-master' }), status: 200, kind: 'member', action: 'update', id: () => members.winemaker.userId, changed: ['role'] },
    { name: 'change the role back', run: () => owner.patch(`/api/team/${members.winemaker.userId}`, { role: 'winemaker' }), status: 200, kind: 'member', action: 'update', id: () => members.winemaker.userId, changed: ['role'] },
    { name: 'delete a lot', run: async () => owner.delete(`/api/lots/${(await createLot(owner)).id}`), status: 204, kind: 'lot', action: 'delete', id: () => '' },
    { name: 'delete a tank', run: () => owner.delete(`/api/tanks/${state.tank}`), status: 204, kind: 'tank', action: 'delete', id: () => state.tank },
  ];

  it.each(cases.map((c) => [c.name, c] as const))('%s → one event', async (_name, c) => {
    const res = await c.run();
    expect(res.status, res.text).toBe(c.status);
    const [event] = await latestEvents(1);
    expect(event).toMatchObject({ recordKind: c.kind, action: c.action });
    const id = c.id(res);
    if (id) expect(event.recordId).toBe(id);
    expect(event.userName).not.toBe('');
    for (const field of c.changed ?? []) expect(Object.keys(event.changes ?? {}), `${c.name}: ${field}`).toContain(field);
  });

  it('an update stores each changed field as before → after, and the person’s name at the time', async () => {
    const tank = await createTank(owner, { name: `Diff tank ${serialPrefix()}`, capacityL: 5000 });
    expect((await owner.put(`/api/tanks/${tank.id}`, tankBody({ name: tank.name, capacityL: 6000, notes: 'Relined' }))).status).toBe(200);
    const [event] = await latestEvents(1);
    expect(event.changes).toEqual({ capacityL: { before: 5000, after: 6000 }, notes: { before: '', after: 'Relined' } });
    expect(event.userName).toBe('Ana Audit');
    expect(event.userId).toBe(ownerId);
    expect(event.recordLabel).toBe(tank.name);
  });

  it('imports write one event per cartridge; a plan’s approve, reopen, done; a run’s start and close', async () => {
    const prefix = serialPrefix();
    const typeName = (await owner.get(`/api/cartridge-types/${world.prefilterTypeId}`)).body.name;
    const before = await eventCount();
    const imported = await owner.request('POST', '/api/cartridges/import', deliveryCsv([[`${prefix}-1`, 'D1', typeName, 30, '2026-01-10'], [`${prefix}-2`, 'D1', typeName, 30, '2026-01-10']]), {
      'content-type': 'text/csv',
    });
    expect(imported.status, imported.text).toBe(201);
    expect(await eventCount()).toBe(before + 2);
    const events = await latestEvents(2);
    expect(events.map((e) => e.action)).toEqual(['import', 'import']);
    expect(events.map((e) => e.recordId).sort()).toEqual([...imported.body.cartridgeIds].sort());

    await fillTrainHousings(owner, world);
    const plan = await createPlan(owner, world.lineId);
    const withLot = await addPlanLot(owner, plan.id, world.secondLotId, 3000);
    const planLotId = withLot.lots[0].id;
    const withTrain = await addTrain(owner, plan.id, planLotId, trainBody(world));
    expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: withTrain.lots[0].trains[0].id })).status).toBe(200);
    const steps: [() => Promise<Res>, string, string][] = [
      [() => owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' }), 'plan', 'approve'],
      [() => owner.post(`/api/plans/${plan.id}/reopen`), 'plan', 'reopen'],
      [() => owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' }), 'plan', 'approve'],
      [() => members.technician.client.post('/api/runs', { planLotId }), 'run', 'start'],
    ];
    for (const [step, kind, action] of steps) {
      const n = await eventCount();
      const res = await step();
      expect(res.status, res.text).toBeLessThan(300);
      expect(await eventCount()).toBe(n + 1);
      expect((await latestEvents(1))[0]).toMatchObject({ recordKind: kind, action });
      if (kind === 'run') state.run = res.body.id;
    }
    const n = await eventCount();
    // Readings are records in their own right (who, when) and are not logged one by one.
    expect((await members.technician.client.post(`/api/runs/${state.run}/readings`, { clientKey: crypto.randomUUID(), stageIndex: 0, volumeL: 100, upstreamBar: 2.1, downstreamBar: 2 })).status).toBe(201);
    expect(await eventCount()).toBe(n);
    const closed = await members.technician.client.post(`/api/runs/${state.run}/close`, { notes: 'Clean run' });
    expect(closed.status, closed.text).toBe(200);
    const [close] = await latestEvents(1);
    expect(close).toMatchObject({ recordKind: 'run', action: 'close', recordId: state.run, parentKind: 'plan', parentId: plan.id });
    expect(close.changes).toHaveProperty('status', { before: 'running', after: 'closed' });
    expect((await owner.post(`/api/plans/${plan.id}/done`)).status).toBe(200);
    expect((await latestEvents(1))[0]).toMatchObject({ recordKind: 'plan', action: 'done', changes: { status: { before: 'approved', after: 'done' } } });
  });

  it('a person joining by invitation is logged as joining, by themselves', async () => {
    const m = await addMember(app, owner, 'technician');
    const [event] = await latestEvents(1);
    expect(event).toMatchObject({ recordKind: 'member', action: 'join', recordId: m.userId, userId: m.userId, userName: 'Test technician' });
  });

  type Failing = { name: string; status: number; setup?: () => Promise<string>; run: (ctx: string) => Promise<Res> };
  const failing: Failing[] = [
    { name: '400: bad input', status: 400, run: () => owner.post('/api/tanks', { name: '', capacityL: -1 }) },
    { name: '400: an update with bad input', status: 400, run: () => owner.patch(`/api/housings/${world.prefilterHousingId}`, { rounds: -2 }) },
    { name: '403: an auditor changes nothing', status: 403, run: () => members.auditor.client.post('/api/tanks', tankBody()) },
    { name: '403: a technician may not edit a lot', status: 403, run: () => members.technician.client.put(`/api/lots/${world.lotId}`, lotBody()) },
    { name: '404: a missing tank', status: 404, run: () => owner.put('/api/tanks/00000000-0000-4000-8000-000000000000', tankBody()) },
    { name: '404: another winery’s lot', status: 404, run: () => other.put(`/api/lots/${world.lotId}`, lotBody()) },
    { name: '404: another winery deletes our plan', status: 404, setup: async () => (await createPlan(owner, world.lineId)).id, run: (id) => other.delete(`/api/plans/${id}`) },
    {
      name: '404: a lab result named under the wrong lot',
      status: 404,
      setup: async () => (await owner.post(`/api/lots/${world.lotId}/lab-results`, labResultBody())).body.id,
      run: (id) => owner.put(`/api/lots/${world.secondLotId}/lab-results/${id}`, labResultBody({ turbidityNtu: 3 })),
    },
    { name: '409: a duplicate tank name', status: 409, setup: async () => (await createTank(owner)).name, run: (name) => owner.post('/api/tanks', tankBody({ name })) },
    { name: '409: installing a retired cartridge', status: 409, run: () => owner.post(`/api/cartridges/${state.cartridge}/install`, { housingId: world.weakHousingId }) },
    { name: '409: approving a plan with no lots', status: 409, setup: async () => (await createPlan(owner, world.lineId)).id, run: (id) => owner.post(`/api/plans/${id}/approve`) },
  ];

  it.each(failing.map((f) => [f.name, f] as const))('none when the request fails (%s)', async (_name, f) => {
    const ctx = f.setup ? await f.setup() : '';
    const before = await eventCount();
    const otherBefore = await eventCount(otherWineryId);
    const res = await f.run(ctx);
    expect(res.status, res.text).toBe(f.status);
    expect(await eventCount()).toBe(before);
    expect(await eventCount(otherWineryId)).toBe(otherBefore);
  });
});

describe('append-only', () => {
  it('the database refuses UPDATE, DELETE and TRUNCATE of events, even by hand in SQL', async () => {
    const [event] = await latestEvents(1);
    await expect(app.pool.query(`update audit_events set user_name = 'someone else' where id = $1`, [event.id])).rejects.toThrow(/append-only/);
    await expect(app.pool.query(`delete from audit_events where id = $1`, [event.id])).rejects.toThrow(/append-only/);
    await expect(app.pool.query(`truncate audit_events`)).rejects.toThrow(/append-only/);
    await expect(app.db.update(auditEventsTable).set({ recordLabel: 'x' }).where(eq(auditEventsTable.id, event.id))).rejects.toThrow();
    const [still] = await app.db.select().from(auditEventsTable).where(and(eq(auditEventsTable.id, event.id)));
    expect(still).toEqual(event);
  });

  it('no route updates or deletes an event', async () => {
    const [event] = await latestEvents(1);
    for (const method of ['PUT', 'PATCH', 'DELETE', 'POST'] as const) {
      expect((await owner.request(method, `/api/audit/${event.id}`, method === 'DELETE' ? undefined : {})).status).toBe(404);
    }
    expect((await owner.request('DELETE', '/api/audit')).status).toBe(404);
  });
});

describe('GET /api/audit', () => {
  it('pages on the server, newest first, with the total', async () => {
    const total = await eventCount();
    const first = await owner.get('/api/audit?pageSize=5&page=1');
    expect(first.status).toBe(200);
    expect(first.body.total).toBe(total);
    expect(first.body.items).toHaveLength(5);
    const second = await owner.get('/api/audit?pageSize=5&page=2');
    expect(second.body.items).toHaveLength(5);
    const ids = [...first.body.items, ...second.body.items].map((e: { id: string }) => e.id);
    expect(new Set(ids).size).toBe(10);
    const times = [...first.body.items, ...second.body.items].map((e: { at: string }) => Date.parse(e.at));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
    expect(first.body.items[0]).not.toHaveProperty('wineryId');
  });

  it('filters by record kind, record, person, action and date range', async () => {
    const tank = await createTank(members['cellar-master'].client, { name: `Filter tank ${serialPrefix()}` });
    await members['cellar-master'].client.put(`/api/tanks/${tank.id}`, tankBody({ name: tank.name, capacityL: 7777 }));

    const byRecord = await owner.get(`/api/audit?kind=tank&recordId=${tank.id}`);
    expect(byRecord.body.items.map((e: { action: string }) => e.action)).toEqual(['update', 'create']);
    expect(byRecord.body.total).toBe(2);

    const byPerson = await owner.get(`/api/audit?userId=${members['cellar-master'].userId}&pageSize=100`);
    expect(byPerson.body.items.length).toBeGreaterThanOrEqual(2);
    expect(byPerson.body.items.every((e: { userId: string }) => e.userId === members['cellar-master'].userId)).toBe(true);

    const byAction = await owner.get('/api/audit?action=retire');
    expect(byAction.body.items.length).toBeGreaterThanOrEqual(1);
    expect(byAction.body.items.every((e: { action: string; recordKind: string }) => e.action === 'retire' && e.recordKind === 'cartridge')).toBe(true);

    const byKind = await owner.get('/api/audit?kind=plan&pageSize=100');
    expect(byKind.body.items.every((e: { recordKind: string }) => e.recordKind === 'plan')).toBe(true);

    const today = new Date().toISOString().slice(0, 10);
    const inRange = await owner.get(`/api/audit?from=${today}&to=${today}&kind=tank&recordId=${tank.id}`);
    expect(inRange.body.total).toBe(2);
    const past = await owner.get(`/api/audit?from=2020-01-01&to=2020-12-31`);
    expect(past.body).toEqual({ items: [], total: 0 });

    // A lot's history includes its lab results (events name the lot as their parent).
    const lotHistory = await owner.get(`/api/audit?kind=lot&recordId=${state.lot}`);
    expect(lotHistory.body.items.map((e: { recordKind: string }) => e.recordKind)).toEqual(expect.arrayContaining(['lot', 'lab-result', 'attachment']));
  });

  it('rejects bad filters with field messages (400)', async () => {
    for (const q of ['kind=wine', 'action=smash', 'from=yesterday', 'page=0', 'pageSize=1000', 'from=2026-02-01&to=2026-01-01']) {
      const res = await owner.get(`/api/audit?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.fields, q).toBeTruthy();
    }
  });

  it('every role reads the log of its own winery; another winery sees none of it', async () => {
    for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
      const res = await members[role].client.get('/api/audit?pageSize=1');
      expect(res.status, role).toBe(200);
      expect(res.body.total, role).toBeGreaterThan(0);
    }
    // Invitations are the owner's business: a technician does not see their events.
    const tech = await members.technician.client.get('/api/audit?kind=invitation');
    expect(tech.body.total).toBe(0);
    expect((await members.auditor.client.get('/api/audit?kind=invitation')).body.total).toBeGreaterThan(0);

    const foreign = await other.get(`/api/audit?kind=lot&recordId=${state.lot}`);
    expect(foreign.status).toBe(200);
    expect(foreign.body).toEqual({ items: [], total: 0 });
    const all = await other.get('/api/audit?pageSize=100');
    expect(all.body.items.every((e: { recordId: string }) => e.recordId !== state.lot)).toBe(true);
    expect((await new (owner.constructor as typeof Client)(app.baseUrl).get('/api/audit')).status).toBe(401);
  });

  it('lists the people who appear in the log', async () => {
    const res = await owner.get('/api/audit/people');
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual(expect.arrayContaining([{ userId: ownerId, userName: 'Ana Audit' }]));
  });
});

describe('GET /api/audit/csv', () => {
  it('parses back with papaparse, filtered like the list, with formula cells neutralised', async () => {
    const name = `=HYPERLINK("http://evil.test","x") ${serialPrefix()}`;
    const tank = await createTank(owner, { name, notes: '@SUM(1+1)' });
    await owner.put(`/api/tanks/${tank.id}`, tankBody({ name, capacityL: 1234, notes: '-2+3' }));
    const res = await owner.get(`/api/audit/csv?kind=tank&recordId=${tank.id}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="change-log-/);
    const parsed = Papa.parse<string[]>(res.text.trim(), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual(['at', 'person', 'person_id', 'action', 'record_kind', 'record_id', 'record', 'changes']);
    expect(rows).toHaveLength(2);
    expect(rows.map((r) => r[3])).toEqual(['Changed', 'Created']);
    expect(rows[0][6]).toBe(`'${name}`);
    expect(rows[0][7]).toContain('capacityL');
    for (const row of rows) for (const cell of row) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });

  it('writes numbers as numbers and neutralises every text cell starting with =, +, -, @, tab or CR', async () => {
    for (const bad of ['=1+1', '+1', '-1+2', '@A1', '\tx', '\rx']) expect(neutraliseCell(bad)).toBe(`'${bad}`);
    expect(neutraliseCell(-2.5)).toBe('-2.5');
    expect(neutraliseCell('Lot 12')).toBe('Lot 12');
    expect(neutraliseCell(null)).toBe('');
    expect(neutraliseCell(Number.NaN)).toBe('');
    const text = await toCsv(['a', 'b'], [['=cmd', -3], ['plain, with comma', 'line\nbreak']]);
    const back = Papa.parse<string[]>(text.trim()).data;
    expect(back).toEqual([['a', 'b'], ["'=cmd", '-3'], ['plain, with comma', 'line\nbreak']]);
  });

  it('another winery’s CSV holds none of ours; bad filters are 400', async () => {
    const res = await other.get(`/api/audit/csv?kind=lot&recordId=${state.lot}`);
    expect(res.status).toBe(200);
    expect(Papa.parse(res.text.trim()).data).toHaveLength(1);
    expect((await owner.get('/api/audit/csv?from=soon')).status).toBe(400);
  });
});

describe('the field diff', () => {
  it('lists only what changed, dates as ISO text, ignoring ids and bookkeeping', () => {
    const at = new Date('2026-01-02T03:04:05.000Z');
    expect(
      fieldChanges({ id: 'a', updatedAt: at, name: 'A', n: 1, d: at, j: { x: 1 } }, { id: 'a', updatedAt: new Date(), name: 'B', n: 1, d: at, j: { x: 2 } }),
    ).toEqual({ name: { before: 'A', after: 'B' }, j: { before: { x: 1 }, after: { x: 2 } } });
    expect(fieldChanges({ a: 1 }, { a: 1 })).toBeNull();
    expect(fieldChanges(null, { a: at })).toEqual({ a: { before: null, after: '2026-01-02T03:04:05.000Z' } });
  });
});

function hasUnzip() {
  try {
    execFileSync('unzip', ['-v'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

describe('GET /api/export/winery', () => {
  it('streams a zip that unzip lists: a CSV per kind of record, the attachments’ files and a manifest with counts and SHA-256', async () => {
    expect(hasUnzip(), 'unzip is needed (npm test installs it)').toBe(true);
    const up = await upload(owner, { ownerKind: 'lot', ownerId: state.lot }, { name: 'kept report.pdf', bytes: pdf, type: 'application/pdf' });
    expect(up.status).toBe(201);
    const res = await fetch(`${app.baseUrl}/api/export/winery`, { headers: { cookie: [...owner.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/zip');
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="porewise-audit-test-winery-renamed-\d{4}-\d{2}-\d{2}\.zip"/);
    const dir = mkdtempSync(join(tmpdir(), 'porewise-export-'));
    try {
      const zip = join(dir, 'export.zip');
      writeFileSync(zip, Buffer.from(await res.arrayBuffer()));
      const listing = execFileSync('unzip', ['-l', zip], { encoding: 'utf8' });
      const expected = [
        'tanks.csv', 'lots.csv', 'lab-results.csv', 'housings.csv', 'lines.csv', 'cartridge-types.csv', 'cartridges.csv', 'cartridge-events.csv',
        'care-cycles.csv', 'integrity-tests.csv', 'plans.csv', 'plan-lots.csv', 'plan-trains.csv', 'hose-presets.csv', 'runs.csv', 'run-cartridges.csv',
        'run-changes.csv', 'readings.csv', 'reading-corrections.csv', 'logger-imports.csv', 'logger-profiles.csv', 'attachments.csv',
        'audit-events.csv', 'members.csv', 'manifest.json',
      ];
      for (const file of expected) expect(listing, file).toMatch(new RegExp(`\\s${file.replace('.', '\\.')}\\n`));
      expect(listing).toMatch(new RegExp(`attachments/lot/${up.body.id}-kept report\\.pdf`));

      execFileSync('unzip', ['-q', zip, '-d', join(dir, 'x')]);
      const manifest = JSON.parse(readFileSync(join(dir, 'x', 'manifest.json'), 'utf8'));
      expect(manifest).toMatchObject({ format: 'porewise-winery-export', version: 1, winery: { id: wineryId }, exportedBy: 'Ana Audit' });
      for (const f of manifest.files as { file: string; rows: number; sha256: string }[]) {
        const bytes = readFileSync(join(dir, 'x', f.file));
        expect(createHash('sha256').update(bytes).digest('hex'), f.file).toBe(f.sha256);
        const parsed = Papa.parse<string[]>(bytes.toString('utf8').trim(), { skipEmptyLines: true });
        expect(parsed.data.length - 1, f.file).toBe(f.rows);
      }
      const attached = readFileSync(join(dir, 'x', 'attachments', 'lot', `${up.body.id}-kept report.pdf`));
      expect(Buffer.compare(attached, Buffer.from(pdf))).toBe(0);

      // Counts match the database; only this winery's rows are in it.
      const [{ n: events }] = await app.db.select({ n: sql<number>`cast(count(*) as int)` }).from(auditEventsTable).where(eq(auditEventsTable.wineryId, wineryId));
      expect(manifest.counts['audit-events']).toBeGreaterThan(0);
      expect(manifest.counts['audit-events']).toBeLessThanOrEqual(events);
      expect(manifest.counts.runs).toBeGreaterThanOrEqual(1);
      expect(manifest.counts.readings).toBeGreaterThanOrEqual(1);
      const lots = Papa.parse<Record<string, string>>(readFileSync(join(dir, 'x', 'lots.csv'), 'utf8').trim(), { header: true }).data;
      expect(lots.every((l) => l.winery_id === wineryId)).toBe(true);
      expect(lots.map((l) => l.id)).toContain(world.lotId);
      const membersCsv = readFileSync(join(dir, 'x', 'members.csv'), 'utf8');
      expect(membersCsv).not.toMatch(/argon2|password/i);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('holds every table with a winery_id column, or names why it leaves one out', async () => {
    const { rows } = await app.db.execute(
      sql`select table_name from information_schema.columns where column_name = 'winery_id' and table_schema = current_schema() order by 1`,
    );
    const tables = rows.map((r) => (r as { table_name: string }).table_name);
    expect(tables).toEqual(expect.arrayContaining(['runs', 'run_readings', 'run_reading_corrections', 'hose_presets']));
    const exported = new Set(exportTables.map((t) => getTableName(t.table)));
    expect(tables.filter((t) => !exported.has(t) && !(t in notExported))).toEqual([]);
  });

  it('is the owner’s alone (403 for every other role); another winery exports only its own', async () => {
    for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
      expect((await members[role].client.get('/api/export/winery')).status, role).toBe(403);
    }
    const res = await fetch(`${app.baseUrl}/api/export/winery`, { headers: { cookie: [...other.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    const dir = mkdtempSync(join(tmpdir(), 'porewise-export-'));
    try {
      const zip = join(dir, 'other.zip');
      writeFileSync(zip, Buffer.from(await res.arrayBuffer()));
      execFileSync('unzip', ['-q', zip, '-d', join(dir, 'x')]);
      const lots = readFileSync(join(dir, 'x', 'lots.csv'), 'utf8');
      expect(lots).not.toContain(world.lotId);
      expect(lots).not.toContain(wineryId);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
