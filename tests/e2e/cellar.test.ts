// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { discPoints } from '../factories/cellar';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { signUp } from '../support/test-app';

const app = setupBrowserApp({ withStorage: true });

const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString();

describe('cellar', () => {
  it('adds a tank, a lot and a lab result in the browser and shows the readiness', async () => {
    const { client } = await signUp(app.baseUrl, { name: 'Odile Farrant', wineryName: 'Hollowmere Test Cellars' });
    const { context: desktop, page, errors } = await app.pageFor(client, { viewport: DESKTOP });

    // A new winery is told to start with tanks and lots.
    await page.goto(`${app.baseUrl}/cellar`);
    await page.getByRole('heading', { name: 'Cellar', exact: true }).waitFor();
    await page.getByText('Your cellar is empty').waitFor();
    await screenshot(page, 'cellar-empty-desktop');

    await page.getByRole('button', { name: 'Add tank' }).click();
    const tankDialog = page.getByRole('dialog');
    await tankDialog.getByLabel('Name').fill('T7 stainless');
    await tankDialog.getByLabel('Capacity').fill('9000');
    await tankDialog.getByRole('button', { name: 'Add tank' }).click();
    await page.getByText('Tank added').waitFor();

    // The lot form shows field errors before anything is sent.
    await page.getByRole('button', { name: 'Add lot' }).first().click();
    const lotDialog = page.getByRole('dialog');
    await lotDialog.getByRole('button', { name: 'Add lot' }).click();
    await lotDialog.getByText('Enter the lot code.').waitFor();
    await lotDialog.getByText('Enter the volume.').waitFor();

    await lotDialog.getByLabel('Lot code').fill('HM-24-CH01');
    await lotDialog.getByLabel(/^Name/).fill('Chardonnay, north slope');
    await lotDialog.getByLabel('Style').selectOption('white');
    await lotDialog.getByLabel('Vintage').fill('2024');
    await lotDialog.getByLabel('Volume').fill('6400');
    await lotDialog.getByLabel('Tank').selectOption({ label: 'T7 stainless' });
    await lotDialog.getByLabel('Alcohol').fill('13,1');
    await lotDialog.getByLabel('Residual sugar').fill('1.8');
    await lotDialog.getByLabel('Temperature at filtration').fill('12');
    await lotDialog.getByRole('button', { name: 'Add lot' }).click();

    // The new lot's page opens; no lab result yet, so no verdict.
    await page.getByRole('heading', { name: /HM-24-CH01 · Chardonnay, north slope/ }).waitFor();
    await page.getByText('No lab results yet').waitFor();
    await page.getByRole('main').getByText('no verdict').first().waitFor();

    await page.getByRole('button', { name: 'Add lab result' }).first().click();
    const labDialog = page.getByRole('dialog');
    await labDialog.getByLabel('Turbidity').fill('0.6');
    await labDialog.getByLabel('Time to 200 mL').fill('28');
    await labDialog.getByLabel('Time to 400 mL').fill('66');
    await labDialog.getByText('Clogging index 10 s').waitFor();
    await labDialog.getByRole('button', { name: 'Add point' }).click();
    await labDialog.getByLabel('Time 1').waitFor();
    await screenshot(page, 'cellar-lab-result-form-desktop');
    await labDialog.getByRole('button', { name: 'Remove point 1' }).click();
    await labDialog.getByRole('button', { name: 'Add lab result' }).click();
    await page.getByText('Lab result added').waitFor();

    await page.getByRole('heading', { level: 1 }).getByText('ready', { exact: true }).waitFor();
    await page.getByText(/Turbidity 0\.6 NTU is within the 1\.0 NTU limit for white wines/).waitFor();
    await page.getByText(/Thresholds used — defaults from the trade literature/).click();
    await page.getByRole('link', { name: 'Change the thresholds in Settings' }).waitFor();

    // Older results (one with a disc test) give the chart a history.
    const lotId = new URL(page.url()).pathname.split('/').pop()!;
    for (const body of [
      { sampledAt: daysAgo(21), turbidityNtu: 4.2, t200s: 34, t400s: 120, notes: 'Before fining.' },
      { sampledAt: daysAgo(10), turbidityNtu: 1.4, t200s: 30, t400s: 88, discPoints: discPoints(2.2, 4600, 10), discDiameterMm: 25, discPressureBar: 2 },
    ]) {
      const res = await client.post(`/api/lots/${lotId}/lab-results`, { notes: '', ...body });
      expect(res.status).toBe(201);
    }
    await page.reload();
    await page.getByRole('img', { name: /Chart of turbidity and clogging index/ }).waitFor();
    await page.locator('.recharts-line').first().waitFor();
    expect(await page.getByRole('table', { name: 'Lab results, newest first' }).getByRole('row').count()).toBe(4);
    await screenshot(page, 'cellar-lot-desktop');

    // The lab's PDF goes with its sample.
    await page.getByRole('button', { name: /^Files of the sample of/ }).first().click();
    const filesDialog = page.getByRole('dialog');
    await filesDialog.getByLabel('File to attach').setInputFiles({
      name: 'lab-report.pdf',
      mimeType: 'application/pdf',
      buffer: Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n%%EOF\n'),
    });
    await filesDialog.getByRole('link', { name: 'lab-report.pdf' }).waitFor();
    await screenshot(page, 'cellar-lab-result-files-desktop');
    await page.keyboard.press('Escape');

    // Back on the Cellar page the lot shows its latest figures and verdict.
    await page.getByRole('link', { name: 'Cellar' }).first().click();
    const row = page.getByRole('row').filter({ hasText: 'HM-24-CH01' });
    await row.getByText('ready').waitFor();
    expect(await row.textContent()).toContain('0.6');
    await page.getByRole('cell', { name: 'T7 stainless' }).first().waitFor();
    await screenshot(page, 'cellar-desktop');

    // A phone in the cellar: the same two pages at 390 px.
    const { context: phone, page: phonePage, errors: phoneErrors } = await app.pageFor(client, { viewport: PHONE, mobile: true });
    await phonePage.goto(`${app.baseUrl}/cellar`);
    await phonePage.getByRole('list', { name: 'Wine lots' }).getByRole('link', { name: /HM-24-CH01/ }).getByText('ready').waitFor();
    await screenshot(phonePage, 'cellar-phone');
    await phonePage.goto(`${app.baseUrl}/cellar/lots/${lotId}`);
    await phonePage.locator('.recharts-line').first().waitFor();
    await screenshot(phonePage, 'cellar-lot-phone');
    const overflow = await phonePage.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);

    expect(errors).toEqual([]);
    expect(phoneErrors).toEqual([]);
    await desktop.close();
    await phone.close();
  });
});
