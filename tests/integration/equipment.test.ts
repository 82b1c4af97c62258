// @vitest-environment node
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { cartridgesTable } from '../../server/db/schema';
import { cartridgeTypeInput, createCartridgeType, createHousing, createLine, housingInput, lineInput } from '../factories/equipment';
import { setupApiApp } from '../support/api-app';
import { signUp } from '../support/test-app';
import { expectReplayedCreate } from '../support/idempotency';

const app = setupApiApp({ wineryName: 'Equipment Test Winery', members: true });

const resources = [
  { path: '/api/housings', input: housingInput, patch: { notes: 'Checked the gaskets.' } },
  { path: '/api/lines', input: lineInput, patch: { bottlesPerHour: 2400 } },
  { path: '/api/cartridge-types', input: cartridgeTypeInput, patch: { pricePer10in: 99 } },
] as const;

/** Puts a cartridge row straight into the database (the cartridge module's own routes are not needed here). */
async function insertCartridge(values: { typeId: string; housingId?: string | null; position?: number; status?: 'in-stock' | 'installed' | 'regenerating' | 'retired' }) {
  const [row] = await app.db
    .insert(cartridgesTable)
    .values({
      wineryId: app.wineryId,
      serial: `EQ-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}`,
      typeId: values.typeId,
      lengthIn: 30,
      status: values.status ?? 'installed',
      housingId: values.housingId ?? null,
      position: values.housingId ? (values.position ?? 1) : null,
    })
    .returning({ id: cartridgesTable.id });
  return row.id;
}

