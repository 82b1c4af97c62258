// @vitest-environment node
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { DESKTOP, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp({ withStorage: true });

/** A Vienna cellar logger's export: a preamble line, semicolons, decimal commas, a totaliser in hL, psi and °F. */
function loggerFile(startHour: number) {
  const rows = [0, 1, 2, 3].map((i) => {
    const mm = String(i * 10).padStart(2, '0');
    return `14.03.2026 ${String(startHour).padStart(2, '0')}:${mm}:00;${(1250 + i * 4).toLocaleString('de-DE', { minimumFractionDigits: 2 })};${(20 + i * 1.5).toFixed(1).replace('.', ',')};14,5;${(50 + i).toFixed(1).replace('.', ',')}`;
  });
  return ['Gerät;DL-7 Kellerlogger', 'Datum/Zeit;Zähler hL;P vor (psi);P nach (psi);Temp °F', ...rows, ''].join('\r\n');
}

async function chooseFile(page: Page, name: string, text: string) {
  await page.locator('#logger-file').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });
}

describe('logger files in the browser', () => {
  it('maps a logger’s columns once and saves a profile; the next file imports with the profile on a phone', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Logger E2E Cellars' });
    const world = await createPlanWorld(owner);
    await fillTrainHousings(owner, world);
    const plan = await createPlan(owner, world.lineId, { name: 'Logger day' });
    const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
    const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
    expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
    expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
    const tech = await addMember(app, owner, 'technician');
    const run = await tech.client.post('/api/runs', { planLotId });
    expect(run.status).toBe(201);
    const runId = run.body.id as string;

    // Desktop, first time: map the columns, save them as a profile, preview, import.
    {
      const { context, page, errors } = await app.signIn(tech.email, { viewport: DESKTOP });
      await page.goto(`${app.baseUrl}/runs/${runId}`);
      await page.getByRole('link', { name: 'Import logger file' }).first().click();
      await page.getByRole('heading', { name: 'Import logger file' }).waitFor();
      await chooseFile(page, 'DL-7 morning.csv', loggerFile(8));
      await page.getByRole('heading', { name: '2. Map the columns' }).waitFor();
      // The columns were guessed from their names; the person checks them and sets the logger's clock zone.
      expect(await page.getByLabel('Date and time').inputValue()).toBe('Datum/Zeit');
      expect(await page.getByLabel('Litres come from').inputValue()).toBe('totaliser');
      expect(await page.getByLabel('Upstream unit').inputValue()).toBe('psi');
      expect(await page.getByLabel('Decimal mark').inputValue()).toBe(',');
      await page.getByLabel('Logger clock’s time zone').fill('Europe/Vienna');
      await page.getByLabel('Temperature unit').selectOption('degF');
      await page.getByLabel('Save as logger profile').fill('Cellar logger DL-7');
      await screenshot(page, 'logger-mapping-desktop');
      await page.getByRole('button', { name: 'Save profile' }).click();
      await page.getByText('All 4 rows are right', { exact: false }).waitFor();
      expect(await page.getByLabel('Logger profile', { exact: true }).locator('option:checked').textContent()).toBe('Cellar logger DL-7');
      await page.getByRole('img', { name: /ΔP against litres/ }).waitFor();
      // 08:00 in Vienna on 14 March is 07:00 UTC; the first row shows 0 L (the totaliser's start).
      expect(await page.getByRole('table', { name: 'First rows as read' }).textContent()).toMatch(/0 L/);
      await screenshot(page, 'logger-import-desktop');
      await page.getByRole('button', { name: /Import 4 rows into/ }).click();
      await page.waitForURL(new RegExp(`/runs/${runId}$`));
      await page.getByText('4 readings imported').waitFor();
      expect(errors).toEqual([]);
      await context.close();
    }

    // A phone, the next file: the saved profile is chosen already; choose the file, then Import.
    {
      const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
      await page.goto(`${app.baseUrl}/runs/${runId}/import?stage=1`);
      await page.getByRole('heading', { name: 'Import logger file' }).waitFor();
      expect(await page.getByLabel('Logger profile', { exact: true }).locator('option:checked').textContent()).toBe('Cellar logger DL-7');
      await chooseFile(page, 'DL-7 afternoon.csv', loggerFile(14));
      await page.getByText('All 4 rows are right', { exact: false }).waitFor();
      await page.getByRole('img', { name: /ΔP against litres/ }).waitFor();
      expect(await page.getByRole('heading', { name: '2. Map the columns' }).count()).toBe(0);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await expectNoSeriousA11yViolations(page);
      await screenshot(page, 'logger-import-phone');
      await page.getByRole('button', { name: /Import 4 rows into/ }).click();
      await page.waitForURL(new RegExp(`/runs/${runId}$`));
      await page.getByText('4 readings imported').waitFor();

      // The same file again: the preview says so, and nothing more is stored.
      await page.goto(`${app.baseUrl}/runs/${runId}/import?stage=1`);
      await chooseFile(page, 'DL-7 afternoon.csv', loggerFile(14));
      await page.getByText('already imported', { exact: false }).first().waitFor();
      expect(await page.getByRole('button', { name: /Import 4 rows into/ }).isDisabled()).toBe(true);
      await screenshot(page, 'logger-import-again-phone');
      // A new mapping starts from the chosen profile, to adjust it for another logger.
      await page.getByLabel('Logger profile', { exact: true }).selectOption({ label: 'New mapping …' });
      await page.getByRole('heading', { name: '2. Map the columns' }).waitFor();
      expect(await page.getByLabel('Logger clock’s time zone').inputValue()).toBe('Europe/Vienna');
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await expectNoSeriousA11yViolations(page);
      await screenshot(page, 'logger-mapping-phone');
      expect(errors).toEqual([]);
      await context.close();
    }

    const detail = await owner.get(`/api/runs/${runId}`);
    expect(detail.body.stages[0].readings).toHaveLength(4);
    expect(detail.body.stages[1].readings).toHaveLength(4);
    expect(detail.body.stages[1].readings[0].at).toBe('2026-03-14T13:00:00.000Z');
    const files = await owner.get(`/api/attachments?ownerKind=run&ownerId=${runId}`);
    expect(files.body.items.map((f: { fileName: string }) => f.fileName).sort()).toEqual(['DL-7 afternoon.csv', 'DL-7 morning.csv']);
  });
});
