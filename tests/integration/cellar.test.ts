// @vitest-environment node
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { attachmentsTable } from '../../server/db/schema';
import { seedCellar } from '../../server/db/seeds/cellar';
import { createLabResult, createLot, createTank, discPoints, labResultBody, lotBody, tankBody } from '../factories/cellar';
import { setupApiApp } from '../support/api-app';
import { Client, signUp } from '../support/test-app';
import { expectReplayedCreate } from '../support/idempotency';

const app = setupApiApp({ wineryName: 'Cellar Test Winery', otherWineryName: 'Other Cellar Winery', members: true });

describe('tanks', () => {
  it('lists, creates, reads, updates and deletes a tank; refuses a duplicate name', async () => {
    const created = await app.owner.post('/api/tanks', tankBody({ name: 'Crush tank A', capacityL: 12_000, notes: 'Jacketed' }));
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Crush tank A', capacityL: 12_000, notes: 'Jacketed', lotCount: 0, lotVolumeL: 0 });
    expect(created.body).not.toHaveProperty('wineryId');
    const id = created.body.id;

    expect((await app.owner.get(`/api/tanks/${id}`)).body.name).toBe('Crush tank A');
    const list = await app.owner.get('/api/tanks?q=crush');
    expect(list.status).toBe(200);
    expect(list.body.items.map((t: { id: string }) => t.id)).toContain(id);

    const dup = await app.owner.post('/api/tanks', tankBody({ name: 'Crush tank A' }));
    expect(dup.status).toBe(409);

    const updated = await app.owner.put(`/api/tanks/${id}`, tankBody({ name: 'Crush tank B', capacityL: 11_500 }));
    expect(updated.status).toBe(200);
    expect(updated.body).toMatchObject({ name: 'Crush tank B', capacityL: 11_500 });

    expect((await app.owner.delete(`/api/tanks/${id}`)).status).toBe(204);
    expect((await app.owner.get(`/api/tanks/${id}`)).status).toBe(404);
  });

  it('refuses to delete a tank that holds lots (409) and counts its lots', async () => {
    const tank = await createTank(app.owner);
    await createLot(app.owner, { tankId: tank.id, volumeL: 3000 });
    await createLot(app.owner, { tankId: tank.id, volumeL: 1500 });
    const got = await app.owner.get(`/api/tanks/${tank.id}`);
    expect(got.body).toMatchObject({ lotCount: 2, lotVolumeL: 4500 });
    const del = await app.owner.delete(`/api/tanks/${tank.id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toMatch(/holds 2 lots/);
  });

  it('rejects bad input with field messages', async () => {
    const res = await app.owner.post('/api/tanks', { name: '', capacityL: -5 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('name');
    expect(res.body.error.fields).toHaveProperty('capacityL');
    const text = await app.owner.post('/api/tanks', { name: 'X', capacityL: 'lots' });
    expect(text.status).toBe(400);
    expect(text.body.error.fields.capacityL).toMatch(/number/);
    expect((await app.owner.get('/api/tanks?sort=colour')).status).toBe(400);
  });
});

describe('roles', () => {
  it.each(['cellar-master', 'winemaker'] as const)('%s may create and update tanks, lots and lab results; deleting is the owner’s', async (role) => {
    const c = app.members[role];
    const tank = await createTank(c);
    expect((await c.put(`/api/tanks/${tank.id}`, tankBody({ name: `${tank.name} (b)` }))).status).toBe(200);
    const lot = await createLot(c, { tankId: tank.id });
    expect((await c.put(`/api/lots/${lot.id}`, lotBody({ code: lot.code, name: 'Renamed' }))).status).toBe(200);
    const result = await createLabResult(c, lot.id);
    expect((await c.put(`/api/lots/${lot.id}/lab-results/${result.id}`, labResultBody({ turbidityNtu: 0.4 }))).status).toBe(200);
    expect((await c.delete(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(403);
    expect((await c.delete(`/api/lots/${lot.id}`)).status).toBe(403);
    expect((await c.delete(`/api/tanks/${tank.id}`)).status).toBe(403);
    expect((await app.owner.delete(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(204);
    expect((await app.owner.delete(`/api/lots/${lot.id}`)).status).toBe(204);
    expect((await app.owner.delete(`/api/tanks/${tank.id}`)).status).toBe(204);
  });

  it.each(['technician', 'auditor'] as const)('%s reads everything (200) and may change nothing (403)', async (role) => {
    const c = app.members[role];
    const tank = await createTank(app.owner);
    const lot = await createLot(app.owner, { tankId: tank.id });
    const result = await createLabResult(app.owner, lot.id);

    expect((await c.get('/api/tanks')).status).toBe(200);
    expect((await c.get(`/api/tanks/${tank.id}`)).status).toBe(200);
    expect((await c.get('/api/lots')).status).toBe(200);
    expect((await c.get(`/api/lots/${lot.id}`)).status).toBe(200);
    expect((await c.get(`/api/lots/${lot.id}/lab-results`)).status).toBe(200);
    expect((await c.get(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(200);

    expect((await c.post('/api/tanks', tankBody())).status).toBe(403);
    expect((await c.put(`/api/tanks/${tank.id}`, tankBody())).status).toBe(403);
    expect((await c.delete(`/api/tanks/${tank.id}`)).status).toBe(403);
    expect((await c.post('/api/lots', lotBody())).status).toBe(403);
    expect((await c.put(`/api/lots/${lot.id}`, lotBody())).status).toBe(403);
    expect((await c.delete(`/api/lots/${lot.id}`)).status).toBe(403);
    expect((await c.post(`/api/lots/${lot.id}/lab-results`, labResultBody())).status).toBe(403);
    expect((await c.put(`/api/lots/${lot.id}/lab-results/${result.id}`, labResultBody())).status).toBe(403);
    expect((await c.delete(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(403);
  });

  it('answers 401 to someone not signed in', async () => {
    const anon = new Client(app.baseUrl);
    expect((await anon.get('/api/lots')).status).toBe(401);
    expect((await anon.post('/api/tanks', tankBody())).status).toBe(401);
  });
});

describe('another winery', () => {
  it("cannot see or change this winery's tanks, lots and lab results (404 on every route)", async () => {
    const tank = await createTank(app.owner);
    const lot = await createLot(app.owner, { tankId: tank.id });
    const result = await createLabResult(app.owner, lot.id);

    expect((await app.other.get(`/api/tanks/${tank.id}`)).status).toBe(404);
    expect((await app.other.put(`/api/tanks/${tank.id}`, tankBody())).status).toBe(404);
    expect((await app.other.delete(`/api/tanks/${tank.id}`)).status).toBe(404);
    expect((await app.other.get(`/api/lots/${lot.id}`)).status).toBe(404);
    expect((await app.other.put(`/api/lots/${lot.id}`, lotBody())).status).toBe(404);
    expect((await app.other.delete(`/api/lots/${lot.id}`)).status).toBe(404);
    expect((await app.other.get(`/api/lots/${lot.id}/lab-results`)).status).toBe(404);
    expect((await app.other.post(`/api/lots/${lot.id}/lab-results`, labResultBody())).status).toBe(404);
    expect((await app.other.get(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(404);
    expect((await app.other.put(`/api/lots/${lot.id}/lab-results/${result.id}`, labResultBody())).status).toBe(404);
    expect((await app.other.delete(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(404);

    // A lab result addressed through another of its own lots is not found either.
    const ownLot = await createLot(app.owner);
    expect((await app.owner.get(`/api/lots/${ownLot.id}/lab-results/${result.id}`)).status).toBe(404);

    // The other winery's lists do not include these records.
    const lots = await app.other.get(`/api/lots?q=${encodeURIComponent(lot.code)}`);
    expect(lots.body).toEqual({ items: [], total: 0 });
    const tanks = await app.other.get(`/api/tanks?q=${encodeURIComponent(tank.name)}`);
    expect(tanks.body.total).toBe(0);

    // Everything is still there for the owner.
    expect((await app.owner.get(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(200);
    expect((await app.owner.get(`/api/tanks/${tank.id}`)).status).toBe(200);
  });

  it("refuses a lot pointing to another winery's tank with a field error", async () => {
    const foreignTank = await createTank(app.other);
    const res = await app.owner.post('/api/lots', lotBody({ tankId: foreignTank.id }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.tankId).toMatch(/tank/i);
    const lot = await createLot(app.owner);
    const upd = await app.owner.put(`/api/lots/${lot.id}`, lotBody({ code: lot.code, tankId: foreignTank.id }));
    expect(upd.status).toBe(400);
    expect(upd.body.error.fields).toHaveProperty('tankId');
  });

  it('answers 404 to ids that are not ids', async () => {
    expect((await app.owner.get('/api/lots/not-a-uuid')).status).toBe(404);
    expect((await app.owner.get('/api/tanks/123')).status).toBe(404);
  });
});

describe('lots', () => {
  it('creates a lot and returns its detail with readiness and the thresholds used', async () => {
    const tank = await createTank(app.owner);
    const res = await app.owner.post('/api/lots', lotBody({ name: 'Riesling dry', style: 'white', tankId: tank.id, tempC: 11.5 }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name: 'Riesling dry',
      style: 'white',
      tank: { id: tank.id, name: tank.name },
      tempC: 11.5,
      labResultCount: 0,
      latestLabResult: null,
      readiness: { verdict: 'unknown' },
    });
    expect(res.body.thresholds).toMatchObject({ isDefault: true, turbidity: { limitNtu: 1 }, cloggingIndex: { readyMaxS: 20, borderlineMaxS: 50 } });
    expect(res.body.thresholds.turbidity.source).toMatch(/Wineland/);
  });

  it('refuses a duplicate lot code in the same winery (409) but allows it in another winery', async () => {
    const lot = await createLot(app.owner);
    const dup = await app.owner.post('/api/lots', lotBody({ code: lot.code }));
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('duplicate_lot_code');
    expect((await app.other.post('/api/lots', lotBody({ code: lot.code }))).status).toBe(201);
    const second = await createLot(app.owner);
    expect((await app.owner.put(`/api/lots/${second.id}`, lotBody({ code: lot.code }))).status).toBe(409);
  });

  it('rejects bad input with field messages', async () => {
    const res = await app.owner.post('/api/lots', { code: '', style: 'orange', volumeL: 0, ethanolPctVol: 40, tempC: 90, vintage: 1850.5 });
    expect(res.status).toBe(400);
    const fields = res.body.error.fields;
    for (const f of ['code', 'name', 'style', 'volumeL', 'ethanolPctVol', 'tempC', 'vintage']) expect(fields).toHaveProperty(f);
    const badTank = await app.owner.post('/api/lots', lotBody({ tankId: 'nope' }));
    expect(badTank.body.error.fields).toHaveProperty('tankId');
    const malformed = await app.owner.request('POST', '/api/lots', '{"code":', { 'content-type': 'application/json' });
    expect(malformed.status).toBe(400);
    expect((await app.owner.get('/api/lots?pageSize=1000')).status).toBe(400);
    expect((await app.owner.get('/api/lots?style=orange')).status).toBe(400);
  });

  it('makes one lot for a create retried with the same Idempotency-Key', async () => {
    const body = lotBody();
    const key = `lot-create-${Date.now()}`;
    await expectReplayedCreate(app.owner, app.owner, '/api/lots', body, key);
    const list = await app.owner.get(`/api/lots?q=${encodeURIComponent(body.code)}`);
    expect(list.body.total).toBe(1);
  });

  it('pages, sorts, searches and filters on the server', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Paging Winery' });
    const tankA = await createTank(client, { name: 'Alpha tank' });
    const tankB = await createTank(client, { name: 'Beta tank' });
    const specs = [
      { code: 'P-05', name: 'Echo', style: 'red', volumeL: 500, vintage: 2021, tankId: tankB.id },
      { code: 'P-01', name: 'Alpha', style: 'white', volumeL: 3000, vintage: 2024, tankId: tankA.id },
      { code: 'P-03', name: 'Charlie', style: 'rosé', volumeL: 1000, vintage: 2023, tankId: null },
      { code: 'P-02', name: 'Bravo', style: 'white', volumeL: 4000, vintage: 2022, tankId: tankB.id },
      { code: 'P-04', name: 'Delta', style: 'sweet', volumeL: 2000, vintage: null, tankId: tankA.id },
    ];
    for (const s of specs) await createLot(client, s);

    const page1 = await client.get('/api/lots?sort=code&order=asc&page=1&pageSize=2');
    expect(page1.body.total).toBe(5);
    expect(page1.body.items.map((l: { code: string }) => l.code)).toEqual(['P-01', 'P-02']);
    const page3 = await client.get('/api/lots?sort=code&order=asc&page=3&pageSize=2');
    expect(page3.body.items.map((l: { code: string }) => l.code)).toEqual(['P-05']);

    const byVolume = await client.get('/api/lots?sort=volumeL&order=desc');
    expect(byVolume.body.items.map((l: { volumeL: number }) => l.volumeL)).toEqual([4000, 3000, 2000, 1000, 500]);
    const byName = await client.get('/api/lots?sort=name&order=desc&pageSize=3');
    expect(byName.body.items.map((l: { name: string }) => l.name)).toEqual(['Echo', 'Delta', 'Charlie']);
    const byTank = await client.get('/api/lots?sort=tank&order=asc');
    expect(byTank.body.items.slice(0, 2).map((l: { tank: { name: string } }) => l.tank.name)).toEqual(['Alpha tank', 'Alpha tank']);

    const whites = await client.get('/api/lots?style=white&sort=code');
    expect(whites.body.items.map((l: { code: string }) => l.code)).toEqual(['P-01', 'P-02']);
    const search = await client.get('/api/lots?q=beta');
    expect(search.body.total).toBe(2);
    const inTank = await client.get(`/api/lots?tankId=${tankA.id}`);
    expect(inTank.body.total).toBe(2);

    // Sort by latest turbidity: lots with results carry the summary of the newest one.
    const lots = (await client.get('/api/lots?sort=code')).body.items as { id: string; code: string }[];
    await createLabResult(client, lots[0].id, { turbidityNtu: 3, sampledAt: '2025-01-01T08:00:00Z' });
    await createLabResult(client, lots[0].id, { turbidityNtu: 0.8, sampledAt: '2025-02-01T08:00:00Z' });
    await createLabResult(client, lots[1].id, { turbidityNtu: 0.4 });
    const byTurbidity = await client.get('/api/lots?sort=turbidityNtu&order=asc&pageSize=2');
    expect(byTurbidity.body.items.map((l: { code: string }) => l.code)).toEqual(['P-02', 'P-01']);
    expect(byTurbidity.body.items[1].latest).toMatchObject({ turbidityNtu: 0.8, cloggingIndex: 10, cloggingIndexBand: { band: 'very-good' } });

    const tanks = await client.get('/api/tanks?sort=lotCount&order=desc');
    expect(tanks.body.items.map((t: { lotCount: number }) => t.lotCount)).toEqual([2, 2]);
  });

  it('refuses to delete a lot or lab result with attached files; otherwise deletes the lot with its lab results', async () => {
    const me = (await app.owner.get('/api/me')).body;
    const lot = await createLot(app.owner);
    const result = await createLabResult(app.owner, lot.id);
    const [file] = await app.db
      .insert(attachmentsTable)
      .values({ wineryId: me.activeWineryId, ownerKind: 'lab-result', ownerId: result.id, fileName: 'lab.pdf', contentType: 'application/pdf', sizeBytes: 10, storageKey: `test/${result.id}` })
      .returning();
    const refusedLot = await app.owner.delete(`/api/lots/${lot.id}`);
    expect(refusedLot.status).toBe(409);
    expect(refusedLot.body.error.message).toMatch(/attached file/);
    expect((await app.owner.delete(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(409);
    await app.db.delete(attachmentsTable).where(eq(attachmentsTable.id, file.id));

    expect((await app.owner.delete(`/api/lots/${lot.id}`)).status).toBe(204);
    expect((await app.owner.get(`/api/lots/${lot.id}/lab-results/${result.id}`)).status).toBe(404);
  });
});

describe('lab results and readiness', () => {
  it('computes the clogging index and band, lists newest first and updates', async () => {
    const lot = await createLot(app.owner);
    const older = await app.owner.post(`/api/lots/${lot.id}/lab-results`, labResultBody({ sampledAt: '2025-03-01T09:00:00Z', turbidityNtu: 2.4, t200s: 30, t400s: 90 }));
    expect(older.status).toBe(201);
    expect(older.body).toMatchObject({ cloggingIndex: 30, cloggingIndexBand: { band: 'good' }, disc: null, createdBy: 'Test Owner' });
    // The badge's verdict is the readiness verdict (one source): 30 s is above the 20 s limit, never "good".
    expect(older.body.cloggingIndexBand).toMatchObject({ verdict: 'borderline', short: 'above 20 s' });
    const lotNow = (await app.owner.get(`/api/lots/${lot.id}`)).body;
    expect(lotNow.readiness.reasons.join(' ')).toContain(older.body.cloggingIndexBand.reason);
    const newer = await createLabResult(app.owner, lot.id, { sampledAt: '2025-03-12T09:00:00Z' });
    const list = await app.owner.get(`/api/lots/${lot.id}/lab-results`);
    expect(list.body.total).toBe(2);
    expect(list.body.items.map((r: { id: string }) => r.id)).toEqual([newer.id, older.body.id]);

    const upd = await app.owner.put(`/api/lots/${lot.id}/lab-results/${older.body.id}`, labResultBody({ sampledAt: '2025-03-01T09:00:00Z', t200s: 30, t400s: 200 }));
    expect(upd.status).toBe(200);
    expect(upd.body).toMatchObject({ cloggingIndex: 140, cloggingIndexBand: { band: 'very-poor' } });
  });

  it('fits a disc test to Vmax and initial flux, and reports a test it cannot fit without failing the save', async () => {
    const lot = await createLot(app.owner);
    const good = await app.owner.post(
      `/api/lots/${lot.id}/lab-results`,
      labResultBody({ discPoints: discPoints(2.4, 5000, 10), discDiameterMm: 25, discPressureBar: 2 }),
    );
    expect(good.status).toBe(201);
    expect(good.body.disc).toMatchObject({ computable: true, diameterMm: 25, pressureBar: 2 });
    expect(good.body.disc.vmaxL).toBeGreaterThan(4.5);
    expect(good.body.disc.vmaxL).toBeLessThan(5.5);
    expect(good.body.disc.j0LPerM2H).toBeGreaterThan(0);

    // A disc that never plugs: flow steady, so t/V does not rise and no Vmax exists.
    const steady = Array.from({ length: 6 }, (_, i) => ({ timeS: (i + 1) * 60, volumeMl: (i + 1) * 120 }));
    const flat = await app.owner.post(`/api/lots/${lot.id}/lab-results`, labResultBody({ discPoints: steady, discDiameterMm: 25 }));
    expect(flat.status).toBe(201);
    expect(flat.body.disc.computable).toBe(false);
    expect(flat.body.disc.reason).toMatch(/./);
  });

  it('rejects bad lab results with field messages', async () => {
    const lot = await createLot(app.owner);
    const url = `/api/lots/${lot.id}/lab-results`;
    const r1 = await app.owner.post(url, { sampledAt: 'yesterday', turbidityNtu: -1 });
    expect(r1.status).toBe(400);
    expect(r1.body.error.fields).toHaveProperty('sampledAt');
    expect(r1.body.error.fields).toHaveProperty('turbidityNtu');
    const r2 = await app.owner.post(url, labResultBody({ t200s: 60, t400s: 50 }));
    expect(r2.status).toBe(400);
    expect(r2.body.error.fields.t400s).toMatch(/longer/);
    const r3 = await app.owner.post(url, labResultBody({ t200s: 60, t400s: null }));
    expect(r3.body.error.fields).toHaveProperty('t400s');
    const r4 = await app.owner.post(url, labResultBody({ discPoints: [{ timeS: 60, volumeMl: 100 }], discDiameterMm: null }));
    expect(r4.status).toBe(400);
    expect(r4.body.error.fields).toHaveProperty('discDiameterMm');
    expect(r4.body.error.fields).toHaveProperty('discPoints');
    const r5 = await app.owner.post(url, labResultBody({ discPoints: [{ timeS: -1, volumeMl: 'x' }, { timeS: 1, volumeMl: 1 }, { timeS: 2, volumeMl: 2 }], discDiameterMm: 25 }));
    expect(r5.status).toBe(400);
    expect(r5.body.error.fields).toHaveProperty('discPoints.0.timeS');
    expect(r5.body.error.fields).toHaveProperty('discPoints.0.volumeMl');
    const r6 = await app.owner.post(url, { sampledAt: '2025-03-10T09:30:00Z' });
    expect(r6.status).toBe(400);
  });

  it('judges a ready, a borderline and a not-ready lot from the latest lab result', async () => {
    const ready = await createLot(app.owner, { style: 'white' });
    await createLabResult(app.owner, ready.id, { sampledAt: '2025-03-01T09:00:00Z', turbidityNtu: 6, t200s: 30, t400s: 150 });
    await createLabResult(app.owner, ready.id, { sampledAt: '2025-03-10T09:00:00Z', turbidityNtu: 0.6, t200s: 28, t400s: 66 });
    const readyLot = (await app.owner.get(`/api/lots/${ready.id}`)).body;
    expect(readyLot.readiness.verdict).toBe('ready');
    expect(readyLot.latestLabResult).toMatchObject({ turbidityNtu: 0.6, cloggingIndex: 10 });
    expect(readyLot.labResultCount).toBe(2);

    const borderline = await createLot(app.owner, { style: 'rosé' });
    await createLabResult(app.owner, borderline.id, { turbidityNtu: 1.3, t200s: 30, t400s: 95 });
    const b = (await app.owner.get(`/api/lots/${borderline.id}`)).body;
    expect(b.readiness.verdict).toBe('borderline');
    expect(b.readiness.reasons.join(' ')).toMatch(/borderline margin/);

    const notReady = await createLot(app.owner, { style: 'red' });
    await createLabResult(app.owner, notReady.id, { turbidityNtu: 9.5, t200s: 44, t400s: 214 });
    const n = (await app.owner.get(`/api/lots/${notReady.id}`)).body;
    expect(n.readiness.verdict).toBe('not-ready');
    expect(n.readiness.reasons.join(' ')).toMatch(/9\.5 NTU/);
    expect(n.thresholds.turbidity.limitNtu).toBe(2);

    const list = await app.owner.get(`/api/lots?q=${encodeURIComponent(notReady.code)}`);
    expect(list.body.items[0].readiness.verdict).toBe('not-ready');
  });

  it("uses the winery's own readiness thresholds from Settings", async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Strict Winery' });
    const lot = await createLot(client, { style: 'white' });
    await createLabResult(client, lot.id, { turbidityNtu: 0.9, t200s: 28, t400s: 66 });
    expect((await client.get(`/api/lots/${lot.id}`)).body.readiness.verdict).toBe('ready');

    const settings = (await client.get('/api/settings/winery')).body;
    const strict = structuredClone(settings.readinessThresholds);
    strict.turbidity.white = { limitNtu: 0.5, borderlineMarginNtu: 0.2, source: 'Our own buyer specification.' };
    expect((await client.put('/api/settings/winery', { readinessThresholds: strict })).status).toBe(200);

    const after = (await client.get(`/api/lots/${lot.id}`)).body;
    expect(after.readiness.verdict).toBe('not-ready');
    expect(after.thresholds).toMatchObject({ isDefault: false, turbidity: { limitNtu: 0.5, source: 'Our own buyer specification.' } });
  });
});

describe('demo cellar', () => {
  it('seeds tanks and lots of every style with a ready, a borderline and a not-ready lot, once', async () => {
    const { client, me } = await signUp(app.baseUrl, { wineryName: 'Seeded Winery' });
    const ctx = { wineryId: me.activeWineryId!, actorId: me.user.id };
    await seedCellar(app.db, ctx);
    await seedCellar(app.db, ctx);
    const tanks = (await client.get('/api/tanks')).body;
    const lots = (await client.get('/api/lots?pageSize=100')).body;
    expect(tanks.total).toBe(5);
    expect(lots.total).toBe(8);
    expect(new Set(lots.items.map((l: { style: string }) => l.style))).toEqual(new Set(['white', 'rosé', 'red', 'sweet', 'sparkling']));
    const verdicts = lots.items.map((l: { readiness: { verdict: string } }) => l.readiness.verdict);
    for (const v of ['ready', 'borderline', 'not-ready', 'unknown']) expect(verdicts).toContain(v);
    const withDisc = lots.items.find((l: { code: string }) => l.code === 'QW-24-SB01');
    const detail = (await client.get(`/api/lots/${withDisc.id}`)).body;
    expect(detail.latestLabResult.disc).toMatchObject({ computable: true });
    expect(detail.labResultCount).toBe(3);
  });
});
