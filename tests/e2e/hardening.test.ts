// @vitest-environment node
// The pages the hardening touched: sign-up's "check your mail", the confirmation link, the mail
// outbox (closed to strangers, open with the printed key) and the forgot-password hint — at
// desktop and phone width, with the strict CSP (any CSP violation is a console error and fails).
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientDir, launchBrowser, screenshot, watchPageErrors } from '../support/browser';
import { linkFrom, startTestApp, TEST_OUTBOX_KEY, TEST_PASSWORD, uniqueEmail, type TestApp } from '../support/test-app';

let app: TestApp;
let browser: Browser;

beforeAll(async () => {
  app = await startTestApp({ config: { clientDir } });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await app?.close();
});

describe.each([
  ['desktop', { width: 1280, height: 800 }],
  ['phone', { width: 390, height: 844 }],
])('hardened pages (%s)', (label, viewport) => {
  it('sign-up → check your mail → link → signed in; outbox closed without the key, open with it', async () => {
    const context = await browser.newContext({ viewport, isMobile: label === 'phone', hasTouch: label === 'phone' });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    const email = uniqueEmail(`e2e-harden-${label}`);

    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Tamsin Reeve');
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByLabel('Winery name').fill('Fernhollow Test Cellars');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your mail').waitFor();
    expect(await page.getByRole('status').textContent()).toMatch(/outbox link printed/);
    await screenshot(page, `harden-sign-up-check-mail-${label}`);

    // A stranger's browser cannot read the outbox…
    const stranger = await browser.newContext({ viewport });
    const strangerPage = await stranger.newPage();
    const strangerErrors = watchPageErrors(strangerPage);
    await strangerPage.goto(`${app.baseUrl}/outbox`);
    await strangerPage.getByText('opens only for an owner').waitFor();
    await screenshot(strangerPage, `harden-outbox-closed-${label}`);
    // …the printed link opens it.
    await strangerPage.goto(`${app.baseUrl}/outbox?key=${TEST_OUTBOX_KEY}`);
    await strangerPage.getByRole('heading', { name: 'Mail outbox' }).waitFor();
    await strangerPage.getByText('Confirm your Porewise account').first().waitFor();
    await screenshot(strangerPage, `harden-outbox-with-key-${label}`);
    expect(strangerErrors).toEqual([]);
    await stranger.close();

    const mail = await app.mail.waitFor(email, { subject: /Confirm/, timeoutMs: 20_000 });
    await page.goto(linkFrom(mail.text, '/confirm-sign-up'));
    await page.getByRole('navigation', { name: 'Sections' }).waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in$/);

    await page.goto(`${app.baseUrl}/forgot-password`);
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByText('a reset link is on its way').waitFor();
    expect(await page.getByRole('status').textContent()).toMatch(/outbox link printed in the terminal/);
    await screenshot(page, `harden-forgot-password-dev-${label}`);

    expect(errors).toEqual([]);
    await context.close();
  });
});
