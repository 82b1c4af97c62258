// @vitest-environment node
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

describe('a run on a phone in the cellar', () => {
  it('a technician starts the run of an approved plan’s lot, logs three readings and sees the forecast', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Runs E2E Cellars' });
    const world = await createPlanWorld(owner);
    await fillTrainHousings(owner, world);
    const plan = await createPlan(owner, world.lineId, { name: 'Run day whites' });
    const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
    const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
    expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
    const tech = await addMember(app, owner, 'technician');

    const { context, page, errors } = await signInAs(browser, app.baseUrl, tech.email, { viewport: { width: 390, height: 844 }, mobile: true, password: TEST_PASSWORD });
    await page.goto(`${app.baseUrl}/runs`);
    await page.getByRole('heading', { name: 'Runs', exact: true }).waitFor();
    await screenshot(page, 'runs-list-phone');
    await page.getByRole('button', { name: 'Start run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]+$/);
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    expect(await page.getByLabel('Upstream pressure').getAttribute('inputmode')).toBe('decimal');

    const readings = [
      ['500', '2.20', '2.00'],
      ['1000', '2.26', '2.00'],
      ['1500', '2.34', '2.00'],
    ];
    // The flow meter reads 2,400 L/h; it stays filled in for the next readings.
    await page.getByLabel('Flow (optional)').fill('2400');
    for (const [litres, up, down] of readings) {
      await page.getByLabel('Litres through the train so far').fill(litres);
      await page.getByLabel('Upstream pressure').fill(up);
      await page.getByLabel('Downstream pressure').fill(down);
      await page.getByRole('button', { name: 'Save reading' }).click();
      await page.getByRole('status').getByText(`${Number(litres).toLocaleString('en')} L`, { exact: false }).first().waitFor();
      await page.getByText('Saved', { exact: true }).waitFor();
    }
    const forecast = page.getByTestId('forecast-0');
    await forecast.waitFor();
    expect(await forecast.textContent()).toMatch(/≈ [\d,]+ L left · about \d+ (h|min)/);
    expect(await forecast.textContent()).not.toMatch(/\d:\d\d/);
    // Right under Save: the stage's ΔP, what is left and a small chart.
    expect(await page.getByTestId('saved-reading').textContent()).toMatch(/About .* L \/ .*min left|About .* L \/ \d+ h left|left|Beyond the readings|not rising/);
    expect(await forecast.textContent()).toMatch(/2,400 L\/h/);
    await page.getByRole('img', { name: /ΔP against litres for Prefilter/ }).last().waitFor();
    await screenshot(page, 'run-forecast-phone');

    // Close with a confirmation.
    await page.getByRole('button', { name: 'Close run' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Close run' }).click();
    await page.getByText('Closed', { exact: true }).first().waitFor();
    await page.setViewportSize({ width: 1280, height: 900 });
    await screenshot(page, 'run-closed-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
