// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { createCartridgeType, createLine } from '../factories/equipment';
import { setupBrowserApp, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('equipment', () => {
  it('an owner adds a housing and sees the 10-inch equivalents follow the typing; a technician sees no edit buttons', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Ada Fenwick', wineryName: 'Harrowgate Test Cellars' });
    const { context: desktop, page, errors } = await app.pageFor(owner, { viewport: { width: 1280, height: 860 } });

    // A new winery is told what to add first.
    await page.goto(`${app.baseUrl}/equipment`);
    await page.getByRole('heading', { name: 'Equipment' }).waitFor();
    await page.getByText('No housings yet').waitFor();
    await screenshot(page, 'equipment-empty-desktop');

    await page.getByRole('button', { name: 'Add housing' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a housing' });
    await dialog.waitFor();
    const equivalents = dialog.getByTestId('housing-equivalents');
    await dialog.getByLabel('Name').fill('Membrane housing 1');
    await dialog.getByLabel('Rounds').fill('2');
    await expect.poll(() => equivalents.locator('summary').textContent()).toContain('6'); // 2 × 30-inch
    await dialog.getByLabel('Rounds').fill('5');
    await expect.poll(() => equivalents.locator('summary').textContent()).toContain('15');
    await dialog.getByLabel('Cartridge length').selectOption('20');
    await expect.poll(() => equivalents.locator('summary').textContent()).toContain('10');
    await equivalents.locator('summary').click();
    await equivalents.getByText('5 rounds × 20 in ÷ 10 in per module = 10').waitFor();
    expect(await dialog.getByRole('note', { name: /Never open a housing under pressure/ }).count()).toBe(1);

    // Bad input shows beside the field; then a good save.
    await dialog.getByLabel('Maximum working pressure').fill('-3');
    await dialog.getByRole('button', { name: 'Add housing' }).click();
    await dialog.getByText('The maximum working pressure must be more than 0.').waitFor();
    await dialog.getByLabel('Maximum working pressure').fill('8');
    await dialog.getByLabel('Maximum temperature').fill('140');
    await dialog.getByLabel('Hold-up volume').fill('12,5');
    await screenshot(page, 'equipment-housing-form-desktop');
    await dialog.getByRole('button', { name: 'Add housing' }).click();
    await dialog.waitFor({ state: 'detached' });
    const row = page.getByRole('row', { name: /Membrane housing 1/ });
    await row.waitFor();
    expect(await row.textContent()).toContain('12.5');
    expect(await page.getByRole('button', { name: 'Edit Membrane housing 1' }).count()).toBe(1);
    await screenshot(page, 'equipment-housings-desktop');

    // The catalogue and the line, with their derived figures.
    await createCartridgeType(owner, { name: 'PES 0.45 µm', ratingUm: 0.45 });
    await createCartridgeType(owner, {
      name: 'Depth PP 1 µm',
      kind: 'prefilter',
      media: 'polypropylene',
      ratingUm: 1,
      bubblePointMinBar: null,
      diffusionMaxMlMinPer10in: null,
    });
    await createCartridgeType(owner, { name: 'PVDF 0.65 µm', media: 'PVDF', ratingUm: 0.65, bubblePointMinBar: null, diffusionMaxMlMinPer10in: null });
    await createLine(owner, { name: 'Filler line', bottlesPerHour: 3000, bottleMl: 750 });
    await page.getByRole('tab', { name: 'Cartridge types' }).click();
    await page.getByRole('button', { name: 'PES 0.45 µm', exact: true }).waitFor();
    await screenshot(page, 'equipment-cartridge-types-desktop');
    // Sorting happens on the server: the rating header reorders the rows.
    const firstName = () => page.getByRole('row').nth(1).getByRole('button').first().textContent();
    const ratingHeader = page.getByRole('columnheader', { name: /Rating/ });
    await ratingHeader.getByRole('button').click();
    await expect.poll(() => ratingHeader.getAttribute('aria-sort')).not.toBe('none');
    const descending = (await ratingHeader.getAttribute('aria-sort')) === 'descending';
    await expect.poll(firstName).toBe(descending ? 'Depth PP 1 µm' : 'PES 0.45 µm');
    await ratingHeader.getByRole('button').click();
    await expect.poll(firstName).toBe(descending ? 'PES 0.45 µm' : 'Depth PP 1 µm');
    await page.getByRole('button', { name: 'PES 0.45 µm', exact: true }).click();
    const details = page.getByRole('dialog', { name: 'PES 0.45 µm' });
    await details.getByTestId('type-resistance').waitFor();
    expect(await details.getByTestId('type-resistance').textContent()).toContain('× 10¹⁰');
    await screenshot(page, 'equipment-cartridge-type-details-desktop');
    await details.getByRole('button', { name: 'Edit cartridge type' }).click();
    const typeForm = page.getByRole('dialog', { name: 'Edit PES 0.45 µm' });
    await typeForm.getByTestId('type-clean-dp').waitFor();
    await typeForm.getByLabel('Design flow for wine').fill('600');
    await expect.poll(() => typeForm.getByTestId('type-clean-dp').locator('summary').textContent()).toContain('0.050'); // 0.1 bar × 600/1,200
    await screenshot(page, 'equipment-cartridge-type-form-desktop');
    await typeForm.getByRole('button', { name: 'Cancel' }).click();

    await page.getByRole('tab', { name: 'Bottling lines' }).click();
    await page.getByRole('row', { name: /Filler line/ }).waitFor();
    expect(await page.getByRole('row', { name: /Filler line/ }).textContent()).toContain('2,475');
    await screenshot(page, 'equipment-lines-desktop');

    // A technician reads the same equipment on a phone, without any edit commands, in US units.
    const tech = await addMember(app, owner, 'technician');
    expect((await tech.client.put('/api/me', { name: 'Rowan Pike', units: 'us' })).status).toBe(200);
    const { context: phone, page: techPage, errors: techErrors } = await app.pageFor(tech.client, { viewport: PHONE, mobile: true });
    await techPage.goto(`${app.baseUrl}/equipment`);
    await techPage.getByRole('row', { name: /Membrane housing 1/ }).waitFor();
    expect(await techPage.getByRole('row', { name: /Membrane housing 1/ }).textContent()).toContain('psi');
    expect(await techPage.getByRole('button', { name: 'Add housing' }).count()).toBe(0);
    expect(await techPage.getByRole('button', { name: /^Edit / }).count()).toBe(0);
    expect(await techPage.getByRole('button', { name: /^Delete / }).count()).toBe(0);
    await screenshot(techPage, 'equipment-housings-technician-phone');
    await techPage.getByRole('tab', { name: 'Cartridge types' }).click();
    await techPage.getByRole('button', { name: 'PES 0.45 µm', exact: true }).waitFor();
    expect(await techPage.getByRole('button', { name: 'Add cartridge type' }).count()).toBe(0);
    await screenshot(techPage, 'equipment-cartridge-types-technician-phone');
    await techPage.getByRole('button', { name: 'PES 0.45 µm', exact: true }).click();
    await techPage.getByRole('dialog', { name: 'PES 0.45 µm' }).getByTestId('type-resistance').waitFor();
    expect(await techPage.getByRole('button', { name: 'Edit cartridge type' }).count()).toBe(0);
    await screenshot(techPage, 'equipment-cartridge-type-details-phone');

    // The owner's form on a phone.
    const { context: ownerPhone, page: ownerPhonePage, errors: ownerPhoneErrors } = await app.pageFor(owner, { viewport: PHONE, mobile: true });
    await ownerPhonePage.goto(`${app.baseUrl}/equipment`);
    await ownerPhonePage.getByRole('button', { name: 'Add housing' }).click();
    await ownerPhonePage.getByRole('dialog', { name: 'Add a housing' }).getByLabel('Rounds').fill('3');
    await screenshot(ownerPhonePage, 'equipment-housing-form-phone');
    await ownerPhonePage.goto(`${app.baseUrl}/equipment?tab=lines`);
    await ownerPhonePage.getByRole('row', { name: /Filler line/ }).waitFor();
    await screenshot(ownerPhonePage, 'equipment-lines-phone');

    expect(errors).toEqual([]);
    expect(techErrors).toEqual([]);
    expect(ownerPhoneErrors).toEqual([]);
    await desktop.close();
    await phone.close();
    await ownerPhone.close();
  });
});
