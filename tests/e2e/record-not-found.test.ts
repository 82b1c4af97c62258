// @vitest-environment node
// A lot or plan page whose record cannot be read (deleted, another winery's, a wrong address)
// says so in words and keeps the way back to its list, on desktop and phone.
import { randomUUID } from 'node:crypto';
import { describe, it } from 'vitest';
import { DESKTOP, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('a record page without its record', () => {
  it('shows "not found" with the link back, for a lot and a plan', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Not Found Test Cellars' });
    for (const [viewport, size] of [[DESKTOP, 'desktop'], [PHONE, 'phone']] as const) {
      const { context, page } = await app.pageFor(owner, { viewport });
      await page.goto(`${app.baseUrl}/cellar/lots/${randomUUID()}`);
      await page.getByText('Lot not found', { exact: true }).waitFor({ timeout: 20_000 });
      await page.getByText('It may have been deleted, or it belongs to another winery.').waitFor();
      await page.getByRole('link', { name: 'Cellar', exact: true }).first().waitFor();
      await screenshot(page, `lot-not-found-${size}`);
      await page.goto(`${app.baseUrl}/plans/${randomUUID()}`);
      await page.getByText('Plan not found', { exact: true }).waitFor({ timeout: 20_000 });
      await page.getByRole('link', { name: 'Plans', exact: true }).first().waitFor();
      await screenshot(page, `plan-not-found-${size}`);
      await context.close();
    }
  });
});