describe('housings', () => {
  it('creates, reads, updates and deletes with derived figures', async () => {
    const created = await app.owner.post('/api/housings', housingInput({ name: 'Stage one housing', rounds: 4, lengthIn: 20 }));
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Stage one housing', rounds: 4, lengthIn: 20, elementEquivalents: 8, installedCount: 0 });
    const id = created.body.id;

    const read = await app.owner.get(`/api/housings/${id}`);
    expect(read.status).toBe(200);
    expect(read.body).toEqual(created.body);

    const updated = await app.owner.patch(`/api/housings/${id}`, { rounds: 5, upstreamGasVolumeL: null });
    expect(updated.status).toBe(200);
    expect(updated.body).toMatchObject({ rounds: 5, lengthIn: 20, elementEquivalents: 10, upstreamGasVolumeL: null, name: 'Stage one housing' });

    expect((await app.owner.delete(`/api/housings/${id}`)).status).toBe(204);
    expect((await app.owner.get(`/api/housings/${id}`)).status).toBe(404);
  });

  it('refuses bad input with a message per field', async () => {
    const res = await app.owner.post('/api/housings', housingInput({ lengthIn: 25, rounds: -2, maxPressureBar: 0 }));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['lengthIn', 'maxPressureBar', 'rounds']);
    expect(res.body.error.fields.lengthIn).toMatch(/10, 20, 30 or 40/);

    const empty = await app.owner.post('/api/housings', {});
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['holdUpL', 'lengthIn', 'maxPressureBar', 'maxTempC', 'name', 'rounds']);

    const wrongType = await app.owner.post('/api/housings', housingInput({ rounds: '3', holdUpL: 'lots' }));
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.error.fields).toHaveProperty('rounds');
    expect(wrongType.body.error.fields).toHaveProperty('holdUpL');

    const housing = await createHousing(app.owner);
    const badPatch = await app.owner.patch(`/api/housings/${housing.id}`, { lengthIn: 25 });
    expect(badPatch.status).toBe(400);
    expect(badPatch.body.error.fields).toHaveProperty('lengthIn');
  });

  it('keeps names unique per winery (409 on create and rename), but another winery may reuse one', async () => {
    const first = await createHousing(app.owner);
    const dup = await app.owner.post('/api/housings', housingInput({ name: first.name }));
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.name).toMatch(/already/);

    const second = await createHousing(app.owner);
    const rename = await app.owner.patch(`/api/housings/${second.id}`, { name: first.name });
    expect(rename.status).toBe(409);

    const { client: other } = await signUp(app.baseUrl);
    expect((await other.post('/api/housings', housingInput({ name: first.name }))).status).toBe(201);
  });

  it('counts installed cartridges, and refuses to delete or re-size a housing that holds some', async () => {
    const housing = await createHousing(app.owner, { rounds: 3, lengthIn: 30 });
    const type = await createCartridgeType(app.owner);
    const cartridgeId = await insertCartridge({ typeId: type.id, housingId: housing.id });
    await insertCartridge({ typeId: type.id, status: 'in-stock' });

    expect((await app.owner.get(`/api/housings/${housing.id}`)).body.installedCount).toBe(1);
    const list = await app.owner.get(`/api/housings?q=${encodeURIComponent(housing.name)}`);
    expect(list.body.items[0]).toMatchObject({ id: housing.id, installedCount: 1, elementEquivalents: 9 });

    const refused = await app.owner.delete(`/api/housings/${housing.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/1 cartridge is installed/);
    expect((await app.owner.patch(`/api/housings/${housing.id}`, { lengthIn: 20 })).status).toBe(409);

    const typeRefused = await app.owner.delete(`/api/cartridge-types/${type.id}`);
    expect(typeRefused.status).toBe(409);
    expect(typeRefused.body.error.message).toMatch(/2 cartridges are of this type/);
    const typeRead = await app.owner.get(`/api/cartridge-types/${type.id}`);
    expect(typeRead.body.counts).toEqual({ total: 2, inStock: 1, installed: 1, regenerating: 0, retired: 0 });

    await app.db.delete(cartridgesTable).where(eq(cartridgesTable.id, cartridgeId));
    expect((await app.owner.get(`/api/housings/${housing.id}`)).body.installedCount).toBe(0);
    expect((await app.owner.delete(`/api/housings/${housing.id}`)).status).toBe(204);
  });

  it('refuses to cut the rounds below a round that holds a cartridge', async () => {
    const housing = await createHousing(app.owner, { rounds: 3, lengthIn: 30 });
    const type = await createCartridgeType(app.owner);
    await insertCartridge({ typeId: type.id, housingId: housing.id, position: 3 });
    const refused = await app.owner.patch(`/api/housings/${housing.id}`, { rounds: 2 });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/Round 3 holds a cartridge/);
    expect((await app.owner.patch(`/api/housings/${housing.id}`, { rounds: 4 })).status).toBe(200);
  });

  it('carries out a retried create once (Idempotency-Key)', async () => {
    const body = housingInput();
    const key = `housing-${Date.now()}-retry`;
    await expectReplayedCreate(app.owner, app.owner, '/api/housings', body, key);
  });
});

describe('bottling lines', () => {
  it('derives the flow the filters must carry, with the default margin', async () => {
    const line = await createLine(app.owner, { bottlesPerHour: 3000, bottleMl: 750 });
    expect(line.fillerFlowLh).toBeCloseTo(2250, 9); // 3,000 × 0.75 L
    expect(line.flowMarginPct).toBe(10);
    expect(line.requiredFlowLh).toBeCloseTo(2475, 9); // 2,250 × 1.10

    const updated = await app.owner.patch(`/api/lines/${line.id}`, { bottleMl: 375 });
    expect(updated.status).toBe(200);
    expect(updated.body.fillerFlowLh).toBeCloseTo(1125, 9);
  });

  it('refuses bad input and duplicate names', async () => {
    const res = await app.owner.post('/api/lines', { name: '', bottlesPerHour: -5, bottleMl: 5 });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['bottleMl', 'bottlesPerHour', 'name']);
    const line = await createLine(app.owner);
    expect((await app.owner.post('/api/lines', lineInput({ name: line.name }))).status).toBe(409);
  });
});

describe('cartridge types', () => {
  it('stores the full specification and derives the clean-water figures', async () => {
    const res = await app.owner.post('/api/cartridge-types', cartridgeTypeInput({ name: 'PES 0.45 test', currency: 'usd' }));
    expect(res.status).toBe(201);
    const t = res.body;
    expect(t).toMatchObject({ kind: 'membrane', media: 'PES', ratingUm: 0.45, currency: 'USD', warnings: [], certificateAttachmentId: null });
    expect(t.counts).toEqual({ total: 0, inStock: 0, installed: 0, regenerating: 0, retired: 0 });
    // R = ΔP·A/(μ·Q) = 1e4 Pa × 0.7 m² / (1.0016e-3 Pa·s × 1200/3.6e6 m³/s) ≈ 2.097e10 1/m (hand calculation, water at 20 °C)
    expect(t.cleanWater.resistancePerM).toBeGreaterThan(2.08e10);
    expect(t.cleanWater.resistancePerM).toBeLessThan(2.11e10);
    // Darcy: ΔP scales with flow, so 400 L/h gives a third of the 0.1 bar at 1,200 L/h.
    expect(t.cleanWater.dpBarAtDesignFlux).toBeCloseTo(0.1 / 3, 6);
    expect(t.cleanWater.specTempC).toBe(20);
  });

  it('accepts a membrane without integrity limits but warns; refuses a terminal ΔP above the maximum', async () => {
    const warned = await app.owner.post('/api/cartridge-types', cartridgeTypeInput({ bubblePointMinBar: null, diffusionMaxMlMinPer10in: null }));
    expect(warned.status).toBe(201);
    expect(warned.body.warnings).toEqual([expect.objectContaining({ field: 'bubblePointMinBar' })]);

    const refused = await app.owner.post('/api/cartridge-types', cartridgeTypeInput({ terminalDpBar: 6, maxDpForwardBar: 5 }));
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.terminalDpBar).toMatch(/must not exceed the maximum forward/);

    // A PATCH of one field is checked against the stored rest of the record.
    const patched = await app.owner.patch(`/api/cartridge-types/${warned.body.id}`, { terminalDpBar: 5.5 });
    expect(patched.status).toBe(400);
    expect(patched.body.error.fields).toHaveProperty('terminalDpBar');
    const fixed = await app.owner.patch(`/api/cartridge-types/${warned.body.id}`, { diffusionMaxMlMinPer10in: 11, maxDpReverseBar: null });
    expect(fixed.status).toBe(200);
    expect(fixed.body).toMatchObject({ warnings: [], maxDpReverseBar: null, diffusionMaxMlMinPer10in: 11 });
  });

  it('refuses unknown kinds, media, missing fields and a certificate that is not the winery’s', async () => {
    const res = await app.owner.post('/api/cartridge-types', cartridgeTypeInput({ kind: 'sieve', media: 'paper', ratingUm: 0 }));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['kind', 'media', 'ratingUm']);

    const empty = await app.owner.post('/api/cartridge-types', {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty('areaM2Per10in');
    expect(empty.body.error.fields).toHaveProperty('designFluxLhPer10in');

    const cert = await app.owner.post('/api/cartridge-types', cartridgeTypeInput({ certificateAttachmentId: '8f2a4c1e-1b2c-4d3e-8f9a-0b1c2d3e4f50' }));
    expect(cert.status).toBe(400);
    expect(cert.body.error.fields).toHaveProperty('certificateAttachmentId');
  });

  it('filters by kind and searches by name or media', async () => {
    const { client } = await signUp(app.baseUrl);
    await createCartridgeType(client, { name: 'Depth PP 5', kind: 'prefilter', media: 'polypropylene', bubblePointMinBar: null, diffusionMaxMlMinPer10in: null, ratingUm: 5 });
    await createCartridgeType(client, { name: 'Glass 0.8', kind: 'prefilter', media: 'glass fibre', ratingUm: 0.8 });
    await createCartridgeType(client, { name: 'PES 0.45' });
    const membranes = await client.get('/api/cartridge-types?kind=membrane');
    expect(membranes.body.total).toBe(1);
    expect(membranes.body.items[0].name).toBe('PES 0.45');
    const glass = await client.get('/api/cartridge-types?q=glass');
    expect(glass.body.items.map((t: { name: string }) => t.name)).toEqual(['Glass 0.8']);
    const byRating = await client.get('/api/cartridge-types?sort=ratingUm&order=desc');
    expect(byRating.body.items.map((t: { ratingUm: number }) => t.ratingUm)).toEqual([5, 0.8, 0.45]);
    expect((await client.get('/api/cartridge-types?kind=sieve')).status).toBe(400);
  });
});

describe('roles', () => {
  it.each(['owner', 'cellar-master'] as const)('%s creates and updates every kind of equipment; only the owner deletes', async (role) => {
    const client = role === 'owner' ? app.owner : app.members[role];
    for (const r of resources) {
      const created = await client.post(r.path, r.input());
      expect(created.status, r.path).toBe(201);
      expect((await client.patch(`${r.path}/${created.body.id}`, r.patch)).status, r.path).toBe(200);
      if (role !== 'owner') expect((await client.delete(`${r.path}/${created.body.id}`)).status, r.path).toBe(403);
      expect((await app.owner.delete(`${r.path}/${created.body.id}`)).status, r.path).toBe(204);
    }
  });

  it.each(['winemaker', 'technician', 'auditor'] as const)('%s reads everything and changes nothing (403)', async (role) => {
    const client = app.members[role];
    for (const r of resources) {
      const existing = (await app.owner.post(r.path, r.input())).body;
      expect((await client.get(r.path)).status, r.path).toBe(200);
      const read = await client.get(`${r.path}/${existing.id}`);
      expect(read.status, r.path).toBe(200);
      expect(read.body.id).toBe(existing.id);
      expect((await client.post(r.path, r.input())).status, r.path).toBe(403);
      expect((await client.patch(`${r.path}/${existing.id}`, r.patch)).status, r.path).toBe(403);
      expect((await client.delete(`${r.path}/${existing.id}`)).status, r.path).toBe(403);
      expect((await app.owner.get(`${r.path}/${existing.id}`)).status, r.path).toBe(200);
    }
  });

  it('signed-out requests get 401', async () => {
    const { Client } = await import('../support/test-app');
    const anon = new Client(app.baseUrl);
    for (const r of resources) {
      expect((await anon.get(r.path)).status).toBe(401);
      expect((await anon.post(r.path, r.input())).status).toBe(401);
    }
  });
});

describe('tenancy', () => {
  it('another winery’s records are 404 on every route and absent from lists', async () => {
    const { client: stranger } = await signUp(app.baseUrl, { wineryName: 'Stranger Cellars' });
    for (const r of resources) {
      const mine = (await app.owner.post(r.path, r.input())).body;
      expect((await stranger.get(`${r.path}/${mine.id}`)).status, r.path).toBe(404);
      expect((await stranger.patch(`${r.path}/${mine.id}`, r.patch)).status, r.path).toBe(404);
      expect((await stranger.delete(`${r.path}/${mine.id}`)).status, r.path).toBe(404);
      const list = await stranger.get(`${r.path}?q=${encodeURIComponent(mine.name)}`);
      expect(list.body).toEqual({ items: [], total: 0 });
      // Still there, unchanged, for its own winery.
      expect((await app.owner.get(`${r.path}/${mine.id}`)).body).toEqual(mine);
      // An id that is not a UUID names nothing.
      expect((await app.owner.get(`${r.path}/not-an-id`)).status).toBe(404);
    }
  });
});

describe('lists', () => {
  it('page and sort on the server, with the total', async () => {
    const { client } = await signUp(app.baseUrl);
    for (const [i, rounds] of [5, 1, 4, 2, 3].entries()) {
      await createHousing(client, { name: `Housing ${String.fromCharCode(65 + i)}`, rounds, lengthIn: 10 });
    }
    const page2 = await client.get('/api/housings?sort=rounds&order=desc&page=2&pageSize=2');
    expect(page2.status).toBe(200);
    expect(page2.body.total).toBe(5);
    expect(page2.body.items.map((h: { rounds: number }) => h.rounds)).toEqual([3, 2]);

    const byName = await client.get('/api/housings?pageSize=3');
    expect(byName.body.items.map((h: { name: string }) => h.name)).toEqual(['Housing A', 'Housing B', 'Housing C']);
    const last = await client.get('/api/housings?page=3&pageSize=2');
    expect(last.body.items).toHaveLength(1);
    expect(last.body.total).toBe(5);

    const search = await client.get('/api/housings?q=housing%20d');
    expect(search.body.items.map((h: { name: string }) => h.name)).toEqual(['Housing D']);

    for (const [i, bph] of [1200, 6000, 3000].entries()) await createLine(client, { name: `Line ${i}`, bottlesPerHour: bph });
    const lines = await client.get('/api/lines?sort=bottlesPerHour&order=desc');
    expect(lines.body.items.map((l: { bottlesPerHour: number }) => l.bottlesPerHour)).toEqual([6000, 3000, 1200]);
  });

  it('refuses unknown sort keys and page sizes with field messages', async () => {
    const res = await app.owner.get('/api/housings?sort=colour&pageSize=1000&page=0');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['page', 'pageSize', 'sort']);
    expect((await app.owner.get('/api/lines?order=sideways')).status).toBe(400);
  });
});
