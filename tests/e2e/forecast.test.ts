// @vitest-environment node
import { randomUUID } from 'node:crypto';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { clientDir, launchBrowser, screenshot, signInAs } from '../support/browser';
import { addMember, signUp, startTestApp, TEST_PASSWORD, type TestApp } from '../support/test-app';

let app: TestApp;
let browser: Browser;

beforeAll(async () => {
  app = await startTestApp({ config: { clientDir } });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await app?.close();
});

describe('a flat stage on the run page (common practice, no source)', () => {
  it('shows the bypass warning and no litres-left figure, on a phone and a desk', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Flat Stage Cellars' });
    const world = await createPlanWorld(owner);
    await fillTrainHousings(owner, world);
    const plan = await createPlan(owner, world.lineId, { name: 'Flat day' });
    const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
    const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
    expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
    const run = (await owner.post('/api/runs', { planLotId })).body as { id: string };
    // a membrane stage whose ΔP stays at 0.05 bar while litres go through: the case
    for (const v of [0, 800, 1600, 2400, 3200]) {
      const r = await owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 2.05, downstreamBar: 2.0, flowLh: 2400 });
      expect(r.status).toBe(201);
    }
    const tech = await addMember(app, owner, 'technician');
    const { context, page, errors } = await signInAs(browser, app.baseUrl, tech.email, { viewport: { width: 390, height: 844 }, mobile: true, password: TEST_PASSWORD });
    await page.goto(`${app.baseUrl}/runs/${run.id}`);
    const warning = page.getByTestId('flat-0');
    await warning.waitFor();
    expect(await warning.textContent()).toMatch(/ΔP not rising: possible bypass or gauge fault/);
    expect(await page.getByTestId('forecast-0').count()).toBe(0);
    const note = await page.getByTestId('forecast-note-0').textContent();
    expect(note).toMatch(/not rising/);
    expect(note).not.toMatch(/\d\s?L\b/);
    const body = (await page.locator('main').textContent()) ?? '';
    expect(body).not.toMatch(/L left|Enough for the lot|Invalid Date|NaN|Infinity|e\+\d/);
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(390);
    await warning.scrollIntoViewIfNeeded();
    await screenshot(page, 'run-flat-stage-phone');
    await page.setViewportSize({ width: 1280, height: 900 });
    await screenshot(page, 'run-flat-stage-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
