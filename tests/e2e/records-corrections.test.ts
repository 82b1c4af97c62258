// @vitest-environment node
// The record names the thresholds its readiness was judged against; a correction after close
// shows in the cartridge's history beside the original run entry.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createBottledLot } from '../factories/records';
import { setupBrowserApp, DESKTOP, PHONE, outputDir, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('records after the fact', () => {
  it('readiness kept at the start, and litres re-allocated by a correction after close, on the record and the cartridge page', async () => {
    const { client: owner } = await signUp(app.baseUrl, { name: 'Vera Owner', wineryName: 'Corrections E2E Cellars' });
    const bottled = await createBottledLot(owner, { lot: { name: 'Riesling, terrace block' } });
    const run = (await owner.get(`/api/runs/${bottled.runId}`)).body as { stages: { readings: { id: string; volumeL: number }[] }[] };
    // the last reading of each stage said 4,000 L; the meter said 3,800 L
    for (const stage of run.stages) {
      const last = stage.readings.at(-1)!;
      expect(last.volumeL).toBe(4000);
      const fix = await owner.post(`/api/runs/${bottled.runId}/readings/${last.id}/correct`, { volumeL: 3800, upstreamBar: 2.6, downstreamBar: 2, reason: 'Meter read 3,800 L.' });
      expect(fix.status).toBe(201);
    }
    const master = await addMember(app, owner, 'cellar-master');

    const { context, page, errors } = await app.signIn(master.email, { viewport: DESKTOP });
    await page.goto(`${app.baseUrl}/records/lots/${bottled.lotId}`);
    await page.getByRole('heading', { name: /Filtration record/ }).waitFor();
    expect(await page.getByTestId('readiness-thresholds').first().textContent()).toMatch(/Judged when the run started, against Porewise’s default thresholds: turbidity ready up to 1 NTU/);
    await screenshot(page, 'record-readiness-desktop');
    await page.getByTestId('readiness-thresholds').first().locator('xpath=ancestor::section[1]').screenshot({ path: join(outputDir, 'record-readiness-section-desktop.png') });

    const memId = bottled.world.memIds[0];
    await page.goto(`${app.baseUrl}/cartridges/${memId}`);
    await page.getByText('Litres of a run corrected').first().waitFor();
    await page.getByText(/Filtered 4,000\sL/).first().waitFor();
    await page.getByText(/A reading was corrected after the run closed: Meter read 3,800 L\./).waitFor();
    await screenshot(page, 'cartridge-run-correction-desktop');

    await page.setViewportSize(PHONE);
    await screenshot(page, 'cartridge-run-correction-phone');
    await page.getByRole('list', { name: 'History' }).screenshot({ path: join(outputDir, 'cartridge-run-correction-history-phone.png') });
    await page.goto(`${app.baseUrl}/records/lots/${bottled.lotId}`);
    await page.getByTestId('readiness-thresholds').first().waitFor();
    await screenshot(page, 'record-readiness-phone');
    await page.getByTestId('readiness-thresholds').first().locator('xpath=ancestor::section[1]').screenshot({ path: join(outputDir, 'record-readiness-section-phone.png') });
    expect(errors).toEqual([]);
    await context.close();
  });
});
