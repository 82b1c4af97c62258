// @vitest-environment node
// The run page at many readings: the stage's readings table pages from the server (newest first)
// and the chart draws the thinned points.
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { DESKTOP, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('a run page with many readings', () => {
  it('pages the readings table and draws the chart', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Paged Run Test Cellars' });
    const world = await createPlanWorld(client);
    await fillTrainHousings(client, world);
    const plan = await createPlan(client, world.lineId);
    const planLotId = (await addPlanLot(client, plan.id, world.lotId, 60000)).lots[0].id;
    const trainId = (await addTrain(client, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    expect((await client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
    expect((await client.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
    const run = (await client.post('/api/runs', { planLotId })).body as { id: string };
    const readings = Array.from({ length: 800 }, (_x, i) => ({
      clientKey: randomUUID(),
      stageIndex: 0,
      at: new Date(Date.UTC(2026, 9, 1, 6) + i * 10_000).toISOString(),
      volumeL: 20 * i,
      upstreamBar: 2 + 0.0004 * i,
      downstreamBar: 2,
      flowLh: 3000,
    }));
    expect((await client.post(`/api/runs/${run.id}/readings/batch`, { readings })).status).toBe(200);

    for (const viewport of [DESKTOP, PHONE]) {
      const mobile = viewport === PHONE;
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile });
      await page.goto(`${app.baseUrl}/runs/${run.id}`);
      const table = page.getByTestId('readings-0');
      await table.getByText('Page 1 of 80 · 800 stored').waitFor();
      await page.getByText('800 readings', { exact: false }).first().waitFor();
      await page.getByRole('img', { name: /ΔP against litres/ }).first().waitFor();
      const firstRow = mobile ? table.locator('ul > li').first() : table.locator('tbody tr').first();
      expect(await firstRow.textContent()).toMatch(/15,980/);
      await table.getByRole('button', { name: 'Older' }).click();
      await table.getByText('Page 2 of 80 · 800 stored').waitFor();
      await expect.poll(async () => firstRow.textContent()).toMatch(/15,780/);
      await screenshot(page, `run-readings-pages-${mobile ? 'phone' : 'desktop'}`);
      expect(errors).toEqual([]);
      await ctx.close();
    }
  });
});
