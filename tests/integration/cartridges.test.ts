// @vitest-environment node
import { and, eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { cartridgeEventsTable, cartridgesTable } from '../../server/db/schema';
import { createCartridgesRepository } from '../../server/modules/cartridges/cartridges.repository';
import { cartridgeListQuerySchema } from '../../shared/schemas/cartridges';
import { deliveryCsv, insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { setupApiApp } from '../support/api-app';
import { Client, signUp } from '../support/test-app';
import { expectReplayedCreate } from '../support/idempotency';

const app = setupApiApp({ wineryName: 'Cartridge Test Winery', otherWineryName: 'Other Cartridge Winery', members: ['cellar-master', 'technician', 'auditor'] });
let owner: Client;
let cellarMaster: Client;
let technician: Client;
let auditor: Client;
let other: Client;
let wineryId: string;
let otherWineryId: string;
let membrane: { id: string; name: string };
let prefilter: { id: string; name: string };
let otherType: { id: string; name: string };
let housing30: { id: string; name: string };
let otherHousing: { id: string; name: string };

beforeAll(async () => {
  ({ owner, other, wineryId, otherWineryId } = app);
  ({ 'cellar-master': cellarMaster, technician, auditor } = app.members);
  membrane = await insertCartridgeType(app.db, wineryId, { name: 'PES 0.45 test' });
  prefilter = await insertCartridgeType(app.db, wineryId, { name: 'PP 1.0 test', kind: 'prefilter', media: 'polypropylene', ratingUm: 1 });
  otherType = await insertCartridgeType(app.db, otherWineryId, { name: 'PES 0.45 test' });
  housing30 = await insertHousing(app.db, wineryId, { name: 'Membrane housing 3x30', rounds: 3, lengthIn: 30 });
  otherHousing = await insertHousing(app.db, otherWineryId, { name: 'Other housing', rounds: 3, lengthIn: 30 });
});

const prefix = serialPrefix();
let seq = 0;
const nextSerial = () => `${prefix}-${String(++seq).padStart(4, '0')}`;

async function register(client: Client, body: Record<string, unknown> = {}) {
  return client.post('/api/cartridges', { serial: nextSerial(), batch: 'B24-117', typeId: membrane.id, lengthIn: 30, receivedAt: '2024-11-05', ...body });
}

async function registered(body: Record<string, unknown> = {}) {
  const res = await register(owner, body);
  expect(res.status).toBe(201);
  return res.body as { id: string; serial: string };
}

async function uploadCsv(client: Client, csv: string, query = '', filename = 'delivery.csv') {
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), filename);
  const res = await fetch(`${app.baseUrl}/api/cartridges/import${query}`, {
    method: 'POST',
    headers: { origin: app.baseUrl, cookie: [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
    body: form,
  });
  return { status: res.status, body: (await res.json()) as any };
}

describe('register, read and edit per role', () => {
  it('owner and cellar master register; technician and auditor may not; everyone reads', async () => {
    const byOwner = await register(owner);
    expect(byOwner.status).toBe(201);
    expect(byOwner.body).toMatchObject({ status: 'in-stock', typeName: 'PES 0.45 test', lengthIn: 30, elementEquivalents: 3, housingId: null, litresFiltered: 0, receivedAt: '2024-11-05' });
    expect((await register(cellarMaster)).status).toBe(201);
    expect((await register(technician)).status).toBe(403);
    expect((await register(auditor)).status).toBe(403);

    for (const reader of [owner, cellarMaster, technician, auditor]) {
      expect((await reader.get('/api/cartridges')).status).toBe(200);
      expect((await reader.get('/api/cartridges/summary')).status).toBe(200);
      expect((await reader.get('/api/cartridges/housing-view')).status).toBe(200);
      const detail = await reader.get(`/api/cartridges/${byOwner.body.id}`);
      expect(detail.status).toBe(200);
      expect(detail.body.events[0]).toMatchObject({ kind: 'registered', actorName: 'Test Owner' });
    }
  });

  it('edits batch, received date and notes; counters are read-only', async () => {
    const c = await registered();
    const res = await cellarMaster.patch(`/api/cartridges/${c.id}`, { batch: 'B24-200', notes: 'Box dented', receivedAt: '' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ batch: 'B24-200', notes: 'Box dented', receivedAt: null });
    expect((await owner.patch(`/api/cartridges/${c.id}`, { litresFiltered: 99 })).status).toBe(400);
    expect((await technician.patch(`/api/cartridges/${c.id}`, { notes: 'x' })).status).toBe(403);
    expect((await auditor.patch(`/api/cartridges/${c.id}`, { notes: 'x' })).status).toBe(403);
  });

  it('auditor gets 403 on every write', async () => {
    const c = await registered();
    expect((await auditor.post(`/api/cartridges/${c.id}/install`, { housingId: housing30.id })).status).toBe(403);
    expect((await auditor.post(`/api/cartridges/${c.id}/remove`)).status).toBe(403);
    expect((await auditor.post(`/api/cartridges/${c.id}/retire`, { reason: 'x' })).status).toBe(403);
    expect((await auditor.request('POST', '/api/cartridges/import?dryRun=true', 'serial,type,length\nA,B,10', { 'content-type': 'text/csv' })).status).toBe(403);
    expect((await auditor.request('POST', '/api/cartridges/import', 'serial,type,length\nA,B,10', { 'content-type': 'text/csv' })).status).toBe(403);
  });

  it('answers 401 when signed out', async () => {
    expect((await new Client(app.baseUrl).get('/api/cartridges')).status).toBe(401);
  });
});

describe('bad input', () => {
  it('400 with field messages', async () => {
    const res = await owner.post('/api/cartridges', { serial: '', typeId: 'nope', lengthIn: 25, receivedAt: '2024-02-30' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['lengthIn', 'receivedAt', 'serial', 'typeId']);
  });

  it('a type of another winery is a field error', async () => {
    const res = await register(owner, { typeId: otherType.id });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.typeId).toMatch(/catalogue/);
  });

  it('a duplicate serial is 409; the same serial in another winery is fine', async () => {
    const c = await registered();
    const again = await register(cellarMaster, { serial: c.serial });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('duplicate_serial');
    expect((await other.post('/api/cartridges', { serial: c.serial, typeId: otherType.id, lengthIn: 30 })).status).toBe(201);
  });

  it('bad list queries are 400', async () => {
    expect((await owner.get('/api/cartridges?sort=price')).status).toBe(400);
    expect((await owner.get('/api/cartridges?status=lost')).status).toBe(400);
    expect((await owner.get('/api/cartridges?pageSize=1000')).status).toBe(400);
    expect((await owner.get('/api/cartridges?typeId=abc')).status).toBe(400);
  });
});

describe('another winery', () => {
  it('404 on every route for a cartridge or housing of another winery', async () => {
    const mine = await registered();
    const theirs = (await other.post('/api/cartridges', { serial: nextSerial(), typeId: otherType.id, lengthIn: 30 })).body;
    expect((await other.get(`/api/cartridges/${mine.id}`)).status).toBe(404);
    expect((await other.patch(`/api/cartridges/${mine.id}`, { notes: 'x' })).status).toBe(404);
    expect((await other.post(`/api/cartridges/${mine.id}/install`, { housingId: otherHousing.id })).status).toBe(404);
    expect((await other.post(`/api/cartridges/${mine.id}/remove`)).status).toBe(404);
    expect((await other.post(`/api/cartridges/${mine.id}/retire`, { reason: 'x' })).status).toBe(404);
    // Installing my cartridge into their housing, or their cartridge into mine.
    expect((await owner.post(`/api/cartridges/${mine.id}/install`, { housingId: otherHousing.id })).status).toBe(404);
    expect((await owner.post(`/api/cartridges/${theirs.id}/install`, { housingId: housing30.id })).status).toBe(404);
    expect((await owner.get('/api/cartridges/not-a-uuid')).status).toBe(404);
    // Lists, summary and the housing view hold only their own.
    const list = await other.get(`/api/cartridges?q=${prefix}&pageSize=100`);
    expect(list.body.items.map((i: { id: string }) => i.id)).not.toContain(mine.id);
    expect((await other.get(`/api/cartridges?housingId=${housing30.id}`)).body.total).toBe(0);
    const summary = await other.get('/api/cartridges/summary');
    expect(summary.body.types.map((t: { typeId: string }) => t.typeId)).toEqual([otherType.id]);
    const view = await other.get('/api/cartridges/housing-view');
    expect(view.body.housings.map((h: { id: string }) => h.id)).toEqual([otherHousing.id]);
    // An import checks serials and types against its own winery only.
    const preview = await uploadCsv(other, deliveryCsv([[mine.serial, 'B1', 'PP 1.0 test', 10, '2024-01-01']]), '?dryRun=true');
    expect(preview.body.rows[0].errors).toEqual([expect.stringMatching(/not in the cartridge-type catalogue/)]);
  });
});

describe('moves', () => {
  it('installs into the first free round, refuses a full housing, a wrong length and a retired cartridge; every move is a history event', async () => {
    const h = await insertHousing(app.db, wineryId, { rounds: 2, lengthIn: 30 });
    const a = await registered();
    const b = await registered();
    const c = await registered();
    const short = await registered({ lengthIn: 20 });

    const first = await technician.post(`/api/cartridges/${a.id}/install`, { housingId: h.id });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ status: 'installed', housingId: h.id, housingName: h.name, position: 1 });
    expect((await technician.post(`/api/cartridges/${b.id}/install`, { housingId: h.id, position: 1 })).status).toBe(409);
    expect((await technician.post(`/api/cartridges/${b.id}/install`, { housingId: h.id, position: 3 })).status).toBe(400);
    expect((await technician.post(`/api/cartridges/${b.id}/install`, { housingId: h.id, position: 0 })).status).toBe(400);
    const second = await technician.post(`/api/cartridges/${b.id}/install`, { housingId: h.id });
    expect(second.body.position).toBe(2);

    const full = await owner.post(`/api/cartridges/${c.id}/install`, { housingId: h.id });
    expect(full.status).toBe(409);
    expect(full.body.error.code).toBe('housing_full');
    const wrongLength = await owner.post(`/api/cartridges/${short.id}/install`, { housingId: housing30.id });
    expect(wrongLength.status).toBe(409);
    expect(wrongLength.body.error.code).toBe('length_mismatch');

    const view = await auditor.get('/api/cartridges/housing-view');
    const panel = view.body.housings.find((x: { id: string }) => x.id === h.id);
    expect(panel).toMatchObject({ rounds: 2, installedCount: 2, freeRounds: 0 });
    expect(panel.positions.map((p: { cartridge: { serial: string } | null }) => p.cartridge?.serial)).toEqual([a.serial, b.serial]);

    const removed = await technician.post(`/api/cartridges/${a.id}/remove`);
    expect(removed.body).toMatchObject({ status: 'in-stock', housingId: null, position: null });
    expect((await technician.post(`/api/cartridges/${a.id}/remove`)).status).toBe(409);
    // Technicians move; retiring is for those who register.
    expect((await technician.post(`/api/cartridges/${b.id}/retire`, { reason: 'Flow did not recover' })).status).toBe(403);
    expect((await cellarMaster.post(`/api/cartridges/${b.id}/retire`, { reason: '' })).status).toBe(400);
    const retired = await cellarMaster.post(`/api/cartridges/${b.id}/retire`, { reason: 'Flow did not recover' });
    expect(retired.body).toMatchObject({ status: 'retired', housingId: null, retiredReason: 'Flow did not recover' });
    const again = await owner.post(`/api/cartridges/${b.id}/install`, { housingId: h.id });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('retired');

    const history = (await owner.get(`/api/cartridges/${b.id}`)).body.events;
    expect(history.map((e: { kind: string }) => e.kind)).toEqual(['retired', 'installed', 'registered']);
    expect(history[0]).toMatchObject({ actorName: 'Test cellar-master', housingName: h.name, position: 2, details: { reason: 'Flow did not recover' } });
    expect(history[1]).toMatchObject({ actorName: 'Test technician', housingId: h.id, position: 2 });
    const rows = await app.db.select().from(cartridgeEventsTable).where(eq(cartridgeEventsTable.cartridgeId, a.id));
    expect(rows.map((r) => r.kind).sort()).toEqual(['installed', 'registered', 'removed']);
  });

  it('moves an installed cartridge to another round with a removed and an installed event', async () => {
    const h = await insertHousing(app.db, wineryId, { rounds: 3, lengthIn: 30 });
    const a = await registered();
    await owner.post(`/api/cartridges/${a.id}/install`, { housingId: h.id });
    const moved = await owner.post(`/api/cartridges/${a.id}/install`, { housingId: h.id, position: 3 });
    expect(moved.body.position).toBe(3);
    const kinds = (await owner.get(`/api/cartridges/${a.id}`)).body.events.map((e: { kind: string }) => e.kind);
    expect(kinds).toEqual(['installed', 'removed', 'installed', 'registered']);
  });

  it('two installs at once into the last round: one wins, one is refused', async () => {
    const h = await insertHousing(app.db, wineryId, { rounds: 1, lengthIn: 30 });
    const a = await registered();
    const b = await registered();
    const results = await Promise.all([
      owner.post(`/api/cartridges/${a.id}/install`, { housingId: h.id }),
      technician.post(`/api/cartridges/${b.id}/install`, { housingId: h.id }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const installed = await app.db
      .select()
      .from(cartridgesTable)
      .where(and(eq(cartridgesTable.housingId, h.id), eq(cartridgesTable.status, 'installed')));
    expect(installed).toHaveLength(1);
  });
});

describe('list, summary and detail', () => {
  it('pages, sorts, searches and filters on the server', async () => {
    const batch = `BL-${prefix}`;
    const made = [];
    for (let i = 0; i < 5; i++) made.push(await registered({ batch, typeId: i < 2 ? prefilter.id : membrane.id, lengthIn: i < 2 ? 10 : 30 }));
    const h = await insertHousing(app.db, wineryId, { rounds: 3 });
    await owner.post(`/api/cartridges/${made[4].id}/install`, { housingId: h.id });

    const page1 = await owner.get(`/api/cartridges?batch=${batch}&sort=serial&order=desc&page=1&pageSize=2`);
    expect(page1.body.total).toBe(5);
    expect(page1.body.items.map((i: { serial: string }) => i.serial)).toEqual([made[4].serial, made[3].serial]);
    const page3 = await owner.get(`/api/cartridges?batch=${batch}&sort=serial&order=desc&page=3&pageSize=2`);
    expect(page3.body.items.map((i: { serial: string }) => i.serial)).toEqual([made[0].serial]);

    const byType = await owner.get(`/api/cartridges?batch=${batch}&typeId=${prefilter.id}&sort=lengthIn`);
    expect(byType.body.total).toBe(2);
    expect(byType.body.items.every((i: { typeName: string }) => i.typeName === 'PP 1.0 test')).toBe(true);
    const installed = await owner.get(`/api/cartridges?status=installed&housingId=${h.id}`);
    expect(installed.body.items.map((i: { id: string }) => i.id)).toEqual([made[4].id]);
    expect(installed.body.items[0].housingName).toBe(h.name);
    const search = await owner.get(`/api/cartridges?q=${encodeURIComponent(made[2].serial.toLowerCase())}`);
    expect(search.body.items.map((i: { id: string }) => i.id)).toEqual([made[2].id]);
    const byBatchSearch = await owner.get(`/api/cartridges?q=${encodeURIComponent(batch)}`);
    expect(byBatchSearch.body.total).toBe(5);
    const byTypeName = await owner.get(`/api/cartridges?batch=${batch}&sort=type&order=asc`);
    expect(byTypeName.body.items[0].typeName).toBe('PES 0.45 test');
    // LIKE wildcards in the search text are literal.
    expect((await owner.get('/api/cartridges?q=%25')).body.total).toBe(0);
  });

  it('summarises stock per type in counts and 10-inch equivalents', async () => {
    const type = await insertCartridgeType(app.db, wineryId, { kind: 'prefilter', media: 'glass fibre', ratingUm: 1.2 });
    const h = await insertHousing(app.db, wineryId, { rounds: 2, lengthIn: 20 });
    const a = await registered({ typeId: type.id, lengthIn: 20 });
    await registered({ typeId: type.id, lengthIn: 10 });
    await registered({ typeId: type.id, lengthIn: 30 });
    await owner.post(`/api/cartridges/${a.id}/install`, { housingId: h.id });
    const summary = await auditor.get('/api/cartridges/summary');
    const row = summary.body.types.find((t: { typeId: string }) => t.typeId === type.id);
    expect(row).toMatchObject({
      inStock: { count: 2, elementEquivalents: 4 },
      installed: { count: 1, elementEquivalents: 2 },
      regenerating: { count: 0, elementEquivalents: 0 },
    });
  });

  it('the detail carries the engine life forecast from the cycle and integrity history', async () => {
    const c = await registered();
    const base = Date.now() - 30 * 86_400_000;
    const at = (d: number) => new Date(base + d * 86_400_000);
    await app.db.insert(cartridgeEventsTable).values([
      { wineryId, cartridgeId: c.id, kind: 'cycle', at: at(1), details: { kind: 'hot-water', tempC: 85, durationMin: 30, waterFlowBeforeLh: 3000, waterFlowAfterLh: 4400 } },
      { wineryId, cartridgeId: c.id, kind: 'cycle', at: at(8), details: { kind: 'steam', tempC: 121, durationMin: 20, waterFlowBeforeLh: 2900, waterFlowAfterLh: 4200 } },
      { wineryId, cartridgeId: c.id, kind: 'integrity', at: at(9), details: { pass: true } },
    ]);
    await app.db.update(cartridgesTable).set({ litresFiltered: 24000, steamCycles: 1, hotWaterCycles: 1 }).where(eq(cartridgesTable.id, c.id));
    const detail = (await technician.get(`/api/cartridges/${c.id}`)).body;
    expect(detail.events.map((e: { kind: string }) => e.kind)).toEqual(['registered', 'integrity', 'cycle', 'cycle']);
    expect(detail.litresFiltered).toBe(24000);
    expect(detail.life.counts).toMatchObject({ steam: 1, hotWater: 1, total: 2 });
    expect(detail.life.fractionUsed.steamCycles).toBeCloseTo(1 / 50);
    expect(detail.life.integrity).toMatchObject({ tests: 1, failures: 0, latestPass: true });
    expect(detail.life.recovery.points).toHaveLength(2);
    expect(detail.life.limitingFactor).not.toBeNull();
    expect(detail.life.known.length).toBeGreaterThan(0);
    expect(detail.life.missing.length).toBeGreaterThan(0);
    expect(detail.ratings).toMatchObject({ ratedSteamCycles: 50, ratedHotWaterCycles: 100, flowRecoveryMinPct: 60 });
  });
});

describe('delivery import', () => {
  const type = 'PES 0.45 test';

  it('previews row errors without saving, refuses the whole file while any row is wrong, then imports every row', async () => {
    const existing = await registered();
    const p = serialPrefix();
    const rows: (string | number)[][] = [
      [`${p}-1`, 'B24-300', type, 30, '2024-12-01'],
      [`${p}-2`, 'B24-300', 'No such type', 30, '2024-12-01'],
      [`${p}-3`, 'B24-300', type, 25, '2024-12-01'],
      [`${p}-1`, 'B24-300', type, 30, '2024-12-01'],
      [existing.serial, 'B24-300', type, 30, 'yesterday'],
      [`${p}-6`, '', 'pp 1.0 TEST', '10in', ''],
    ];
    const dry = await uploadCsv(owner, deliveryCsv(rows), '?dryRun=true');
    expect(dry.status).toBe(200);
    expect(dry.body.valid).toBe(false);
    expect(dry.body.errorCount).toBe(5);
    const byLine = new Map(dry.body.rows.map((r: { line: number; errors: string[] }) => [r.line, r.errors]));
    expect(byLine.get(2)).toEqual([expect.stringMatching(/also on line 5/)]);
    expect(byLine.get(3)).toEqual([expect.stringMatching(/"No such type" is not in the cartridge-type catalogue/)]);
    expect(byLine.get(4)).toEqual([expect.stringMatching(/^Length: /)]);
    expect(byLine.get(6)).toEqual(expect.arrayContaining([expect.stringMatching(/^Received: /), expect.stringMatching(/already registered/)]));
    expect(byLine.get(7)).toEqual([]);
    expect(dry.body.rows[5]).toMatchObject({ type: 'PP 1.0 test', typeId: prefilter.id, lengthIn: 10, receivedAt: null });

    const real = await uploadCsv(owner, deliveryCsv(rows));
    expect(real.status).toBe(400);
    expect(real.body.error.code).toBe('invalid_rows');
    expect(Object.keys(real.body.error.fields).sort()).toEqual(['line.2', 'line.3', 'line.4', 'line.5', 'line.6']);
    const saved = await app.db.select().from(cartridgesTable).where(eq(cartridgesTable.serial, `${p}-6`));
    expect(saved).toHaveLength(0);

    const fixed: (string | number)[][] = [
      [`${p}-1`, 'B24-300', type, 30, '2024-12-01'],
      [`${p}-2`, 'B24-300', type, 30, '2024-12-01'],
      [`${p}-3`, 'B24-300', type, 20, '2024-12-01'],
      [`${p}-4`, 'B24-300', type, 30, '2024-12-01'],
      [`${p}-5`, 'B24-300', type, 30, '2024-12-02'],
      [`${p}-6`, '', 'PP 1.0 test', 10, ''],
    ];
    const okDry = await uploadCsv(cellarMaster, deliveryCsv(fixed), '?dryRun=true');
    expect(okDry.body).toMatchObject({ valid: true, errorCount: 0 });
    const ok = await uploadCsv(cellarMaster, deliveryCsv(fixed));
    expect(ok.status).toBe(201);
    expect(ok.body.imported).toBe(6);
    const list = await owner.get(`/api/cartridges?q=${p}&sort=serial`);
    expect(list.body.total).toBe(6);
    expect(list.body.items[2]).toMatchObject({ serial: `${p}-3`, lengthIn: 20, batch: 'B24-300', receivedAt: '2024-12-01', status: 'in-stock' });
    const events = await app.db
      .select({ kind: cartridgeEventsTable.kind })
      .from(cartridgeEventsTable)
      .where(eq(cartridgeEventsTable.cartridgeId, ok.body.cartridgeIds[0]));
    expect(events).toEqual([{ kind: 'registered' }]);
    // Importing the same file again: every serial is now taken, nothing is saved twice.
    const twice = await uploadCsv(owner, deliveryCsv(fixed));
    expect(twice.status).toBe(400);
    expect(Object.keys(twice.body.error.fields)).toHaveLength(6);
  });

  it('takes the CSV as a text/csv body too, with semicolons and a BOM', async () => {
    const p = serialPrefix();
    const csv = `\uFEFFSerial;Batch;Type;Length;Received\n${p}-1;B9;${type};30;2025-01-10\n\n${p}-2;B9;${type};30;2025-01-10\n`;
    const res = await technician.request('POST', '/api/cartridges/import?dryRun=true', csv, { 'content-type': 'text/csv' });
    expect(res.status).toBe(403);
    const dry = await owner.request('POST', '/api/cartridges/import?dryRun=true', csv, { 'content-type': 'text/csv' });
    expect(dry.status).toBe(200);
    expect(dry.body.rows.map((r: { line: number; errors: string[] }) => [r.line, r.errors.length])).toEqual([
      [2, 0],
      [4, 0],
    ]);
    const real = await owner.request('POST', '/api/cartridges/import', csv, { 'content-type': 'text/csv' });
    expect(real.status).toBe(201);
    expect(real.body.imported).toBe(2);
  });

  it('refuses files that cannot be a delivery: missing columns, no rows, no file, more than 5,000 rows', async () => {
    const missing = await uploadCsv(owner, 'serial,batch\nA,B\n', '?dryRun=true');
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/no type, length columns/);
    expect((await uploadCsv(owner, 'serial,batch,type,length,received\n', '?dryRun=true')).status).toBe(400);
    const none = await owner.request('POST', '/api/cartridges/import', { rows: [] });
    expect(none.status).toBe(400);
    expect(none.body.error.fields.file).toBeDefined();
    expect((await owner.request('POST', '/api/cartridges/import?dryRun=maybe', 'x', { 'content-type': 'text/csv' })).status).toBe(400);

    const p = serialPrefix();
    const many = Array.from({ length: 5001 }, (_, i) => [`${p}-${i}`, 'B1', type, 30, '2025-01-01']);
    const tooMany = await uploadCsv(owner, deliveryCsv(many));
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toMatch(/at most 5,000/);
    const saved = await app.db.select({ n: sql<number>`count(*)::int` }).from(cartridgesTable).where(sql`${cartridgesTable.serial} like ${`${p}-%`}`);
    expect(saved[0].n).toBe(0);
  });

  it('imports 5,000 rows in one go', async () => {
    const p = serialPrefix();
    const rows = Array.from({ length: 5000 }, (_, i) => [`${p}-${String(i).padStart(5, '0')}`, 'B25-001', type, 30, '2025-02-01']);
    const res = await uploadCsv(owner, deliveryCsv(rows));
    expect(res.status).toBe(201);
    expect(res.body.imported).toBe(5000);
  });
});

describe('Idempotency-Key on register', () => {
  it('a retried register returns the first answer and creates one cartridge', async () => {
    const serial = nextSerial();
    const key = `reg-${serial}`;
    const body = { serial, typeId: membrane.id, lengthIn: 30 };
    await expectReplayedCreate(owner, owner, '/api/cartridges', body, key);
    const rows = await app.db.select().from(cartridgesTable).where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.serial, serial)));
    expect(rows).toHaveLength(1);
  });
});

