// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultReadinessThresholds } from '../../shared/engine';
import { addMember, signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app.close();
});

describe('winery settings', () => {
  it('starts with the default readiness thresholds and their sources', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Settings Winery' });
    const res = await client.get('/api/settings/winery');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'Settings Winery', readinessThresholdsAreDefault: true });
    expect(res.body.readinessThresholds).toEqual(defaultReadinessThresholds);
  });

  it('the owner sets the winery’s own thresholds and can restore the defaults', async () => {
    const { client } = await signUp(app.baseUrl);
    const own = structuredClone(defaultReadinessThresholds);
    own.turbidity.white.limitNtu = 0.8;
    const put = await client.put('/api/settings/winery', { readinessThresholds: own });
    expect(put.status).toBe(200);
    expect(put.body.readinessThresholdsAreDefault).toBe(false);
    expect(put.body.readinessThresholds.turbidity.white.limitNtu).toBe(0.8);
    const reset = await client.put('/api/settings/winery', { readinessThresholds: null });
    expect(reset.body.readinessThresholdsAreDefault).toBe(true);
  });

  it('refuses inconsistent thresholds with a field message', async () => {
    const { client } = await signUp(app.baseUrl);
    const bad = structuredClone(defaultReadinessThresholds);
    bad.cloggingIndex.readyMaxS = 80;
    const res = await client.put('/api/settings/winery', { readinessThresholds: bad });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).join()).toMatch(/readinessThresholds\.cloggingIndex/);
  });

  it.each(['cellar-master', 'winemaker', 'technician', 'auditor'] as const)('a %s reads but may not change them', async (role) => {
    const { client: owner } = await signUp(app.baseUrl);
    const member = await addMember(app, owner, role);
    expect((await member.client.get('/api/settings/winery')).status).toBe(200);
    expect((await member.client.put('/api/settings/winery', { name: 'Renamed' })).status).toBe(403);
  });

  it('changes apply only to the active winery', async () => {
    const { client: a } = await signUp(app.baseUrl, { wineryName: 'A' });
    const { client: b } = await signUp(app.baseUrl, { wineryName: 'B' });
    await a.put('/api/settings/winery', { name: 'A renamed' });
    expect((await b.get('/api/settings/winery')).body.name).toBe('B');
    expect((await a.get('/api/me')).body.memberships[0].wineryName).toBe('A renamed');
  });
});
