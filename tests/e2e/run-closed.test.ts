// @vitest-environment node
// A closed run shows its final figures, not a live alarm (issue: plans you can approve with
// confidence): per stage the litres, the last ΔP and whether terminal ΔP was reached; no
// "left", no alarm, no watch.
import { format } from 'date-fns';
import { fr as frLocale } from 'date-fns/locale/fr';
import { describe, expect, it } from 'vitest';
import { formatQuantity } from '../../shared/engine';
import { closedRun } from '../factories/closed-run';
import { DESKTOP, PHONE, screenshot, setupBrowserApp, watchPageErrors } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('a closed run’s page', () => {
  it('shows each stage’s final litres, last ΔP and whether terminal ΔP was reached, and no forecast or alarm', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Closed Run Test Cellars' });
    const { runId } = await closedRun(client);

    for (const viewport of [DESKTOP, PHONE]) {
      const mobile = viewport === PHONE;
      const { context: ctx, page, errors } = await app.pageFor(client, { viewport, mobile });
      await page.goto(`${app.baseUrl}/runs/${runId}`);
      await page.getByText('Closed', { exact: true }).first().waitFor();
      await page.getByRole('region', { name: /Prefilter/ }).waitFor();
      await screenshot(page, `run-closed-${mobile ? 'phone' : 'desktop'}`);

      const pre = page.getByTestId('final-0');
      const mem = page.getByTestId('final-1');
      await pre.waitFor();
      const preText = (await pre.innerText()).replace(/\s+/g, ' ');
      const memText = (await mem.innerText()).replace(/\s+/g, ' ');
      expect(preText).toContain(formatQuantity('volume', 3000, 'metric'));
      expect(preText).toContain(formatQuantity('volume', 1000, 'metric'));
      expect(preText).toMatch(/after 1 regeneration/);
      expect(preText).toContain(formatQuantity('dp', 1.6, 'metric'));
      expect(preText).toMatch(/reached by the last set/);
      expect(memText).toContain(formatQuantity('dp', 0.3, 'metric'));
      expect(memText).toMatch(/not reached/);
      expect(memText).toMatch(/one set for the whole run/);

      // No forecast, no alarm, no watch, no time left.
      const main = (await page.getByRole('main').innerText()).replace(/\s+/g, ' ');
      expect(main).not.toMatch(/Left before terminal ΔP|Alarm|Watch: may fall short|Enough for the lot| left · /);
      expect(await page.getByRole('alert').count()).toBe(0);
      expect(await page.getByTestId('forecast-0').count()).toBe(0);
      expect(await page.getByLabel('Litres through the train so far').count()).toBe(0);
      const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
      expect(scrollsSideways).toBe(false);
      expect(errors).toEqual([]);
      await ctx.close();
    }

    // Dates follow the person's language: a French browser loads the French date locale.
    const french = await app.browser.newContext({ viewport: { width: 1280, height: 900 }, locale: 'fr-FR' });
    await french.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: app.baseUrl })));
    const page = await french.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${app.baseUrl}/runs/${runId}`);
    const closedLine = page.getByText(/^Closed .* by /);
    const month = format(new Date(), 'MMM', { locale: frLocale }); // date-fns' French month, e.g. "déc."
    await expect.poll(async () => (await closedLine.textContent()) ?? '').toContain(month);
    expect(errors).toEqual([]);
    await french.close();
  });
});