describe('10,000 cartridges', () => {
  it('lists a page with joins and a count (timing and plan logged, not asserted)', async () => {
    const big = await signUp(app.baseUrl, { wineryName: 'Large Stock Winery' });
    const id = big.me.activeWineryId!;
    const t = await insertCartridgeType(app.db, id, { name: 'Bulk PES' });
    const h = await insertHousing(app.db, id, { rounds: 3 });
    const values = Array.from({ length: 10_000 }, (_, i) => ({
      wineryId: id,
      serial: `BULK-${String(i).padStart(5, '0')}`,
      batch: `B${i % 50}`,
      typeId: t.id,
      lengthIn: 30,
      status: (i < 3 ? 'installed' : i % 10 === 0 ? 'retired' : 'in-stock') as 'installed' | 'retired' | 'in-stock',
      housingId: i < 3 ? h.id : null,
      position: i < 3 ? i + 1 : null,
    }));
    await createCartridgesRepository(app.db).insertMany(values);
    await app.pool.query('ANALYZE cartridges');

    const timings: Record<string, number> = {};
    for (const [name, path] of Object.entries({
      firstPage: '/api/cartridges?sort=serial&pageSize=50',
      search: '/api/cartridges?q=BULK-09&pageSize=50',
      statusAndType: `/api/cartridges?status=in-stock&typeId=${t.id}&sort=receivedAt&order=desc&page=20&pageSize=50`,
      summary: '/api/cartridges/summary',
    })) {
      const started = performance.now();
      const res = await big.client.get(path);
      timings[name] = Math.round(performance.now() - started);
      expect(res.status).toBe(200);
    }
    const list = await big.client.get('/api/cartridges?pageSize=50&page=2');
    expect(list.body.total).toBe(10_000);
    expect(list.body.items).toHaveLength(50);

    const query = cartridgeListQuerySchema.parse({ status: 'in-stock', sort: 'serial', pageSize: '50' });
    const { sql: text, params } = createCartridgesRepository(app.db).listSql(id, query);
    const plan = await app.pool.query(`EXPLAIN (ANALYZE, BUFFERS) ${text}`, params);
    console.info(`[cartridges] 10,000 rows: request timings ms ${JSON.stringify(timings)}`);
    console.info(`[cartridges] EXPLAIN ANALYZE list:\n${plan.rows.map((r: Record<string, string>) => r['QUERY PLAN']).join('\n')}`);
  });
});

