// @vitest-environment node
// The demo data's runs are full records: cartridges per stage, a mid-run change, a correction.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMigrations } from '../../server/db/migrate';
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed';
import { databaseUrl, ensureDatabase } from '../../scripts/lib/postgres';
import { Client, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;

beforeAll(async () => {
  // A database of its own, made afresh: the demo has fixed ids, and this file starts a run on it.
  ensureDatabase('porewise_demo_test', { fresh: true });
  await runMigrations(databaseUrl('porewise_demo_test'));
  app = await startTestApp({ databaseUrl: databaseUrl('porewise_demo_test') });
  await seedDemo(app.db);
  await seedDemo(app.db); // idempotent
}, 180_000);
afterAll(async () => {
  await app?.close();
});

type Stint = { cartridgeId: string; serial: string; installedAtVolumeL: number; removedAtVolumeL: number | null; litresCarried: number | null };

describe('demo runs', () => {
  it('two closed runs with full records: one with a prefilter change, one with a corrected reading', async () => {
    const auditor = new Client(app.baseUrl);
    expect((await auditor.post('/api/auth/sign-in', { email: 'auditor@quillwater.test', password: DEMO_PASSWORD })).status).toBe(200);
    const runs = (await auditor.get('/api/runs')).body.items as { id: string; status: string; lotCode: string; lotId: string }[];
    expect(runs.map((r) => r.lotCode).sort()).toEqual(['QW-23-PN04', 'QW-24-RS03']);
    // their records read the readiness kept at the start, as a run started in the app does
    for (const r of runs) {
      const record = (await auditor.get(`/api/records/lots/${r.lotId}`)).body as { runs: { readiness: { source: string; note: string | null } }[] };
      expect(record.runs[0].readiness).toMatchObject({ source: 'frozen-at-start', note: null });
    }
    expect(runs.every((r) => r.status === 'closed')).toBe(true);
    const details = await Promise.all(runs.map(async (r) => (await auditor.get(`/api/runs/${r.id}`)).body));
    const changed = details.find((d) => d.changes.length > 0);
    const corrected = details.find((d) => d.stages.some((s: { readings: { original: unknown }[] }) => s.readings.some((x) => x.original !== null)));
    expect(changed?.lotCode).toBe('QW-23-PN04');
    expect(corrected?.lotCode).toBe('QW-24-RS03');
    for (const d of details) {
      expect(d.closedByName).toBeTruthy();
      for (const s of d.stages) {
        expect(s.cartridges.length).toBeGreaterThan(0);
        // the stints of one stage add up to the litres of the run at every point
        const carried = (s.cartridges as Stint[]).reduce((sum, c) => sum + (c.litresCarried ?? 0), 0);
        const perRound = carried / (s.cartridges as Stint[]).filter((c) => c.installedAtVolumeL === 0).length;
        expect(perRound).toBeCloseTo(d.currentVolumeL, 6);
        // a fit, or the plain words why there is none (too few readings since a change, ΔP not rising)
        expect(s.fit !== null || s.forecast !== null || Boolean(s.note) || Boolean(s.flatWarning)).toBe(true);
      }
    }
    // a changed-out prefilter is in stock with exactly the litres it carried in its history
    const out = (changed.stages[0].cartridges as Stint[]).find((c) => c.removedAtVolumeL !== null)!;
    const cart = (await auditor.get(`/api/cartridges/${out.cartridgeId}`)).body;
    expect(cart.status).toBe('in-stock');
    const runEvents = (cart.events as { kind: string; details: { litres: number } }[]).filter((e) => e.kind === 'run');
    expect(cart.litresFiltered).toBeCloseTo(runEvents.reduce((sum, e) => sum + e.details.litres, 0), 6);
  });

  it('the draft plan of the demo matches the installed cartridges: it is approved (with a reason for its cautions) and started', async () => {
    const master = new Client(app.baseUrl);
    expect((await master.post('/api/auth/sign-in', { email: 'cellar@quillwater.test', password: DEMO_PASSWORD })).status).toBe(200);
    const plans = (await master.get('/api/plans')).body.items as { id: string; status: string; name: string }[];
    const draft = plans.find((p) => p.status === 'draft' && p.name === 'Whites bottling, week ahead')!;
    expect(draft).toBeTruthy();
    let approved = await master.post(`/api/plans/${draft.id}/approve`);
    if (approved.status === 409 && approved.body.error.code === 'plan_needs_reason') {
      approved = await master.post(`/api/plans/${draft.id}/approve`, { reason: 'Demo: the borderline Chardonnay is re-tested on the morning.' });
    }
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    expect(approved.body.status).toBe('approved');
    const options = (await master.get('/api/runs/start-options')).body.items as { planLotId: string; planId: string }[];
    const mine = options.filter((o) => o.planId === draft.id);
    expect(mine.length).toBe(2);
    // every chosen train passes the start checks with nothing to override
    for (const o of mine) {
      const check = await master.get(`/api/runs/start-check?planLotId=${o.planLotId}`);
      expect(check.status).toBe(200);
      expect(check.body.reasons).toEqual([]);
    }
    const started = await master.post('/api/runs', { planLotId: mine[0].planLotId });
    expect(started.status).toBe(201);
    expect(started.body.status).toBe('running');
    expect(started.body.override).toBeNull();
    for (const s of started.body.stages as { cartridges: unknown[] }[]) expect(s.cartridges.length).toBeGreaterThan(0);
  });
});
