// @vitest-environment node
// The cartridge type's nominal capacity on the Equipment screen (in the person's units) and on
// the plan screen as the stage's last capacity source.
import { describe, expect, it } from 'vitest';
import type { CartridgeTypeDto } from '../../shared/types/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody } from '../factories/plans';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

// 1 L/m² = 0.09290304 m²/ft² ÷ 3.785411784 L/gal gal/ft² (exact unit definitions, NIST HB 44).
const GAL_FT2_PER_L_M2 = 0.09290304 / 3.785411784;

describe('the type’s nominal capacity', () => {
  it('is typed in gal/ft² for a US-units person, refused when negative, and named on the plan', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Nominal Screen Cellars' });
    expect((await client.put('/api/me', { units: 'us' })).status).toBe(200);
    const world = await createPlanWorld(client);
    expect((await client.patch(`/api/cartridge-types/${world.prefilterTypeId}`, { nominalCapacityLPerM2: 2500 })).status).toBe(200);
    const mem = (await client.get(`/api/cartridge-types/${world.membraneTypeId}`)).body as CartridgeTypeDto;

    for (const viewport of [DESKTOP, PHONE]) {
      const phone = viewport.width < 500;
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile: phone });
      await page.goto(`${app.baseUrl}/equipment?tab=cartridge-types`);
      await page.getByRole('button', { name: mem.name, exact: true }).click();
      await page.getByRole('dialog', { name: mem.name }).getByRole('button', { name: 'Edit cartridge type' }).click();
      const form = page.getByRole('dialog', { name: `Edit ${mem.name}` });
      const nominal = form.getByLabel('Nominal capacity to terminal ΔP');
      await nominal.waitFor();
      expect(await nominal.inputValue()).toBe(phone ? String(Number((900 * GAL_FT2_PER_L_M2).toFixed(2))) : '');
      await form.getByText('gal/ft²').first().waitFor();
      await form.getByText(/usual figure for an average wine/).waitFor();
      await nominal.fill('-5');
      await form.getByRole('button', { name: 'Save cartridge type' }).click();
      await form.getByText('The nominal capacity to terminal ΔP must be more than 0.').waitFor();
      await nominal.fill('22.09'); // ≈ 900 L/m²
      await nominal.scrollIntoViewIfNeeded();
      await screenshot(page, `equipment-type-nominal-${phone ? 'phone' : 'desktop'}`);
      await form.getByRole('button', { name: 'Save cartridge type' }).click();
      await form.waitFor({ state: 'detached' });
      expect(errors).toEqual([]);
      await ctx.close();
    }
    const saved = ((await client.get(`/api/cartridge-types/${world.membraneTypeId}`)).body as CartridgeTypeDto).nominalCapacityLPerM2!;
    expect(saved).toBeCloseTo(22.09 / GAL_FT2_PER_L_M2, 6);

    // Back to metric for the plan: the stage names the type's nominal figure.
    expect((await client.put('/api/me', { units: 'metric' })).status).toBe(200);
    expect((await client.patch(`/api/cartridge-types/${world.membraneTypeId}`, { nominalCapacityLPerM2: 900 })).status).toBe(200);
    const plan = await createPlan(client, world.lineId, { name: 'Nominal day' });
    const planLotId = (await addPlanLot(client, plan.id, world.lotId, 6000)).lots[0].id;
    const body = trainBody(world);
    for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
    await addTrain(client, plan.id, planLotId, body);
    for (const viewport of [DESKTOP, PHONE]) {
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile: viewport.width < 500 });
      await page.goto(`${app.baseUrl}/plans/${plan.id}`);
      const option = page.getByRole('article', { name: /Option A/ });
      await option.waitFor();
      const source = option.getByRole('listitem', { name: 'Stage 2' }).getByTestId('stage-capacity-source');
      await expect.poll(() => source.textContent()).toBe('from the type’s nominal figure (900 L/m²; no Vmax test or past runs for this wine)');
      expect(await option.getByRole('listitem', { name: 'Stage 1' }).getByTestId('stage-capacity-source').textContent()).toMatch(/^from the type’s nominal figure \(2,500 L\/m²/);
      await option.getByRole('listitem', { name: 'Stage 2' }).scrollIntoViewIfNeeded();
      await screenshot(page, `plan-capacity-nominal-${viewport.width > 500 ? 'desktop' : 'phone'}`);
      expect(errors).toEqual([]);
      await ctx.close();
    }
  });
});
