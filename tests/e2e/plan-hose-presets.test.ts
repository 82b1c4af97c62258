// @vitest-environment node
// The winery's usual hoses as presets on the plan screen, and where each stage's capacity came
// from (issue: plans you can approve with confidence): picking a preset fills a hose and the line
// loss is recomputed live; a typed hose is saved as a preset; a stage sized from past runs names
// its evidence.
import { describe, expect, it } from 'vitest';
import { formatQuantity } from '../../shared/engine';
import type { HosePresetDto } from '../../shared/types/hose-presets';
import type { PlanDto } from '../../shared/types/plans';
import { createLot } from '../factories/cellar';
import { createClosedRunReaching } from '../factories/past-runs';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody } from '../factories/plans';
import { createRecordWorld } from '../factories/records';
import { DESKTOP, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

const viewports = [DESKTOP, PHONE];

describe('hose presets on the plan screen', () => {
  it('picking a preset fills a hose and recomputes the line loss; a typed hose is saved as a preset', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Preset Hose Cellars' });
    const world = await createPlanWorld(client);
    const made = await client.post('/api/hose-presets', { name: 'Tank hose 38 mm', diameterMm: 38, lengthM: 25, sumK: 3 });
    expect(made.status).toBe(201);
    const plan = await createPlan(client, world.lineId, { name: 'Preset day' });
    const planLotId = (await addPlanLot(client, plan.id, world.lotId, 6000)).lots[0].id;
    await addTrain(client, plan.id, planLotId, trainBody(world));

    for (const viewport of viewports) {
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile: viewport.width < 500 });
      await page.goto(`${app.baseUrl}/plans/${plan.id}`);
      const option = page.getByRole('article', { name: /Option A/ });
      await option.waitFor();
      const lineLoss = option.getByTestId('train-line-loss').locator('dd');
      const picker = option.getByLabel('Pick a preset');
      await expect.poll(() => picker.locator('option', { hasText: 'Tank hose 38 mm' }).count()).toBe(1);
      if (viewport.width > 500) {
        expect(await lineLoss.textContent()).toBe(formatQuantity('dp', 0, 'metric'));
        expect(await picker.locator('option', { hasText: 'Tank hose 38 mm' }).textContent()).toBe(`Tank hose 38 mm (38 mm × ${formatQuantity('length', 25, 'metric')}, ΣK 3)`);
        await picker.selectOption((made.body as HosePresetDto).id);
        const hose = option.getByRole('listitem', { name: 'Hose 1' });
        expect(await hose.getByLabel('Diameter').inputValue()).toBe('38');
        expect(await hose.getByLabel('Length').inputValue()).toBe('25');
        expect(await hose.getByLabel('Fittings ΣK').inputValue()).toBe('3');
        await expect.poll(async () => lineLoss.textContent()).not.toBe(formatQuantity('dp', 0, 'metric'));
        await option.getByRole('button', { name: 'Save train' }).click();
        await expect.poll(() => option.getByText('Unsaved changes', { exact: false }).count()).toBe(0);
        const train = ((await client.get(`/api/plans/${plan.id}`)).body as PlanDto).lots[0].trains[0];
        expect(train.hoses).toEqual([{ diameterMm: 38, lengthM: 25, roughnessMm: null, sumK: 3 }]);
        expect(await lineLoss.textContent()).toBe(formatQuantity('dp', train.sizing!.totals.lineLossBar, 'metric'));

        // A longer hose typed on the train, saved as a preset of its own.
        await option.getByRole('button', { name: 'Add hose' }).click();
        const second = option.getByRole('listitem', { name: 'Hose 2' });
        await second.getByLabel('Diameter').fill('51');
        await second.getByLabel('Length').fill('40');
        await option.getByRole('button', { name: 'Save hose 2 as a preset' }).click();
        const dialog = page.getByRole('dialog', { name: 'Save the hose as a preset' });
        await dialog.getByLabel('Name').fill('Cellar to filler 51 mm');
        await screenshot(page, 'plan-hose-preset-save-desktop');
        await dialog.getByRole('button', { name: 'Save preset' }).click();
        await dialog.waitFor({ state: 'hidden' });
        const presets = (await client.get('/api/hose-presets')).body.items as HosePresetDto[];
        expect(presets.find((p) => p.name === 'Cellar to filler 51 mm')).toMatchObject({ diameterMm: 51, lengthM: 40, sumK: null });
        await expect.poll(() => picker.locator('option', { hasText: 'Cellar to filler 51 mm' }).count()).toBe(1);
      } else {
        await picker.scrollIntoViewIfNeeded();
        const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
        expect(scrollsSideways).toBe(false);
      }
      await option.getByRole('group', { name: 'Hoses and lines' }).scrollIntoViewIfNeeded();
      await screenshot(page, `plan-hose-presets-${viewport.width > 500 ? 'desktop' : 'phone'}`);
      expect(errors).toEqual([]);
      await ctx.close();
    }
  });
});

describe('capacity source on the plan screen', () => {
  it('a stage sized from the winery’s past runs names them and their range', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Past Runs Cellars' });
    const world = await createRecordWorld(client);
    // Membrane (6.3 m²): 1,000 and 1,200 L/m²; prefilter (4.05 m²): 1,000 and 1,500 L/m².
    await createClosedRunReaching(client, world, { style: 'white', reachL: [4050, 6300] });
    await createClosedRunReaching(client, world, { style: 'white', reachL: [6075, 7560] });
    const lot = await createLot(client, { style: 'white', volumeL: 6000 });
    const plan = await createPlan(client, world.lineId, { name: 'Learned day' });
    const planLotId = (await addPlanLot(client, plan.id, lot.id, 6000)).lots[0].id;
    const body = trainBody(world);
    for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
    await addTrain(client, plan.id, planLotId, body);

    for (const viewport of viewports) {
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile: viewport.width < 500 });
      await page.goto(`${app.baseUrl}/plans/${plan.id}`);
      const option = page.getByRole('article', { name: /Option A/ });
      await option.waitFor();
      const membrane = option.getByRole('listitem', { name: 'Stage 2' }).getByTestId('stage-capacity-source');
      await expect.poll(() => membrane.textContent()).toBe('from past runs: 2 runs of whites, 1,000–1,200 L/m² (median 1,100 L/m²)');
      expect(await option.getByRole('listitem', { name: 'Stage 1' }).getByTestId('stage-capacity-source').textContent()).toMatch(/^from past runs: 2 runs of whites, 1,000–1,500 L\/m²/);
      await option.getByRole('listitem', { name: 'Stage 2' }).scrollIntoViewIfNeeded();
      await screenshot(page, `plan-capacity-past-runs-${viewport.width > 500 ? 'desktop' : 'phone'}`);
      expect(errors).toEqual([]);
      await ctx.close();
    }
  }, 120_000);
});
