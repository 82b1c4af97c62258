// @vitest-environment node
// A winery's usual hoses saved as presets to pick from on a plan's trains: CRUD over HTTP, the
// roles that may change them (as for drafting plans), another winery's 404, bad input 400.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/permissions';
import type { HosePresetDto } from '../../shared/types/hose-presets';
import { addMember, signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let stranger: Client;
const members = {} as Record<Exclude<Role, 'owner'>, Client>;
let n = 0;
const preset = (over: Record<string, unknown> = {}) => ({ name: `Tank hose ${(n += 1)}`, diameterMm: 38, lengthM: 12, sumK: 2.5, ...over });

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Hose Preset Winery' })).client;
  for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
    members[role] = (await addMember(app, owner, role)).client;
  }
  stranger = (await signUp(app.baseUrl, { wineryName: 'Other Hose Winery' })).client;
});
afterAll(async () => {
  await app?.close();
});

describe('hose presets: create, list, read, change, delete', () => {
  it('keeps the figures in mm and m, lists by name, changes one field, deletes', async () => {
    const created = await owner.post('/api/hose-presets', preset({ name: 'Filler line 51 mm', diameterMm: 51, lengthM: 6, sumK: null, roughnessMm: 0.01 }));
    expect(created.status).toBe(201);
    const p = created.body as HosePresetDto;
    expect(p).toMatchObject({ name: 'Filler line 51 mm', diameterMm: 51, lengthM: 6, sumK: null, roughnessMm: 0.01, createdByName: expect.any(String) });

    const list = await owner.get('/api/hose-presets');
    expect(list.status).toBe(200);
    expect((list.body.items as HosePresetDto[]).map((x) => x.id)).toContain(p.id);

    const changed = await owner.patch(`/api/hose-presets/${p.id}`, { lengthM: 7.5 });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ name: 'Filler line 51 mm', diameterMm: 51, lengthM: 7.5 });
    expect((await owner.get(`/api/hose-presets/${p.id}`)).body.lengthM).toBe(7.5);

    expect((await owner.delete(`/api/hose-presets/${p.id}`)).status).toBe(204);
    expect((await owner.get(`/api/hose-presets/${p.id}`)).status).toBe(404);
    expect((await owner.delete(`/api/hose-presets/${p.id}`)).status).toBe(404);
  });

  it('a name used twice in a winery is 409 with the field', async () => {
    const body = preset({ name: 'Same name hose' });
    expect((await owner.post('/api/hose-presets', body)).status).toBe(201);
    const again = await owner.post('/api/hose-presets', body);
    expect(again.status).toBe(409);
    expect(again.body.error.fields.name).toMatch(/already exists/);
  });
});

describe('hose presets: roles as for drafting plans', () => {
  it('owners, cellar masters and winemakers change them; technicians and auditors read only (403)', async () => {
    for (const role of ['cellar-master', 'winemaker'] as const) {
      const c = members[role];
      const made = await c.post('/api/hose-presets', preset());
      expect(made.status, role).toBe(201);
      expect((await c.patch(`/api/hose-presets/${made.body.id}`, { sumK: 4 })).status, role).toBe(200);
      expect((await c.delete(`/api/hose-presets/${made.body.id}`)).status, role).toBe(204);
    }
    const target = (await owner.post('/api/hose-presets', preset())).body as HosePresetDto;
    for (const role of ['technician', 'auditor'] as const) {
      const c = members[role];
      expect((await c.get('/api/hose-presets')).status, role).toBe(200);
      expect((await c.get(`/api/hose-presets/${target.id}`)).status, role).toBe(200);
      expect((await c.post('/api/hose-presets', preset())).status, role).toBe(403);
      expect((await c.patch(`/api/hose-presets/${target.id}`, { sumK: 1 })).status, role).toBe(403);
      expect((await c.delete(`/api/hose-presets/${target.id}`)).status, role).toBe(403);
    }
  });

  it('signed out is 401', async () => {
    const anon = new (owner.constructor as new (url: string) => Client)(app.baseUrl);
    expect((await anon.get('/api/hose-presets')).status).toBe(401);
  });
});

describe('hose presets: another winery', () => {
  it('cannot see, read, change or delete them (404), and its list holds only its own', async () => {
    const mine = (await owner.post('/api/hose-presets', preset())).body as HosePresetDto;
    expect((await stranger.get(`/api/hose-presets/${mine.id}`)).status).toBe(404);
    expect((await stranger.patch(`/api/hose-presets/${mine.id}`, { lengthM: 1 })).status).toBe(404);
    expect((await stranger.delete(`/api/hose-presets/${mine.id}`)).status).toBe(404);
    expect(((await stranger.get('/api/hose-presets')).body.items as HosePresetDto[]).map((x) => x.id)).not.toContain(mine.id);
    expect((await owner.get(`/api/hose-presets/${mine.id}`)).body.lengthM).toBe(12);
    // the same name is free in another winery
    expect((await stranger.post('/api/hose-presets', { ...preset(), name: mine.name })).status).toBe(201);
    expect((await owner.get('/api/hose-presets/not-a-uuid')).status).toBe(404);
  });
});

describe('hose presets: bad input is 400 with field messages', () => {
  it('names each wrong field', async () => {
    const bad = await owner.post('/api/hose-presets', { name: '  ', diameterMm: 0, lengthM: 5000, sumK: -1 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['diameterMm', 'lengthM', 'name', 'sumK']);
    expect(bad.body.error.fields.diameterMm).toMatch(/diameter/);
    expect(bad.body.error.fields.lengthM).toMatch(/1,000 m/);
    const missing = await owner.post('/api/hose-presets', {});
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['diameterMm', 'lengthM', 'name']);
    const mine = (await owner.post('/api/hose-presets', preset())).body as HosePresetDto;
    const empty = await owner.patch(`/api/hose-presets/${mine.id}`, {});
    expect(empty.status).toBe(400);
    const wrongType = await owner.patch(`/api/hose-presets/${mine.id}`, { diameterMm: 'wide' });
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.error.fields).toHaveProperty('diameterMm');
  });
});
