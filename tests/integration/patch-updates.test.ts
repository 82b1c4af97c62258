// @vitest-environment node
// One verb for an update: PATCH with any subset of the fields; a field left out stays as stored.
// PUT stays as an alias for one release (the other test files still use it).
import { describe, expect, it } from 'vitest';
import { createLabResult, createLot, createTank, discPoints, lotBody, tankBody } from '../factories/cellar';
import { setupApiApp } from '../support/api-app';
import { addMember, signUp } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Patch Test Winery', otherWineryName: 'Other Patch Winery' });

/** The fields a client sees, without the times that change on every write. */
const stable = <T extends Record<string, unknown>>(dto: T) => {
  const { updatedAt: _u, ...rest } = dto;
  return rest;
};

describe('PATCH /api/tanks/:id', () => {
  it('changes the fields sent and leaves the others as stored', async () => {
    const tank = await createTank(app.owner, { capacityL: 8_000, notes: 'Door seal new in March' });
    const before = (await app.owner.get(`/api/tanks/${tank.id}`)).body;
    const res = await app.owner.patch(`/api/tanks/${tank.id}`, { capacityL: 8_500 });
    expect(res.status).toBe(200);
    expect(stable(res.body)).toEqual({ ...stable(before), capacityL: 8_500 });
    expect((await app.owner.get(`/api/tanks/${tank.id}`)).body).toMatchObject({ name: tank.name, capacityL: 8_500, notes: 'Door seal new in March' });
  });

  it('checks the fields sent (400 with the field) and the merged tank; an empty patch changes nothing', async () => {
    const tank = await createTank(app.owner);
    const bad = await app.owner.patch(`/api/tanks/${tank.id}`, { capacityL: -1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('capacityL');
    const same = await app.owner.patch(`/api/tanks/${tank.id}`, {});
    expect(same.status).toBe(200);
    expect(same.body).toMatchObject({ name: tank.name, capacityL: 10_000, notes: '' });
  });

  it('a duplicate name is 409; another winery’s tank is 404; a technician is 403', async () => {
    const a = await createTank(app.owner);
    const b = await createTank(app.owner);
    expect((await app.owner.patch(`/api/tanks/${b.id}`, { name: a.name })).status).toBe(409);
    expect((await app.other.patch(`/api/tanks/${a.id}`, { notes: 'x' })).status).toBe(404);
    const tech = (await addMember(app, app.owner, 'technician')).client;
    expect((await tech.patch(`/api/tanks/${a.id}`, { notes: 'x' })).status).toBe(403);
  });
});

describe('PATCH /api/lots/:id', () => {
  it('changes one field; defaults are not applied to the fields left out', async () => {
    const tank = await createTank(app.owner);
    const lot = await createLot(app.owner, { tankId: tank.id, sugarGPerL: 4, notes: 'Cold-stabilised', vintage: 2023 });
    const before = (await app.owner.get(`/api/lots/${lot.id}`)).body;
    const res = await app.owner.patch(`/api/lots/${lot.id}`, { tempC: 14 });
    expect(res.status).toBe(200);
    expect(stable(res.body)).toEqual({ ...stable(before), tempC: 14 });
    expect(res.body).toMatchObject({ sugarGPerL: 4, notes: 'Cold-stabilised', vintage: 2023, tank: { id: tank.id } });
  });

  it('null clears a nullable field; another winery’s tank is refused with the field', async () => {
    const foreignTank = await createTank(app.other);
    const tank = await createTank(app.owner);
    const lot = await createLot(app.owner, { tankId: tank.id });
    const cleared = await app.owner.patch(`/api/lots/${lot.id}`, { tankId: null, vintage: null });
    expect(cleared.status).toBe(200);
    expect(cleared.body).toMatchObject({ tank: null, vintage: null, code: lot.code });
    const foreign = await app.owner.patch(`/api/lots/${lot.id}`, { tankId: foreignTank.id });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields).toHaveProperty('tankId');
    expect((await app.other.patch(`/api/lots/${lot.id}`, { name: 'Taken over' })).status).toBe(404);
  });
});

describe('PATCH /api/lots/:id/lab-results/:resultId', () => {
  it('changes one result and keeps the rest; the merged result is checked as a whole', async () => {
    const lot = await createLot(app.owner, lotBody());
    const result = await createLabResult(app.owner, lot.id, { turbidityNtu: 0.6, t200s: 28, t400s: 66, freeSo2MgL: 28, notes: 'Sample from the top valve' });
    const before = (await app.owner.get(`/api/lots/${lot.id}/lab-results/${result.id}`)).body;
    const res = await app.owner.patch(`/api/lots/${lot.id}/lab-results/${result.id}`, { turbidityNtu: 0.4 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ turbidityNtu: 0.4, t200s: 28, t400s: 66, freeSo2MgL: 28, notes: 'Sample from the top valve', sampledAt: before.sampledAt });
    // t400 shorter than the stored t200: the rule across fields runs on the merged result.
    const bad = await app.owner.patch(`/api/lots/${lot.id}/lab-results/${result.id}`, { t400s: 20 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('t400s');
    // Disc points without a stored diameter: the merged result asks for it.
    const noDiameter = await app.owner.patch(`/api/lots/${lot.id}/lab-results/${result.id}`, { discPoints: discPoints() });
    expect(noDiameter.status).toBe(400);
    expect(noDiameter.body.error.fields).toHaveProperty('discDiameterMm');
    expect((await app.other.patch(`/api/lots/${lot.id}/lab-results/${result.id}`, { notes: 'x' })).status).toBe(404);
  });
});

describe('PATCH on the person and the winery settings', () => {
  it('PATCH /api/me changes one field and keeps the other', async () => {
    const { client } = await signUp(app.baseUrl, { name: 'Mira Holt' });
    const res = await client.patch('/api/me', { units: 'us' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ name: 'Mira Holt', units: 'us' });
    expect((await client.get('/api/me')).body.user).toMatchObject({ name: 'Mira Holt', units: 'us' });
  });

  it('PATCH /api/me/active-winery switches winery; one the person is not in is 404', async () => {
    const { client, me } = await signUp(app.baseUrl);
    const res = await client.patch('/api/me/active-winery', { wineryId: me.activeWineryId });
    expect(res.status).toBe(200);
    const foreign = (await app.other.get('/api/me')).body.activeWineryId;
    expect((await client.patch('/api/me/active-winery', { wineryId: foreign })).status).toBe(404);
  });

  it('PATCH /api/settings/winery changes one setting and keeps the others', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Settings Patch Winery' });
    expect((await client.patch('/api/settings/winery', { timeZone: 'Europe/Vienna', orderLeadTimeDays: 12 })).status).toBe(200);
    const res = await client.patch('/api/settings/winery', { gaugeResolutionBar: 0.05 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'Settings Patch Winery', timeZone: 'Europe/Vienna', orderLeadTimeDays: 12 });
    expect((await client.get('/api/settings/winery')).body).toMatchObject({ timeZone: 'Europe/Vienna', orderLeadTimeDays: 12, gaugeResolutionBar: 0.05 });
  });

  it('PATCH /api/me/alert-preferences changes the kinds sent; PUT still replaces the set', async () => {
    const { client } = await signUp(app.baseUrl);
    const initial = (await client.get('/api/me/alert-preferences')).body.items as { kind: string; channel: string }[];
    const [first, second] = initial;
    const otherChannel = (c: string) => (c === 'off' ? 'app' : 'off');
    expect((await client.put('/api/me/alert-preferences', { items: [{ kind: first.kind, channel: otherChannel(first.channel) }] })).status).toBe(200);
    const res = await client.patch('/api/me/alert-preferences', { items: [{ kind: second.kind, channel: otherChannel(second.channel) }] });
    expect(res.status).toBe(200);
    const after = new Map((res.body.items as { kind: string; channel: string }[]).map((i) => [i.kind, i.channel]));
    expect(after.get(first.kind)).toBe(otherChannel(first.channel));
    expect(after.get(second.kind)).toBe(otherChannel(second.channel));
    for (const item of initial.slice(2)) expect(after.get(item.kind)).toBe(item.channel);
  });
});

describe('PUT stays as an alias for one release', () => {
  it('a full PUT of a tank still replaces it', async () => {
    const tank = await createTank(app.owner, { notes: 'Old note' });
    const res = await app.owner.put(`/api/tanks/${tank.id}`, tankBody({ name: tank.name, capacityL: 9_000 }));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ capacityL: 9_000, notes: '' });
  });
});
