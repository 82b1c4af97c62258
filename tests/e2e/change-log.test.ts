// @vitest-environment node
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { createLot, createTank, lotBody, tankBody } from '../factories/cellar';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp({ withStorage: true });

describe('change log', () => {
  it('an owner filters the change log, downloads the CSV, and sees a lot’s own history', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Maren Holt', wineryName: 'Quillbrook Test Estate' });
    const { client: cellarMaster } = await addMember(app, owner, 'cellar-master');
    const tank = await createTank(owner, { name: 'T3 north', capacityL: 8000 });
    await owner.put(`/api/tanks/${tank.id}`, tankBody({ name: 'T3 north', capacityL: 8500, notes: 'New door seal' }));
    const lot = await createLot(cellarMaster, { code: 'QB-25-RS02', name: 'Rosé, saignée' });
    await cellarMaster.put(`/api/lots/${lot.id}`, lotBody({ code: 'QB-25-RS02', name: 'Rosé, saignée', volumeL: 4100 }));

    const { context: desktop, page, errors } = await app.pageFor(owner, { viewport: DESKTOP, acceptDownloads: true });
    await page.goto(`${app.baseUrl}/today`);
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Change log' }).click();
    await page.getByRole('heading', { name: 'Change log' }).waitFor();
    const table = page.getByRole('table', { name: 'Change log' });
    await table.getByText('QB-25-RS02 Rosé, saignée').first().waitFor();

    // Only the tank's changes.
    await page.getByLabel('Record kind', { exact: true }).selectOption('tank');
    await page.getByText('2 changes match the filters').waitFor();
    await table.getByText('New door seal').waitFor();
    // Only what the cellar master did.
    await page.getByLabel('Record kind', { exact: true }).selectOption('');
    await page.getByLabel('Person', { exact: true }).selectOption({ label: 'Test cellar-master' });
    await page.waitForURL(/[?&]userId=/);
    await page.getByText(/^\d+ changes? match(es)? the filters$/).waitFor();
    // The filtered page replaces the previous one once its answer arrives.
    await expect.poll(() => table.getByText('T3 north').count(), { timeout: 10_000 }).toBe(0);
    await page.getByLabel('Action', { exact: true }).selectOption('update');
    await page.waitForURL((url) => url.searchParams.get('action') === 'update' && url.searchParams.has('userId'));
    await page.getByText('1 change matches the filters').waitFor();
    await table.getByText('4100').waitFor();
    const today = new Date().toISOString().slice(0, 10);
    await page.getByLabel('From', { exact: true }).fill(today);
    await page.getByLabel('To', { exact: true }).fill(today);
    await page.getByText('1 change matches the filters').waitFor();
    await screenshot(page, 'change-log-filtered-desktop');

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^change-log-\d{4}-\d{2}-\d{2}\.csv$/);
    const rows = Papa.parse<string[]>(readFileSync((await download.path())!, 'utf8').trim()).data;
    expect(rows[0]).toEqual(['at', 'person', 'person_id', 'action', 'record_kind', 'record_id', 'record', 'changes']);
    expect(rows).toHaveLength(2);
    expect(rows[1]).toEqual(expect.arrayContaining(['Test cellar-master', 'Changed', 'Lot', lot.id, 'QB-25-RS02 Rosé, saignée']));

    // The lot's page shows its own history.
    await page.goto(`${app.baseUrl}/cellar/lots/${lot.id}`);
    const history = page.getByRole('region', { name: 'Change history' });
    await history.getByText('Created', { exact: true }).waitFor();
    await history.getByText('Changed', { exact: true }).waitFor();
    await screenshot(page, 'change-log-lot-history-desktop');

    // The owner finds the export in Settings.
    await page.goto(`${app.baseUrl}/settings`);
    await page.getByRole('link', { name: 'Download the export (zip)' }).waitFor();
    await screenshot(page, 'change-log-settings-export-desktop');
    expect(errors).toEqual([]);

    const { context: phone, page: small, errors: phoneErrors } = await app.pageFor(owner, { viewport: PHONE, mobile: true, acceptDownloads: true });
    await small.goto(`${app.baseUrl}/records/changes?kind=tank`);
    await small.getByText('2 changes match the filters').waitFor();
    await small.getByRole('list', { name: 'Change log' }).getByText('New door seal').waitFor();
    const overflow = await small.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(small, 'change-log-phone');
    await small.goto(`${app.baseUrl}/cellar/lots/${lot.id}`);
    await small.getByRole('region', { name: 'Change history' }).getByText('Created', { exact: true }).waitFor();
    await screenshot(small, 'change-log-lot-history-phone');
    expect(phoneErrors).toEqual([]);
    await desktop.close();
    await phone.close();
  });
});
