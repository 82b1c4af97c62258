// @vitest-environment node
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { and, desc, eq, sql } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEventsTable } from '../../server/db/schema';
import { neutraliseCell, toCsv } from '../../server/lib/csv';
import { fieldChanges } from '../../server/modules/audit/audit-diff';
import type { Role } from '../../shared/permissions';
import { deliveryCsv, serialPrefix } from '../factories/cartridges';
import { createLot, createTank, labResultBody, lotBody, tankBody } from '../factories/cellar';
import { cartridgeTypeInput, createCartridgeType, createHousing, housingInput, lineInput } from '../factories/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, planBody, trainBody, type PlanWorld } from '../factories/plans';
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

/** Housings holding cartridges of the planned types, so a run can start whatever checks starting makes. */
async function fillHousings() {
  const prefix = serialPrefix();
  const pairs: [string, string][] = [
    [world.prefilterTypeId, world.prefilterHousingId],
    [world.membraneTypeId, world.membraneHousingId],
  ];
  let i = 0;
  for (const [typeId, housingId] of pairs) {
    for (let k = 0; k < 3; k++) {
      const c = await owner.post('/api/cartridges', { serial: `${prefix}-F${(i += 1)}`, batch: 'B-FILL', typeId, lengthIn: 30 });
      expect(c.status).toBe(201);
      expect((await owner.post(`/api/cartridges/${c.body.id}/install`, { housingId })).status).toBe(200);
    }
  }
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

    await fillHousings();
    const plan = await createPlan(owner, world.lineId);
    const withLot = await addPlanLot(owner, plan.id, world.secondLotId, 3000);
    const planLotId = withLot.lots[0].id;
    const withTrain = await addTrain(owner, plan.id, planLotId, trainBody(world));
    expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: withTrain.lots[0].trains[0].id })).status).toBe(200);
    const steps: [() => Promise<Res>, string, string][] = [
      [() => owner.post(`/api/plans/${plan.id}/approve`), 'plan', 'approve'],
      [() => owner.post(`/api/plans/${plan.id}/reopen`), 'plan', 'reopen'],
      [() => owner.post(`/api/plans/${plan.id}/approve`), 'plan', 'approve'],
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
