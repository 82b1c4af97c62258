// @vitest-environment node
// Hoses on the plan screen (issue: plans you can approve with confidence): each train's hoses are
// edited in place, the line loss and the pump pressure are recomputed live by the engine, and
// saving the train keeps them.
import { describe, expect, it } from 'vitest';
import { formatQuantity } from '../../shared/engine';
import type { PlanDto } from '../../shared/types/plans';
import { addTrain, trainBody, draftPlanLot } from '../factories/plans';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('hoses on the plan screen', () => {
  it('a hose typed on the train raises the line loss and pump pressure live, and is saved with the train', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Hose Test Cellars' });
    const { world, plan, planLotId } = await draftPlanLot(client, 'Hose day');
    await addTrain(client, plan.id, planLotId, trainBody(world));

    for (const viewport of [
      DESKTOP,
      PHONE,
    ]) {
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile: viewport.width < 500 });
      await page.goto(`${app.baseUrl}/plans/${plan.id}`);
      const option = page.getByRole('article', { name: /Option A/ });
      await option.waitFor();
      const lineLoss = option.getByTestId('train-line-loss').locator('dd');
      if (viewport.width > 500) {
        expect(await lineLoss.textContent()).toBe(formatQuantity('dp', 0, 'metric'));
        await option.getByText('None entered: the pump pressure counts no line loss.').waitFor();
        await option.getByRole('button', { name: 'Add hose' }).click();
        const hose = option.getByRole('listitem', { name: 'Hose 1' });
        await hose.getByLabel('Diameter').fill('25');
        await hose.getByLabel('Length').fill('20');
        await hose.getByLabel('Fittings ΣK').fill('5');
        await expect.poll(async () => lineLoss.textContent()).not.toBe(formatQuantity('dp', 0, 'metric'));
        await option.getByRole('button', { name: 'Save train' }).click();
        await expect.poll(() => option.getByText('Unsaved changes', { exact: false }).count()).toBe(0);
        const detail = (await client.get(`/api/plans/${plan.id}`)).body as PlanDto;
        const train = detail.lots[0].trains[0];
        expect(train.hoses).toEqual([{ diameterMm: 25, lengthM: 20, roughnessMm: null, sumK: 5 }]);
        // The figure on screen is the server's sizing of the saved train (the same engine).
        expect(train.sizing!.totals.lineLossBar).toBeGreaterThan(0);
        expect(await lineLoss.textContent()).toBe(formatQuantity('dp', train.sizing!.totals.lineLossBar, 'metric'));
      } else {
        await option.getByRole('listitem', { name: 'Hose 1' }).waitFor();
        const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
        expect(scrollsSideways).toBe(false);
      }
      await option.getByRole('group', { name: 'Hoses and lines' }).scrollIntoViewIfNeeded();
      await screenshot(page, `plan-hoses-${viewport.width > 500 ? 'desktop' : 'phone'}`);
      expect(errors).toEqual([]);
      await ctx.close();
    }
  });
});
