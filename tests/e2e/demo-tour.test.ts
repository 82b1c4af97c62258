// @vitest-environment node
// A walk through the demo winery as the cellar team would use it: every screen, each role,
// desktop and phone width, no page errors. Screenshots land in test-output/.
import { describe, expect, it } from 'vitest';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';

const app = setupBrowserApp({ demo: true });

describe('demo tour', () => {
  it('the cellar master walks every screen on a laptop', async () => {
    const { context, page, errors } = await app.signIn('cellar@quillwater.test', { viewport: DESKTOP });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cellar' }).click();
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    await page.getByText('Quillwater Estate').first().waitFor();
    await page.getByRole('link', { name: 'QW-24-SB01' }).first().waitFor();
    await screenshot(page, 'demo-cellar-desktop');

    await page.getByRole('link', { name: 'QW-24-SB01' }).first().click();
    await page.getByRole('heading', { name: 'Readiness for membrane filtration' }).waitFor();
    await screenshot(page, 'demo-lot-desktop');

    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Equipment' }).click();
    await page.getByRole('heading', { name: 'Equipment', exact: true }).waitFor();
    await page.getByText('Prefilter housing A').first().waitFor();
    await screenshot(page, 'demo-equipment-desktop');

    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cartridges' }).click();
    await page.getByRole('heading', { name: 'Cartridges', exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Stock by type' }).waitFor();
    await screenshot(page, 'demo-cartridges-desktop');

    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Team' }).click();
    await page.getByRole('cell', { name: /Sam Okafor/ }).waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('the technician works from a phone: cartridges and a cartridge page', async () => {
    const { context, page, errors } = await app.signIn('tech@quillwater.test', { viewport: PHONE });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cartridges' }).click();
    await page.getByRole('heading', { name: 'Stock by type' }).waitFor();
    await screenshot(page, 'demo-cartridges-technician-phone');
    expect(await page.getByRole('button', { name: 'Register cartridge' }).count()).toBe(0);
    await page.getByRole('link', { name: /^QW-/ }).first().click();
    await page.getByRole('heading', { name: 'Life forecast' }).waitFor();
    await screenshot(page, 'demo-cartridge-technician-phone');
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cellar' }).click();
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    await screenshot(page, 'demo-cellar-technician-phone');
    expect(await page.getByRole('button', { name: 'Add lot' }).count()).toBe(0);
    const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
    expect(scrollsSideways).toBe(false);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('Brambleford never sees Quillwater’s records', async () => {
    const { context, page, errors } = await app.signIn('owner@brambleford.test', { viewport: DESKTOP });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cellar' }).click();
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    await page.getByText('Your cellar is empty').waitFor();
    expect(await page.getByText('Quillwater').count()).toBe(0);
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Cartridges' }).click();
    await page.getByRole('heading', { name: 'Cartridges', exact: true }).waitFor();
    expect(await page.getByRole('link', { name: /^QW-/ }).count()).toBe(0);
    expect(errors).toEqual([]);
    await context.close();
  });
});