describe('demo seed', () => {
  it('fills the housings, keeps counters in step with the history, and runs once', async () => {
    const demo = await signUp(app.baseUrl, { wineryName: 'Seed Check Winery' });
    const id = demo.me.activeWineryId!;
    const actorId = demo.me.user.id;
    await insertCartridgeType(app.db, id, { name: 'Depth PP 5 µm', kind: 'prefilter', media: 'polypropylene', ratingUm: 5, ratedSteamCycles: 20, ratedHotWaterCycles: 50, ratedChemicalCycles: 30, flowRecoveryMinPct: 70 });
    await insertCartridgeType(app.db, id, { name: 'Glass fibre 0.8 µm', kind: 'prefilter', media: 'glass fibre', ratingUm: 0.8, ratedSteamCycles: 30, ratedHotWaterCycles: 30, ratedChemicalCycles: 10 });
    await insertCartridgeType(app.db, id, { name: 'PES membrane 0.65 µm', ratingUm: 0.65, bubblePointMinBar: 2.4, flowRecoveryMinPct: 80 });
    await insertCartridgeType(app.db, id, { name: 'PES membrane 0.45 µm', ratingUm: 0.45, bubblePointMinBar: 3.2, flowRecoveryMinPct: 80 });
    await insertHousing(app.db, id, { name: 'Prefilter housing A', rounds: 3, lengthIn: 30 });
    await insertHousing(app.db, id, { name: 'Membrane housing B', rounds: 3, lengthIn: 30 });
    await insertHousing(app.db, id, { name: 'Water filter', rounds: 1, lengthIn: 10 });
    const { seedCartridges } = await import('../../server/db/seeds/cartridges');
    await app.db.transaction((tx) => seedCartridges(tx, { wineryId: id, actorId }));
    await app.db.transaction((tx) => seedCartridges(tx, { wineryId: id, actorId }));

    const list = await demo.client.get('/api/cartridges?pageSize=100');
    expect(list.body.total).toBeGreaterThanOrEqual(40);
    const statuses = list.body.items.map((c: { status: string }) => c.status);
    expect(statuses.filter((s: string) => s === 'in-stock').length).toBeGreaterThan(statuses.length / 2);
    expect(statuses.filter((s: string) => s === 'regenerating')).toHaveLength(2);
    expect(statuses.filter((s: string) => s === 'retired')).toHaveLength(2);
    expect(list.body.items.every((c: { serial: string }) => /^QW-[A-Z]+\d+-\d{4}$/.test(c.serial))).toBe(true);

    const view = await demo.client.get('/api/cartridges/housing-view');
    for (const h of view.body.housings) {
      expect(h.freeRounds).toBe(0);
      for (const p of h.positions) expect(p.cartridge.lengthIn).toBe(h.lengthIn);
    }
    for (const c of list.body.items as { id: string; status: string; steamCycles: number; hotWaterCycles: number; chemicalCycles: number; litresFiltered: number }[]) {
      const detail = (await demo.client.get(`/api/cartridges/${c.id}`)).body;
      const cycles = detail.events.filter((e: { kind: string }) => e.kind === 'cycle');
      const litres = detail.events.filter((e: { kind: string }) => e.kind === 'run').reduce((s: number, e: { details: { litres: number } }) => s + e.details.litres, 0);
      expect(cycles.filter((e: { details: { kind: string } }) => e.details.kind === 'steam').length).toBe(c.steamCycles);
      expect(cycles.filter((e: { details: { kind: string } }) => e.details.kind === 'hot-water').length).toBe(c.hotWaterCycles);
      expect(cycles.filter((e: { details: { kind: string } }) => e.details.kind === 'chemical').length).toBe(c.chemicalCycles);
      expect(litres).toBe(c.litresFiltered);
      expect(detail.lifeError).toBeNull();
      if (c.status === 'retired' && detail.typeKind === 'membrane') {
        expect(detail.life).toMatchObject({ ended: true, limitingFactor: 'integrity' });
      }
    }
  });
});

describe('delivery import edge cases', () => {
  it('refuses a header row that names a column twice, and serials with control characters', async () => {
    const { client } = await signUp(app.baseUrl);
    const twice = await client.request('POST', '/api/cartridges/import?dryRun=true', 'serial,serial,batch,type,length,received\nA,B,B1,X,30,2026-01-01\n', { 'content-type': 'text/csv' });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toMatch(/serial more than once/);
    const serial = await client.post('/api/cartridges', { serial: 'QW-1\nX', batch: 'B1', typeId: '00000000-0000-4000-8000-000000000000', lengthIn: 30 });
    expect(serial.status).toBe(400);
    expect(serial.body.error.fields.serial).toMatch(/control characters/);
  });
});
