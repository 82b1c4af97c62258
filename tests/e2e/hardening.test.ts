// @vitest-environment node
// The pages the hardening touched: sign-up's "check your mail", the confirmation link, the mail
// outbox (closed to strangers, open with the printed key) and the forgot-password hint — at
// desktop and phone width, with the strict CSP (any CSP violation is a console error and fails).
import { describe, expect, it } from 'vitest';
import { setupBrowserApp, PHONE, screenshot } from '../support/browser';
import { linkFrom, TEST_OUTBOX_KEY, TEST_PASSWORD, uniqueEmail } from '../support/test-app';

const app = setupBrowserApp();

describe.each([
  ['desktop', { width: 1280, height: 800 }],
  ['phone', PHONE],
])('hardened pages (%s)', (label, viewport) => {
  it('sign-up → check your mail → link → signed in; outbox closed without the key, open with it', async () => {
    const { context, page, errors } = await app.newPage({ viewport, mobile: label === 'phone' });
    const email = uniqueEmail(`e2e-harden-${label}`);

    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Tamsin Reeve');
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByLabel('Winery name').fill('Fernhollow Test Cellars');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your mail').waitFor();
    await page.getByRole('status').getByText(/outbox link printed/).waitFor(); // the note follows the app's info, a moment after the headline
    await screenshot(page, `harden-sign-up-check-mail-${label}`);

    // A stranger's browser cannot read the outbox…
    const { context: stranger, page: strangerPage, errors: strangerErrors } = await app.newPage({ viewport });
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
    await page.getByRole('status').getByText(/outbox link printed in the terminal/).waitFor(); // the note follows the app's info, a moment after the headline
    await screenshot(page, `harden-forgot-password-dev-${label}`);

    expect(errors).toEqual([]);
    await context.close();
  });
});
