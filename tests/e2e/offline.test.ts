// @vitest-environment node
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { approvedPlanLot, startRun } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { logReading } from '../support/run-page';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

async function storedReadings(runId: string) {
  const res = await app.db.execute(sql`select count(*)::int as n, count(distinct client_key)::int as keys from run_readings where run_id = ${runId}::uuid`);
  return res.rows[0] as { n: number; keys: number };
}

describe('the cellar without signal', () => {
  it('readings logged offline survive a reload and a closed tab, and are stored once when the connection returns', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Offline E2E Cellars' });
    const { planLotId } = await approvedPlanLot(owner, { name: 'Offline day' });
    const tech = await addMember(app, owner, 'technician');
    const run = await startRun(tech.client, planLotId);

    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
    // The installable app: manifest and a service worker that takes the page.
    const manifest = await (await page.request.get(`${app.baseUrl}/manifest.webmanifest`)).json();
    expect(manifest).toMatchObject({ name: 'Porewise', display: 'standalone' });
    expect(manifest.icons.some((i: { sizes: string }) => i.sizes === '512x512')).toBe(true);
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
    });
    await page.goto(`${app.baseUrl}/runs/${run.id}`);
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);
    // The section tabs a technician uses sit in the bottom bar on a phone.
    const bottom = page.getByRole('navigation', { name: 'Cellar shortcuts' });
    for (const name of ['Today', 'Runs', 'Care', 'Cartridges']) expect(await bottom.getByRole('link', { name }).isVisible()).toBe(true);
    // Let the kept query cache reach IndexedDB.
    await page.waitForTimeout(1500);

    // Signal gone: three readings are kept on the phone.
    await context.setOffline(true);
    await page.getByLabel('Flow (optional)').fill('2400');
    await logReading(page, '500', '2.20', '2.00');
    await page.getByText('Kept — waiting to send').waitFor();
    await logReading(page, '1000', '2.26', '2.00');
    await logReading(page, '1500', '2.34', '2.00');
    await page.getByTestId('offline-bar').getByText('3 entries waiting to send').waitFor();
    expect(await page.getByTestId('readings-0').locator('[data-waiting]').count()).toBeGreaterThanOrEqual(3);
    await screenshot(page, 'offline-run-waiting-phone');
    await expectNoSeriousA11yViolations(page);

    // Reload while still offline: the page opens from the device with the three waiting.
    await page.reload();
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    await page.getByTestId('fetched-at').waitFor();
    await page.getByTestId('offline-bar').getByText('3 entries waiting to send').waitFor();
    expect(await page.getByTestId('readings-0').locator('ul [data-waiting]').count()).toBe(3);
    expect(await storedReadings(run.id)).toEqual({ n: 0, keys: 0 });
    await screenshot(page, 'offline-run-reloaded-phone');

    // A section never opened before: the offline message, not an error page.
    await page.getByRole('navigation', { name: 'Cellar shortcuts' }).getByRole('link', { name: 'Cartridges' }).click();
    await page.getByText('You are offline — this page was not opened before').waitFor();
    expect(await page.getByText('Unexpected Application Error').count()).toBe(0);
    await screenshot(page, 'offline-never-opened-phone');
    await page.goBack();
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();

    // Back online: sent, stored exactly once.
    await context.setOffline(false);
    await expect.poll(() => storedReadings(run.id), { timeout: 20_000 }).toEqual({ n: 3, keys: 3 });
    await page.getByTestId('offline-bar').getByText('waiting to send').waitFor({ state: 'detached', timeout: 20_000 });
    await expect.poll(async () => page.getByTestId('readings-0').locator('ul > li').count(), { timeout: 20_000 }).toBe(3);
    expect(await page.getByTestId('readings-0').locator('[data-waiting]').count()).toBe(0);

    // Again, with the tab closed and reopened before the signal returns.
    await context.setOffline(true);
    await logReading(page, '2000', '2.45', '2.00');
    await logReading(page, '2500', '2.58', '2.00');
    await page.close();
    const reopened = await context.newPage();
    const reopenedErrors: string[] = [];
    reopened.on('pageerror', (e) => reopenedErrors.push(e.message));
    await reopened.goto(`${app.baseUrl}/runs/${run.id}`);
    await reopened.getByRole('heading', { name: 'Log reading' }).waitFor();
    await reopened.getByTestId('offline-bar').getByText('2 entries waiting to send').waitFor();
    expect((await storedReadings(run.id)).n).toBe(3);
    await context.setOffline(false);
    await expect.poll(() => storedReadings(run.id), { timeout: 20_000 }).toEqual({ n: 5, keys: 5 });
    await reopened.getByTestId('offline-bar').getByText('waiting to send').waitFor({ state: 'detached', timeout: 20_000 });
    await reopened.getByTestId('forecast-0').waitFor();
    expect(await reopened.getByTestId('forecast-0').textContent()).toMatch(/≈ [\d,]+ L left · about \d+|≈ [\d,]+ L left · under a minute|Beyond the readings/);
    await screenshot(reopened, 'offline-run-sent-phone');
    await reopened.setViewportSize(DESKTOP);
    await screenshot(reopened, 'offline-run-sent-desktop');

    expect(errors.filter((e) => !/Failed to fetch|ERR_INTERNET_DISCONNECTED|Failed to load resource/.test(e))).toEqual([]);
    expect(reopenedErrors).toEqual([]);
    await context.close();
  });
});
