// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { cartridgeEventsTable } from '../../server/db/schema';
import type { PlanDto } from '../../shared/types/plans';
import { insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { createLot } from '../factories/cellar';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody } from '../factories/plans';
import { addMember, signUp, type Client } from '../support/test-app';

const app = setupBrowserApp({ demo: true });

describe('today', () => {
  it('the cellar master lands on Today and follows a lot and a cartridge from it', async () => {
    const { context, page, errors } = await app.signIn('cellar@quillwater.test', { viewport: DESKTOP });
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
    expect(await page.getByText(/Runs in progress, with their readings and forecasts, are on the/).count()).toBe(1);
    await screenshot(page, 'today-desktop');
    await expectNoSeriousA11yViolations(page);

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

  it('shows the demo bottling day a week ahead first, and opens its plan', async () => {
    const { context, page, errors } = await app.signIn('cellar@quillwater.test', { viewport: DESKTOP });
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    const days = page.getByRole('list', { name: 'Next bottling days' });
    const plan = days.getByRole('link').filter({ hasText: 'Whites bottling, week ahead' });
    await plan.waitFor();
    const text = (await plan.textContent())!;
    expect(text).toContain('in 7 days');
    expect(text).toContain('draft');
    expect(text).toMatch(/2\s*lots/);
    expect(text).toMatch(/trains chosen|trains to choose/);
    // It comes before the lots and cartridges to look at.
    const headings = await page.locator('main h2').allTextContents();
    expect(headings.indexOf('Next bottling days')).toBe(0);
    await screenshot(page, 'today-plans-desktop');
    await plan.click();
    await page.waitForURL(/\/plans\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: 'Whites bottling, week ahead' }).first().waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('works on a phone in one column', async () => {
    const { context, page, errors } = await app.signIn('tech@quillwater.test', { viewport: PHONE, mobile: true });
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    await page.getByRole('list', { name: 'Next bottling days' }).getByRole('link').filter({ hasText: 'Whites bottling, week ahead' }).waitFor();
    await page.getByRole('list', { name: 'Lots to look at' }).getByRole('link').filter({ hasText: 'QW-23-PN04' }).waitFor();
    await page.getByRole('list', { name: 'Cartridges to look at' }).getByRole('link').first().waitFor();
    await screenshot(page, 'today-phone');
    await expectNoSeriousA11yViolations(page);
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
    const { context, page, errors } = await app.pageFor(client, { viewport: PHONE, mobile: true });
    await page.goto(app.baseUrl);
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Set up your cellar' }).waitFor();
    expect(await page.getByText(/Runs in progress, with their readings and forecasts, are on the/).count()).toBe(1);
    // Nothing to plan with yet: the cellar and equipment come first.
    expect(await page.getByRole('heading', { name: 'Next bottling days' }).count()).toBe(0);
    await screenshot(page, 'today-new-winery-phone');
    await page.getByRole('link', { name: /Add tanks and lots in Cellar/ }).click();
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('says when no bottling day is planned, with a link for those who may plan one', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Ada Rendle', wineryName: 'Larkspur Test Cellars' });
    await createLot(owner);
    const { client: auditor } = await addMember(app, owner, 'auditor');
    const open = async (client: Client) => {
      const { context, page, errors } = await app.pageFor(client, { viewport: PHONE, mobile: true });
      await page.goto(`${app.baseUrl}/today`);
      await page.getByText('No bottling day planned yet.').waitFor();
      return { context, page, errors };
    };
    const asAuditor = await open(auditor);
    expect(await asAuditor.page.getByRole('link', { name: 'Plan a bottling day' }).count()).toBe(0);
    expect(asAuditor.errors).toEqual([]);
    await asAuditor.context.close();

    const asOwner = await open(owner);
    await screenshot(asOwner.page, 'today-no-plans-phone');
    await asOwner.page.getByRole('link', { name: 'Plan a bottling day' }).click();
    await asOwner.page.waitForURL(/\/plans$/);
    expect(asOwner.errors).toEqual([]);
    await asOwner.context.close();
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
    // A bottling day in four days whose chosen train needs cartridges the winery does not have.
    const world = await createPlanWorld(client);
    const plan = await createPlan(client, world.lineId, { name: 'Short-stock bottling', plannedDate: new Date(Date.now() + 4 * 86_400_000).toISOString().slice(0, 10) });
    const planLotId = (await addPlanLot(client, plan.id, world.lotId)).lots[0].id;
    const trainId = (await addTrain(client, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    const chosen = await client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
    const short = (chosen.body as PlanDto).needs.filter((n) => n.verdict === 'short');
    expect(short.length).toBe(2);

    const { context, page, errors } = await app.pageFor(client, { viewport: DESKTOP });
    await page.goto(`${app.baseUrl}/today`);
    const cartridge = page.getByRole('list', { name: 'Cartridges to look at' }).getByRole('link').filter({ hasText: serial });
    await cartridge.waitFor();
    expect(await cartridge.textContent()).toContain('Integrity test failed on');
    expect(await cartridge.textContent()).toContain('failed test');
    // Its only cartridge is installed, so neither type has one on the shelf.
    await page.getByText('No PP 1 µm in stock').waitFor();
    await page.getByText('No PES 0.45 µm in stock').waitFor();
    expect(await page.getByText('none in stock').count()).toBe(4);
    const day = page.getByRole('list', { name: 'Next bottling days' }).getByRole('link').filter({ hasText: 'Short-stock bottling' });
    await day.waitFor();
    const dayText = (await day.textContent())!.replace(/\u00a0/g, ' ');
    for (const n of short) expect(dayText).toContain(`Short ${n.shortfall} × ${n.typeName} (30 in)`);
    expect(dayText).toContain('trains chosen');
    await screenshot(page, 'today-shortfall-desktop');
    expect(errors).toEqual([]);
    await context.close();
  });
});
