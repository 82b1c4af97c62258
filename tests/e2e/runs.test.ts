// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { approvedPlanLot } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('a run on a phone in the cellar', () => {
  it('a technician starts the run of an approved plan’s lot, logs three readings and sees the forecast', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Runs E2E Cellars' });
    await approvedPlanLot(owner, { name: 'Run day whites', reason: 'Cartridges arrive the day before.' });
    const tech = await addMember(app, owner, 'technician');

    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
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
    await expectNoSeriousA11yViolations(page);

    // Close with a confirmation.
    await page.getByRole('button', { name: 'Close run' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Close run' }).click();
    await page.getByText('Closed', { exact: true }).first().waitFor();
    await page.setViewportSize(DESKTOP);
    await screenshot(page, 'run-closed-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
