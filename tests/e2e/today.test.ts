// @vitest-environment node
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed';
import { clientDir, launchBrowser, screenshot, watchPageErrors } from '../support/browser';
import { cartridgeEventsTable } from '../../server/db/schema';
import { insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let browser: Browser;

beforeAll(async () => {
  app = await startTestApp({ config: { clientDir } });
  await seedDemo(app.db);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await app?.close();
});

async function signIn(email: string, viewport: { width: number; height: number }, mobile = false) {
  const context = await browser.newContext({ viewport, isMobile: mobile, hasTouch: mobile });
  const page = await context.newPage();
  const errors = watchPageErrors(page);
  await page.goto(`${app.baseUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Sections' }).waitFor();
  return { context, page, errors };
}

describe('today', () => {
  it('the cellar master lands on Today and follows a lot and a cartridge from it', async () => {
    const { context, page, errors } = await signIn('cellar@quillwater.test', { width: 1280, height: 900 });
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    await page.waitForURL(/\/today$/);
    await page.getByText('Quillwater Estate').first().waitFor();
    const lots = page.getByRole('list', { name: 'Lots to look at' });
    const notReady = lots.getByRole('link').filter({ hasText: 'QW-23-PN04' });
    await notReady.waitFor();
    expect(await notReady.textContent()).toContain('not ready');
    const cartridges = page.getByRole('list', { name: 'Cartridges to look at' });
    await cartridges.getByRole('link').first().waitFor();
    expect(await cartridges.getByRole('link').count()).toBeGreaterThanOrEqual(1);
    await page.getByRole('list', { name: 'Stock by type' }).waitFor();
    expect(await page.getByText('will appear here once they are planned').count()).toBe(1);
    await screenshot(page, 'today-desktop');

    await notReady.click();
    await page.getByRole('heading', { name: 'Readiness for membrane filtration' }).waitFor();
    expect(page.url()).toMatch(/\/cellar\/lots\/[0-9a-f-]{36}$/);

    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Today' }).click();
    const serial = (await cartridges.getByRole('link').first().locator('span.font-semibold').first().textContent())!;
    await cartridges.getByRole('link').first().click();
    await page.getByRole('heading', { name: 'Life forecast' }).waitFor();
    await page.getByRole('heading', { name: new RegExp(serial) }).first().waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('works on a phone in one column', async () => {
    const { context, page, errors } = await signIn('tech@quillwater.test', { width: 390, height: 844 }, true);
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    await page.getByRole('list', { name: 'Lots to look at' }).getByRole('link').filter({ hasText: 'QW-23-PN04' }).waitFor();
    await page.getByRole('list', { name: 'Cartridges to look at' }).getByRole('link').first().waitFor();
    await screenshot(page, 'today-phone');
    const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
    expect(scrollsSideways).toBe(false);
    // Every link on the page is a comfortable target.
    const small = await page.locator('main a').evaluateAll((links) =>
      links.filter((a) => a.getBoundingClientRect().height < 44).map((a) => a.textContent),
    );
    expect(small).toEqual([]);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('tells a new winery what to enter first', async () => {
    const { client } = await signUp(app.baseUrl, { name: 'Iris Penhallow', wineryName: 'Saltmarsh Test Cellars' });
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: app.baseUrl })));
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(app.baseUrl);
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Set up your cellar' }).waitFor();
    expect(await page.getByText('will appear here once they are planned').count()).toBe(1);
    await screenshot(page, 'today-new-winery-phone');
    await page.getByRole('link', { name: /Add tanks and lots in Cellar/ }).click();
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('shows a failed integrity test and a type with nothing in stock in words', async () => {
    const { client, me } = await signUp(app.baseUrl, { name: 'Bryn Colley', wineryName: 'Fernhollow Test Cellars' });
    const wineryId = me.activeWineryId!;
    const type = await insertCartridgeType(app.db, wineryId, { name: 'PES 0.45 µm' });
    await insertCartridgeType(app.db, wineryId, { name: 'PP 1 µm', kind: 'prefilter', media: 'polypropylene', ratingUm: 1 });
    const housing = await insertHousing(app.db, wineryId, { name: 'Membrane housing 1' });
    const serial = `${serialPrefix()}-1`;
    const reg = await client.post('/api/cartridges', { serial, batch: 'B25-001', typeId: type.id, lengthIn: 30 });
    await client.post(`/api/cartridges/${reg.body.id}/install`, { housingId: housing.id });
    await app.db.insert(cartridgeEventsTable).values({ wineryId, cartridgeId: reg.body.id, kind: 'integrity', at: new Date(), details: { pass: false } });

    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: app.baseUrl })));
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${app.baseUrl}/today`);
    const cartridge = page.getByRole('list', { name: 'Cartridges to look at' }).getByRole('link').filter({ hasText: serial });
    await cartridge.waitFor();
    expect(await cartridge.textContent()).toContain('Integrity test failed on');
    expect(await cartridge.textContent()).toContain('failed test');
    // Its only cartridge is installed, so neither type has one on the shelf.
    await page.getByText('No PP 1 µm in stock').waitFor();
    await page.getByText('No PES 0.45 µm in stock').waitFor();
    expect(await page.getByText('none in stock').count()).toBe(2);
    await screenshot(page, 'today-shortfall-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
