// @vitest-environment node
import type { Locator } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { createLot } from '../factories/cellar';
import { createCartridgeType, createHousing, createLine } from '../factories/equipment';
import { prefilterTypeFields } from '../factories/plans';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

/** Displayed figures are rounded to whole L/h: within one of the target. */
const near = (value: number, target: number) => Math.abs(value - target) <= 1;

/** The first number in a figure's text ("1,375 L/h of 500 L/h" → 1375). */
async function firstNumber(figure: Locator) {
  const text = (await figure.locator('dd').textContent()) ?? '';
  return Number((text.match(/[\d,.]+/)?.[0] ?? 'NaN').replace(/,/g, ''));
}

describe('plans', () => {
  it('a cellar master plans a day: lot, train sized live, a second option compared, chosen, approved', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Orla Penhallow', wineryName: 'Saltmarsh Test Vineyard' });
    await createLine(owner, { name: 'Filler line', bottlesPerHour: 3000, bottleMl: 750 });
    await createCartridgeType(owner, { name: 'Depth PP 1 µm', ...prefilterTypeFields });
    await createCartridgeType(owner, { name: 'PES 0.45 µm', pricePer10in: 95 });
    await createHousing(owner, { name: 'A prefilter housing', rounds: 3, lengthIn: 30, maxPressureBar: 8 });
    await createHousing(owner, { name: 'B membrane housing', rounds: 3, lengthIn: 30, maxPressureBar: 10 });
    await createLot(owner, { code: `SV-${Date.now().toString(36).toUpperCase()}`, name: 'Albariño, east block', volumeL: 6000, tempC: 12 });
    const cellar = await addMember(app, owner, 'cellar-master');

    const { context: desktop, page, errors } = await app.pageFor(cellar.client, { viewport: DESKTOP });
    await page.goto(`${app.baseUrl}/today`);
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Plans' }).click();
    await page.getByRole('heading', { name: 'Plans', exact: true }).waitFor();
    await page.getByText('No plans yet').waitFor();
    await screenshot(page, 'plans-empty-desktop');

    // A new plan: the only line is chosen for us.
    await page.getByRole('button', { name: 'New plan' }).click();
    const form = page.getByRole('dialog', { name: 'New plan' });
    await form.getByLabel('Name').fill('Albariño bottling');
    await form.getByLabel('Bottling date').fill('2025-06-12');
    await expect.poll(() => form.getByLabel('Bottling line').inputValue()).not.toBe('');
    await form.getByRole('button', { name: 'Create plan' }).click();
    await page.getByRole('heading', { name: /Albariño bottling/ }).waitFor();
    await page.getByText('No lots yet').waitFor();

    // Add the lot from the cellar.
    await page.getByRole('button', { name: 'Add lot' }).first().click();
    const addLot = page.getByRole('dialog', { name: 'Add a lot' });
    await addLot.getByLabel('Lot').selectOption({ index: 1 });
    await addLot.getByRole('button', { name: 'Add lot' }).click();
    await addLot.waitFor({ state: 'detached' });
    await page.getByRole('heading', { name: /Albariño, east block/ }).waitFor();

    // A first train: prefilter + membrane, sized in the browser.
    await page.getByRole('button', { name: 'Add a train' }).click();
    const optionA = page.getByRole('article', { name: /Option A/ });
    await optionA.waitFor();
    const membrane = optionA.getByRole('listitem', { name: 'Stage 2' });
    await membrane.getByTestId('stage-flux').waitFor();
    const fluxOne = await firstNumber(membrane.getByTestId('stage-flux'));
    expect(near(fluxOne, 2475 / 9)).toBe(true); // 3 rounds × 30 in = 9 modules at 2,475 L/h
    expect(await membrane.getByTestId('stage-equivalents').textContent()).toContain('9');
    await screenshot(page, 'plan-one-train-desktop');

    // Two housings in parallel halve the flux as soon as it is typed (no save yet).
    await membrane.getByLabel('Housings in parallel').fill('2');
    await expect.poll(async () => near(await firstNumber(membrane.getByTestId('stage-flux')), fluxOne / 2)).toBe(true);
    expect(await membrane.getByTestId('stage-equivalents').textContent()).toContain('18');
    await optionA.getByText('Unsaved changes').waitFor();
    await optionA.getByRole('button', { name: 'Save train' }).click();
    await expect.poll(() => optionA.getByText('Unsaved changes').count()).toBe(0);

    // A second option to compare.
    await page.getByRole('button', { name: 'Add train option' }).click();
    const optionB = page.getByRole('article', { name: /Option B/ });
    await optionB.waitFor();
    await page.getByText('2 trains side by side').waitFor();
    const bMembrane = optionB.getByRole('listitem', { name: 'Stage 2' });
    await bMembrane.getByLabel('Housings in parallel').fill('1');
    await bMembrane.getByLabel('Capacity').fill('2000');
    await bMembrane.getByTestId('stage-capacity').getByText(/L/).waitFor();
    await optionB.getByRole('button', { name: 'Save train' }).click();
    await expect.poll(() => optionB.getByText('Unsaved changes').count()).toBe(0);
    expect(near(await firstNumber(bMembrane.getByTestId('stage-flux')), fluxOne)).toBe(true);
    expect(near(await firstNumber(optionA.getByRole('listitem', { name: 'Stage 2' }).getByTestId('stage-flux')), fluxOne / 2)).toBe(true);

    // Approval is refused until a train is chosen, with the reason.
    await page.getByRole('button', { name: 'Approve plan' }).click();
    await page.getByRole('alert').filter({ hasText: 'Not approved yet' }).getByText(/choose the train to use/).waitFor();
    await optionA.getByRole('button', { name: 'Choose this train' }).click();
    await optionA.getByText('chosen', { exact: true }).waitFor();
    await page.getByRole('table', { name: 'Cartridges needed' }).getByText('PES 0.45 µm').waitFor();
    await page.getByRole('list', { name: 'Timeline' }).getByText(/Run: SV-/).waitFor();
    await screenshot(page, 'plan-compare-desktop');

    // No cartridges registered: the stock shortfall needs a written reason, kept with the approval.
    await page.getByRole('button', { name: 'Approve plan' }).click();
    const ask = page.getByRole('dialog', { name: 'Approve with a written reason?' });
    await ask.getByRole('list', { name: 'Cautions' }).getByText(/Stock: PES 0\.45 µm .* short/).waitFor();
    await ask.getByLabel('Reason for approving anyway').fill('Membranes arrive the day before.');
    await ask.getByRole('button', { name: 'Approve with this reason' }).click();
    await page.getByText('Approved plans are read-only').waitFor();
    await page.getByText(/Reason given: “Membranes arrive the day before\.”/).waitFor();
    expect(await page.getByRole('button', { name: 'Save train' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Reopen' }).waitFor();
    await page.getByRole('button', { name: 'Mark done' }).waitFor();
    await screenshot(page, 'plan-approved-desktop');
    const planUrl = page.url();

    await page.getByRole('link', { name: 'Plans' }).first().click();
    await page.getByRole('row', { name: /Albariño bottling/ }).getByText('approved').waitFor();
    await screenshot(page, 'plans-list-desktop');
    expect(errors).toEqual([]);
    await desktop.close();

    // The same plan on a phone, as a winemaker (reads, no approval command).
    const winemaker = await addMember(app, owner, 'winemaker');
    const { context: phone, page: phonePage, errors: phoneErrors } = await app.pageFor(winemaker.client, { viewport: PHONE, mobile: true });
    await phonePage.goto(planUrl);
    await phonePage.getByRole('article', { name: /Option A/ }).waitFor();
    expect(await phonePage.getByRole('button', { name: 'Approve plan' }).count()).toBe(0);
    expect(await phonePage.getByRole('button', { name: 'Reopen' }).count()).toBe(0);
    const scrollsSideways = await phonePage.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
    expect(scrollsSideways).toBe(false);
    await screenshot(phonePage, 'plan-approved-phone');
    await phonePage.getByRole('link', { name: 'Plans' }).first().click();
    await phonePage.getByRole('link', { name: 'Albariño bottling' }).waitFor();
    await screenshot(phonePage, 'plans-list-phone');
    expect(phoneErrors).toEqual([]);
    await phone.close();
  });

  it('a draft on a phone: edit a train at 390 px with the cards scrolling sideways', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Bea Trelawny', wineryName: 'Phone Test Cellars' });
    const line = await createLine(owner);
    const pre = await createCartridgeType(owner, { name: 'PP 1', kind: 'prefilter', media: 'polypropylene', ratingUm: 1, bubblePointMinBar: null, diffusionMaxMlMinPer10in: null });
    const mem = await createCartridgeType(owner, { name: 'PES 0.45' });
    const h1 = await createHousing(owner, { name: 'Housing 1' });
    const h2 = await createHousing(owner, { name: 'Housing 2' });
    const lot = await createLot(owner, { volumeL: 4000 });
    const plan = (await owner.post('/api/plans', { name: 'Phone day', plannedDate: '2025-07-01', lineId: line.id })).body;
    const withLot = (await owner.post(`/api/plans/${plan.id}/lots`, { lotId: lot.id })).body;
    const stages = [
      { cartridgeTypeId: pre.id, housingId: h1.id, housingCount: 1 },
      { cartridgeTypeId: mem.id, housingId: h2.id, housingCount: 2 },
    ];
    await owner.post(`/api/plans/${plan.id}/lots/${withLot.lots[0].id}/trains`, { name: 'Option A', stages });
    await owner.post(`/api/plans/${plan.id}/lots/${withLot.lots[0].id}/trains`, { name: 'Option B', stages });
    const { context: phone, page, errors } = await app.pageFor(owner, { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/plans/${plan.id}`);
    const optionA = page.getByRole('article', { name: /Option A/ });
    await optionA.waitFor();
    const stage = optionA.getByRole('listitem', { name: 'Stage 2' });
    const before = await firstNumber(stage.getByTestId('stage-flux'));
    await stage.getByLabel('Housings in parallel').fill('1');
    await expect.poll(async () => near(await firstNumber(stage.getByTestId('stage-flux')), before * 2)).toBe(true);
    const scrollsSideways = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
    expect(scrollsSideways).toBe(false);
    await screenshot(page, 'plan-draft-phone');
    // The engine suggests the smallest housing sets that meet every limit.
    await optionA.getByRole('button', { name: 'Suggest housings' }).click();
    await optionA.getByText(/Smallest housing sets|no housing set/).waitFor();
    expect(errors).toEqual([]);
    await phone.close();
  });
});
