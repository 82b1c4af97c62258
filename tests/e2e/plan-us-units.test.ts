// @vitest-environment node
// Every figure on the plan screen in the person's units (issue: plans you can approve with
// confidence): in US customary no litre, bar, °C or per-hL figure shows.
import { describe, expect, it } from 'vitest';
import { addTrain, trainBody, draftPlanLot } from '../factories/plans';
import { setupBrowserApp, DESKTOP, screenshot } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('the plan screen in US customary units', () => {
  it('shows gallons, gal/min, psi, °F, gal/ft² and cost per 100 gal, and no metric figure', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'US Plan Test Cellars' });
    expect((await client.put('/api/me', { units: 'us' })).status).toBe(200);
    const { world, plan, planLotId } = await draftPlanLot(client, 'US day');
    const trainId = (await addTrain(client, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    expect((await client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);

    const { context: ctx, page, errors } = await app.pageFor(client, { viewport: DESKTOP });
    await page.goto(`${app.baseUrl}/plans/${plan.id}`);
    const option = page.getByRole('article', { name: /Option A/ });
    await option.waitFor();
    await page.getByRole('list', { name: 'Timeline' }).waitFor();
    const text = (await page.getByRole('main').innerText()).replace(/\s+/g, ' ');
    // US figures present (6,000 L = 1,585 gal; capacity 3,000 L/m² = 73.6 gal/ft²).
    expect(text).toMatch(/1,585 gal/);
    expect(text).toMatch(/gal\/min/);
    expect(text).toMatch(/psi/);
    expect(text).toMatch(/Cost per 100 gal/);
    expect(await option.getByRole('listitem', { name: 'Stage 1' }).getByLabel('Capacity').inputValue()).toBe(String(Number(((3000 * 0.09290304) / 3.785411784).toFixed(4))));
    await option.getByRole('listitem', { name: 'Stage 1' }).getByText('gal/ft²').first().waitFor();
    // No metric figure: a number followed by a metric unit.
    const metric = text.match(/\d\s?(L|L\/h|L\/m²|bar|°C|hL|m²)(?![a-zA-Z/²])/g) ?? [];
    expect(metric).toEqual([]);
    expect(text).not.toMatch(/per hL/);
    await screenshot(page, 'plan-us-units-desktop');
    expect(errors).toEqual([]);
    await ctx.close();
  });
});
