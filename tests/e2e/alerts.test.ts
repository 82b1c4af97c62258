// @vitest-environment node
// The bell: a technician records a failed bubble point on a phone; the owner's bell count rises,
// the owner opens the alert and lands on the cartridge. Screenshots at desktop and 390 px.
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { setupBrowserApp, DESKTOP, PHONE, screenshot, outputDir } from '../support/browser';

const app = setupBrowserApp({ demo: true });

async function unreadCount(page: Page): Promise<number> {
  const label = (await page.getByTestId('notification-bell').getAttribute('aria-label')) ?? '';
  const m = /(\d+) unread/.exec(label);
  return m ? Number(m[1]) : 0;
}

describe('Alerts reach the owner', () => {
  it('the bell count rises when a technician records a failed bubble point; the owner opens the alert and lands on the cartridge', async () => {
    const owner = await app.signIn('owner@quillwater.test', { viewport: DESKTOP });
    await owner.page.goto(`${app.baseUrl}/today`);
    await owner.page.getByTestId('notification-bell').waitFor();
    const before = await unreadCount(owner.page);

    // A fresh membrane cartridge for this test, registered by the owner (the PES 0.45 type of the demo).
    const serial = `QW-ALERT-${Date.now().toString(36).toUpperCase()}`;
    const headers = { origin: app.baseUrl };
    const types = await (await owner.page.request.get(`${app.baseUrl}/api/cartridge-types?pageSize=100`, { headers })).json();
    const pes = (types.items as { id: string; kind: string; bubblePointMinBar: number | null }[]).find((t) => t.kind === 'membrane' && t.bubblePointMinBar === 3.2)!;
    const reg = await owner.page.request.post(`${app.baseUrl}/api/cartridges`, { headers, data: { serial, batch: 'E2E', typeId: pes.id, lengthIn: 30, receivedAt: '2025-01-05' } });
    expect(reg.status()).toBe(201);
    const cartridgeId = (await reg.json()).id as string;

    // The technician, on a phone, records a failed bubble point.
    const tech = await app.signIn('tech@quillwater.test', { viewport: PHONE, mobile: true });
    await tech.page.goto(`${app.baseUrl}/care`);
    await tech.page.getByLabel('Cartridge serial').fill(serial);
    await tech.page.getByRole('list', { name: 'Matching cartridges' }).getByRole('button').first().click();
    await tech.page.getByRole('tab', { name: 'Record an integrity test' }).click();
    await tech.page.getByLabel('Test', { exact: true }).selectOption('bubble-point');
    await tech.page.getByLabel('Bubble point read').fill('2.6');
    await tech.page.getByText('Would fail').waitFor();
    await tech.page.getByRole('button', { name: 'Save test' }).click();
    await tech.page.getByRole('heading', { name: 'Failed' }).waitFor();
    // The technician gets run alarms too: their own bell shows it.
    await tech.page.getByTestId('unread-count').waitFor({ timeout: 30_000 });
    await screenshot(tech.page, 'alerts-technician-phone');

    // The owner's bell rises without reloading (it polls).
    await owner.page.waitForFunction(
      (n) => {
        const label = document.querySelector('[data-testid="notification-bell"]')?.getAttribute('aria-label') ?? '';
        const m = /(\d+) unread/.exec(label);
        return (m ? Number(m[1]) : 0) > n;
      },
      before,
      { timeout: 40_000 },
    );
    expect(await unreadCount(owner.page)).toBeGreaterThan(before);
    await owner.page.getByRole('heading', { name: 'Open alerts' }).waitFor({ timeout: 20_000 });
    await screenshot(owner.page, 'alerts-today-desktop');

    await owner.page.getByTestId('notification-bell').click();
    await owner.page.getByRole('heading', { name: 'Notifications', exact: true }).waitFor();
    const item = owner.page.getByTestId('notification').filter({ hasText: `Integrity test failed on ${serial}` });
    await item.waitFor();
    await item.getByText('Re-wet and re-test the membrane before filtering; do not bottle through it.').waitFor();
    await screenshot(owner.page, 'alerts-notifications-desktop');
    await item.getByRole('button', { name: 'Open record' }).click();
    await owner.page.waitForURL(`${app.baseUrl}/cartridges/${cartridgeId}`);
    await owner.page.getByRole('heading', { name: serial }).first().waitFor();
    expect(owner.errors).toEqual([]);
    expect(tech.errors).toEqual([]);
    await owner.context.close();
    await tech.context.close();
  }, 120_000);

  it('the notifications page and the alert settings at 390 px', async () => {
    const { context, page, errors } = await app.signIn('owner@quillwater.test', { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/notifications`);
    await page.getByRole('heading', { name: 'Notifications', exact: true }).waitFor();
    await page.getByTestId('notification').first().waitFor();
    await screenshot(page, 'alerts-notifications-phone');
    await page.screenshot({ path: `${outputDir}/alerts-notifications-phone-view.png` });
    await page.getByRole('button', { name: /^Unread/ }).click();
    const markAll = page.getByRole('button', { name: 'Mark all read' });
    if (await markAll.isEnabled()) await markAll.click();
    await page.getByText('Nothing unread').waitFor();
    expect(await page.getByTestId('unread-count').count()).toBe(0);

    await page.goto(`${app.baseUrl}/settings`);
    await page.getByRole('heading', { name: 'Alerts for you' }).waitFor();
    await page.getByLabel('Integrity test failed').selectOption('digest');
    await page.getByRole('button', { name: 'Save alert preferences' }).click();
    await page.getByText('Alert preferences saved').waitFor();
    await page.getByRole('heading', { name: 'Mail that could not be delivered' }).waitFor();
    await page.getByRole('button', { name: 'Make a calendar link' }).click();
    await page.getByLabel(/Your calendar link/).waitFor();
    await page.getByRole('heading', { name: 'Alerts for you' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'alerts-settings-phone');
    // Back to the role default so other browser tests see the demo as seeded.
    await page.getByLabel('Integrity test failed').selectOption('email');
    await page.getByRole('button', { name: 'Save alert preferences' }).click();
    await page.getByText('Alert preferences saved').first().waitFor();
    expect(errors).toEqual([]);
    await context.close();
  }, 60_000);
});
