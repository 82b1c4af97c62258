// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { approvedPlanLot, startRun } from '../factories/plans';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('a flat stage on the run page (common practice, no source)', () => {
  it('shows the bypass warning and no litres-left figure, on a phone and a desk', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Flat Stage Cellars' });
    const { planLotId } = await approvedPlanLot(owner, { name: 'Flat day' });
    const run = await startRun(owner, planLotId);
    // a membrane stage whose ΔP stays at 0.05 bar while litres go through: the case
    for (const v of [0, 800, 1600, 2400, 3200]) {
      const r = await owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 2.05, downstreamBar: 2.0, flowLh: 2400 });
      expect(r.status).toBe(201);
    }
    const tech = await addMember(app, owner, 'technician');
    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
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
    await page.setViewportSize(DESKTOP);
    await screenshot(page, 'run-flat-stage-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
