// @vitest-environment node
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createBottledLot, createRecordWorld } from '../factories/records';
import { setupBrowserApp, DESKTOP, PHONE, screenshot, outputDir } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('records: the reverse trace and the filtration record', () => {
  it('an auditor finds a lot by a cartridge serial, opens its record, sees the integrity before and after, and downloads the PDF', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Ines Owner', wineryName: 'Records E2E Cellars' });
    const world = await createRecordWorld(owner, { batch: 'MB-2291' });
    const bottled = await createBottledLot(owner, { world, lot: { code: `SB-${Date.now().toString(36).toUpperCase()}`, name: 'Sauvignon blanc, upper slope' }, notes: 'Filler stopped 10 min at 2,000 L; no effect on the train.' });
    const other = await createBottledLot(owner, { world, lot: { name: 'Chenin, old vines' } });
    const auditor = await addMember(app, owner, 'auditor');
    const serial = world.memSerials[1];

    const { context, page, errors } = await app.signIn(auditor.email, { viewport: DESKTOP });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Records' }).click();
    await page.getByRole('heading', { name: 'Records', exact: true }).waitFor();
    await page.getByLabel('Cartridge serial').fill(serial);
    await page.getByRole('button', { name: 'Find' }).click();
    await page.getByRole('heading', { name: `Lots filtered by cartridge ${serial}` }).waitFor();
    const list = page.getByRole('list', { name: 'Bottled lots' });
    await list.getByText(bottled.lotCode).waitFor();
    await list.getByText('Chenin, old vines').waitFor();
    expect(await list.getByRole('listitem').count()).toBe(2);
    await screenshot(page, 'records-trace-desktop');

    await list.getByRole('link', { name: new RegExp(bottled.lotCode) }).click();
    await page.waitForURL(new RegExp(`/records/lots/${bottled.lotId}$`));
    await page.getByRole('heading', { name: new RegExp(`Filtration record · ${bottled.lotCode}`) }).waitFor();
    const integrity = page.getByTestId('integrity-1');
    await integrity.getByRole('heading', { name: 'Integrity tests before the run' }).waitFor();
    await integrity.getByRole('heading', { name: 'Integrity tests after the run' }).waitFor();
    expect(await integrity.getByRole('table', { name: 'Integrity tests before the run' }).getByText('Pass').count()).toBe(3);
    expect(await integrity.getByRole('table', { name: 'Integrity tests after the run' }).getByText('Pass').count()).toBe(3);
    expect(await page.getByTestId('integrity-statement-1').textContent()).toMatch(/4,000 L \(5,333 bottles of 750 mL\) were filtered between two passing integrity tests/);
    for (const s of [...world.preSerials, ...world.memSerials]) await page.getByRole('cell', { name: s, exact: true }).first().waitFor();
    await page.getByRole('img', { name: /ΔP against litres for stage 2/ }).waitFor();
    await page.getByText('Filler stopped 10 min at 2,000 L; no effect on the train.').waitFor();
    const fingerprint = (await page.getByTestId('fingerprint').textContent())!.trim();
    expect(fingerprint).toMatch(/^[0-9a-f]{64}$/);

    // Check the printed fingerprint.
    await page.getByLabel('Check a printed copy: its fingerprint').fill(fingerprint);
    await page.getByRole('button', { name: 'Check' }).click();
    await page.getByRole('status').getByText(/^Matches/).waitFor();
    await screenshot(page, 'record-desktop');

    // Download the PDF and read it from outside (pdftotext, poppler-utils).
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'PDF (A4)' }).click()]);
    expect(download.suggestedFilename()).toBe(`filtration-record-${bottled.lotCode}.pdf`);
    const file = await download.path();
    expect(readFileSync(file).subarray(0, 5).toString()).toBe('%PDF-');
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    expect(text).toContain(fingerprint);
    expect(text).toContain(serial);
    expect(text).toContain('PASS');

    // The print sheet: no navigation, no buttons.
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('navigation', { name: 'Sections' }).isVisible()).toBe(false);
    expect(await page.getByRole('link', { name: 'PDF (A4)' }).isVisible()).toBe(false);
    await screenshot(page, 'record-print-desktop');
    await page.emulateMedia({ media: 'screen' });

    // On a phone.
    await page.setViewportSize(PHONE);
    await screenshot(page, 'record-phone');
    // Viewport-sized views of the parts that matter most on a phone.
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: join(outputDir, 'record-phone-top.png') });
    await page.getByTestId('integrity-statement-1').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(outputDir, 'record-phone-integrity.png') });
    await page.goto(`${app.baseUrl}/records?batch=MB-2291`);
    await page.getByRole('heading', { name: 'Lots filtered by batch MB-2291' }).waitFor();
    await page.getByRole('list', { name: 'Bottled lots' }).getByText(other.lotCode).waitFor();
    await screenshot(page, 'records-trace-phone');

    // The cartridge page lists the lots it filtered.
    await page.goto(`${app.baseUrl}/cartridges/${world.memIds[1]}`);
    const filtered = page.getByRole('region', { name: 'Lots it filtered' });
    await filtered.getByText(bottled.lotCode).waitFor();
    await filtered.getByText(other.lotCode).waitFor();
    await screenshot(page, 'cartridge-lots-phone');
    expect(errors).toEqual([]);
    await context.close();
  });
});
