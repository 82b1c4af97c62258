// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { cartridgeEventsTable, cartridgesTable } from '../../server/db/schema';
import { deliveryCsv, insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('cartridges in the browser', () => {
  it('imports a delivery with one bad row, fixes it, installs a cartridge and reads its page', async () => {
    const { client, me } = await signUp(app.baseUrl, { name: 'Maren Test', wineryName: 'Cartridge Browser Winery' });
    const wineryId = me.activeWineryId!;
    await insertCartridgeType(app.db, wineryId, { name: 'PES membrane 0.45 µm', ratingUm: 0.45, ratedSteamCycles: 50, ratedHotWaterCycles: 100, ratedChemicalCycles: 30, flowRecoveryMinPct: 80 });
    await insertCartridgeType(app.db, wineryId, { name: 'Depth PP 5 µm', kind: 'prefilter', media: 'polypropylene', ratingUm: 5 });
    const membraneHousing = await insertHousing(app.db, wineryId, { name: 'Membrane housing B', rounds: 3, lengthIn: 30 });
    await insertHousing(app.db, wineryId, { name: 'Water filter', rounds: 1, lengthIn: 10 });

    const p = serialPrefix();
    const bad = deliveryCsv([
      [`${p}-001`, 'B25-040', 'PES membrane 0.45 µm', 30, '2025-03-14'],
      [`${p}-002`, 'B25-040', 'PES membrane 0.45 µm', 30, '2025-03-14'],
      [`${p}-003`, 'B25-041', 'PES membrane 0.46 µm', 30, '2025-03-14'],
      [`${p}-004`, 'B25-042', 'Depth PP 5 µm', 10, '2025-03-14'],
    ]);
    const fixed = bad.replace('PES membrane 0.46 µm', 'PES membrane 0.45 µm');

    const { context: desk, page, errors } = await app.pageFor(client, { viewport: DESKTOP });

    // Empty winery: the page says what to do first.
    await page.goto(`${app.baseUrl}/cartridges`);
    await page.getByText('No cartridges registered yet').waitFor();

    // Import with one bad row: the preview shows the error and offers no import.
    await page.getByRole('link', { name: 'Import a delivery list' }).click();
    await page.getByRole('heading', { name: 'Import delivery' }).waitFor();
    await page.locator('#delivery-file').setInputFiles({ name: 'delivery.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    await page.getByText('1 of 4 rows need fixing').waitFor();
    await page.getByRole('table').getByText('"PES membrane 0.46 µm" is not in the cartridge-type catalogue').waitFor();
    expect(await page.getByRole('button', { name: /^Import \d+ cartridges$/ }).count()).toBe(0);
    expect((await client.get(`/api/cartridges?q=${p}`)).body.total).toBe(0);
    await screenshot(page, 'cartridges-import-preview-desktop');

    // Fix and upload again, then import.
    await page.locator('#delivery-file').setInputFiles({ name: 'delivery-fixed.csv', mimeType: 'text/csv', buffer: Buffer.from(fixed) });
    await page.getByText('All 4 rows are ready').waitFor();
    await page.getByRole('button', { name: 'Import 4 cartridges' }).click();
    await page.getByText('4 cartridges imported').waitFor();
    await page.getByRole('heading', { name: 'Inventory' }).waitFor();
    await page.getByRole('link', { name: `${p}-003` }).waitFor();

    // Install from the housing view into round 1 of the membrane housing.
    await page.getByRole('button', { name: 'Install into Membrane housing B, round 1' }).click();
    await page.getByRole('dialog').getByText('Never open a housing under pressure').waitFor();
    await page.getByLabel('Cartridge', { exact: true }).selectOption({ label: `${p}-002 — PES membrane 0.45 µm, batch B25-040` });
    await page.getByRole('button', { name: 'Install cartridge' }).click();
    await page.getByText('Installed', { exact: true }).waitFor();
    const panel = page.getByRole('listitem', { name: 'Membrane housing B' });
    await panel.getByRole('link', { name: new RegExp(`${p}-002`) }).waitFor();
    expect(await panel.getByText('2 free of 3').count()).toBe(1);

    // Give one cartridge some care history so its life gauge has something to show.
    const [c1] = await app.db.select().from(cartridgesTable).where(eq(cartridgesTable.serial, `${p}-001`));
    const day = 86_400_000;
    const t0 = Date.now() - 25 * day;
    const actorId = me.user.id;
    await app.db.insert(cartridgeEventsTable).values([
      { wineryId, cartridgeId: c1.id, actorId, kind: 'run', at: new Date(t0), details: { litres: 12000 } },
      { wineryId, cartridgeId: c1.id, actorId, kind: 'cycle', at: new Date(t0 + day), details: { kind: 'hot-water', tempC: 85, durationMin: 30, waterFlowBeforeLh: 2600, waterFlowAfterLh: 3500 } },
      { wineryId, cartridgeId: c1.id, actorId, kind: 'run', at: new Date(t0 + 10 * day), details: { litres: 9000 } },
      { wineryId, cartridgeId: c1.id, actorId, kind: 'cycle', at: new Date(t0 + 11 * day), details: { kind: 'steam', tempC: 121, durationMin: 20, waterFlowBeforeLh: 2500, waterFlowAfterLh: 3400 } },
      { wineryId, cartridgeId: c1.id, actorId, kind: 'integrity', at: new Date(t0 + 11 * day + 3600_000), details: { pass: true, method: 'bubble point' } },
      { wineryId, cartridgeId: c1.id, actorId, kind: 'cycle', at: new Date(t0 + 20 * day), details: { kind: 'chemical', tempC: 50, durationMin: 40, agent: 'sodium hydroxide 1 %', waterFlowBeforeLh: 2300, waterFlowAfterLh: 3250 } },
    ]);
    // As if the delivery had come in a month ago.
    await app.db.update(cartridgeEventsTable).set({ at: new Date(t0 - 5 * day) }).where(and(eq(cartridgeEventsTable.cartridgeId, c1.id), eq(cartridgeEventsTable.kind, 'registered')));
    await app.db.update(cartridgesTable).set({ litresFiltered: 21000, steamCycles: 1, hotWaterCycles: 1, chemicalCycles: 1 }).where(eq(cartridgesTable.id, c1.id));
    await page.reload();
    await page.getByRole('heading', { name: 'Inventory' }).waitFor();
    await screenshot(page, 'cartridges-inventory-desktop');

    // The cartridge page: facts, life forecast, history.
    await page.getByRole('link', { name: `${p}-001` }).first().click();
    await page.getByRole('heading', { name: `${p}-001` }).waitFor();
    await page.getByText('What it is missing').waitFor();
    await page.getByRole('meter', { name: 'Steam cycles used' }).waitFor();
    await page.getByText('Registered from a delivery import').waitFor();
    await screenshot(page, 'cartridge-page-desktop');

    // Correct the batch from the delivery note; the change is kept in the history.
    await page.getByRole('button', { name: 'Edit details' }).click();
    await page.getByLabel('Batch', { exact: true }).fill('B25-040-R');
    await page.getByRole('button', { name: 'Save details' }).click();
    await page.getByText('Details saved').waitFor();
    await page.getByText(/batch B25-040-R/).first().waitFor();

    // On a phone in the cellar: install a cartridge from its own page.
    const { context: phone, page: mobile, errors: mobileErrors } = await app.pageFor(client, { viewport: PHONE, mobile: true });
    await mobile.goto(`${app.baseUrl}/cartridges`);
    await mobile.getByRole('heading', { name: 'Inventory' }).waitFor();
    await screenshot(mobile, 'cartridges-inventory-phone');
    await mobile.goto(`${app.baseUrl}/cartridges/${c1.id}`);
    await mobile.getByRole('button', { name: 'Install…' }).click();
    await mobile.getByLabel('Housing', { exact: true }).selectOption({ label: 'Membrane housing B — 2 of 3 rounds free' });
    await mobile.getByLabel('Round', { exact: true }).selectOption('3');
    const installButton = mobile.getByRole('button', { name: 'Install cartridge' });
    const box = await installButton.boundingBox();
    expect(box!.height).toBeGreaterThanOrEqual(44);
    await screenshot(mobile, 'cartridge-install-phone');
    await installButton.click();
    await mobile.getByText('Membrane housing B · 3').waitFor();
    await mobile.getByText('Installed in Membrane housing B, round 3').waitFor();
    await screenshot(mobile, 'cartridge-page-phone');
    const viewAfter = (await client.get('/api/cartridges/housing-view')).body.housings.find((h: { id: string }) => h.id === membraneHousing.id);
    expect(viewAfter.positions.map((x: { cartridge: { serial: string } | null }) => x.cartridge?.serial ?? null)).toEqual([`${p}-002`, null, `${p}-001`]);

    // The import preview at 390 px.
    await mobile.goto(`${app.baseUrl}/cartridges/import`);
    await mobile.locator('#delivery-file').setInputFiles({ name: 'delivery.csv', mimeType: 'text/csv', buffer: Buffer.from(bad.replaceAll(p, `${p}X`)) });
    await mobile.getByText('1 of 4 rows need fixing').waitFor();
    await mobile.getByRole('list', { name: 'Rows to fix' }).getByText('"PES membrane 0.46 µm" is not in the cartridge-type catalogue').waitFor();
    await screenshot(mobile, 'cartridges-import-preview-phone');

    expect(errors).toEqual([]);
    expect(mobileErrors).toEqual([]);
    await desk.close();
    await phone.close();
  });
});
