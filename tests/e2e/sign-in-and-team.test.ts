// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { setupBrowserApp, PHONE, screenshot } from '../support/browser';
import { linkFrom, TEST_PASSWORD, uniqueEmail } from '../support/test-app';

const app = setupBrowserApp();

describe('sign-up, sign-out, sign-in, invite a technician', () => {
  it('works end to end in Chromium', async () => {
    const ownerEmail = uniqueEmail('e2e-owner');
    const { context: owner, page, errors } = await app.newPage({ viewport: { width: 1280, height: 800 } });

    // Sign up: land in the shell with the winery and the person in the header.
    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Wren Ashdown');
    await page.getByLabel('E-mail', { exact: true }).fill(ownerEmail);
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByLabel('Winery name').fill('Larchmere Test Cellars');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your mail').waitFor();
    await page.goto(linkFrom((await app.mail.waitFor(ownerEmail, { subject: /Confirm/, timeoutMs: 20_000 })).text, '/confirm-sign-up'));
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Team' }).click();
    await page.getByRole('heading', { name: 'Team' }).waitFor();
    expect(await page.getByTestId('winery').textContent()).toContain('Larchmere Test Cellars');
    expect(await page.getByTestId('person').textContent()).toContain('Wren Ashdown');
    await screenshot(page, 'team-owner-desktop');

    // Sign out, then sign in again.
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.waitForURL(/\/sign-in$/);
    await page.getByLabel('E-mail', { exact: true }).fill(ownerEmail);
    await page.getByLabel('Password', { exact: true }).fill('wrong-password-here');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').filter({ hasText: 'not right' }).waitFor();
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('navigation', { name: 'Sections' }).waitFor();
    await page.goto(`${app.baseUrl}/team`);
    await page.getByRole('heading', { name: 'Team' }).waitFor();

    // Invite a technician.
    const techEmail = uniqueEmail('e2e-tech');
    const before = app.mail.messages.length;
    await page.getByRole('button', { name: 'Invite someone' }).click();
    await page.getByLabel('E-mail', { exact: true }).fill(techEmail);
    await page.getByLabel('Role', { exact: true }).selectOption('technician');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText('Invitation sent').waitFor();
    await page.getByRole('cell', { name: techEmail }).waitFor();
    const mail = await app.mail.waitFor(techEmail, { after: before });
    const link = linkFrom(mail.text, '/invitation');

    // The technician accepts in a second browser context.
    const { context: tech, page: techPage, errors: techErrors } = await app.newPage({ viewport: PHONE, mobile: true });
    await techPage.goto(link);
    await techPage.getByText('Join Larchmere Test Cellars as technician').waitFor();
    await techPage.getByLabel('Your name').fill('Rowan Pike');
    await techPage.getByLabel('Choose a password').fill(TEST_PASSWORD);
    await techPage.getByRole('button', { name: 'Create account and join' }).click();
    await techPage.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Team' }).click();
    await techPage.getByRole('heading', { name: 'Team' }).waitFor();

    // Restricted navigation and no team management for a technician.
    const nav = techPage.getByRole('navigation', { name: 'Sections' });
    expect(await nav.getByRole('link').allTextContents()).toEqual(['Today', 'Cellar', 'Equipment', 'Cartridges', 'Plans', 'Runs', 'Care', 'Records', 'Change log', 'Team', 'Settings']);
    expect(await techPage.getByRole('button', { name: 'Invite someone' }).count()).toBe(0);
    expect(await techPage.getByRole('combobox', { name: /Role of/ }).count()).toBe(0);
    await screenshot(techPage, 'shell-technician-phone');

    // The owner sees the new member with their role, and may change it.
    await page.reload();
    await page.getByRole('combobox', { name: 'Role of Rowan Pike' }).waitFor();
    expect(await page.getByRole('combobox', { name: 'Role of Rowan Pike' }).inputValue()).toBe('technician');
    expect(await page.getByRole('navigation', { name: 'Sections' }).getByRole('link').allTextContents()).toEqual(['Today', 'Cellar', 'Equipment', 'Cartridges', 'Plans', 'Runs', 'Care', 'Records', 'Change log', 'Team', 'Settings', 'Mail outbox']);

    // Settings: choose US customary units.
    await techPage.getByRole('link', { name: 'Settings' }).click();
    await techPage.getByText('US customary').click();
    await techPage.getByRole('button', { name: 'Save settings' }).click();
    await techPage.getByText('Settings saved').waitFor();
    await screenshot(techPage, 'settings-phone');

    // The owner sees the winery's readiness thresholds with their sources, and may edit them.
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Settings' }).click();
    await page.getByRole('heading', { name: 'Readiness thresholds' }).waitFor();
    await page.getByLabel('White turbidity limit').fill('0.8');
    await page.getByRole('button', { name: 'Save thresholds' }).click();
    await page.getByText('Thresholds saved').waitFor();
    await screenshot(page, 'settings-owner-desktop');

    expect(errors).toEqual([]);
    expect(techErrors).toEqual([]);
    await owner.close();
    await tech.close();
  });

  it('resets a forgotten password through the e-mailed link', async () => {
    const email = uniqueEmail('e2e-reset');
    const { context: ctx, page, errors } = await app.newPage({ viewport: PHONE });
    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Ash Morrow');
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByLabel('Winery name').fill('Reset Test Winery');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your mail').waitFor();
    await page.goto(linkFrom((await app.mail.waitFor(email, { subject: /Confirm/, timeoutMs: 20_000 })).text, '/confirm-sign-up'));
    await page.getByRole('navigation', { name: 'Sections' }).waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.waitForURL(/\/sign-in$/);

    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByRole('heading', { name: 'Reset your password' }).waitFor();
    const before = app.mail.messages.length;
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByText('a reset link is on its way').waitFor();
    const mail = await app.mail.waitFor(email, { after: before });
    await page.goto(linkFrom(mail.text, '/reset-password'));
    await page.getByLabel('New password', { exact: true }).fill('an-entirely-new-secret');
    await page.getByLabel('Repeat the new password').fill('an-entirely-new-secret');
    await page.getByRole('button', { name: 'Set new password and sign in' }).click();
    await page.getByRole('navigation', { name: 'Sections' }).waitFor();
    expect(errors).toEqual([]);
    await ctx.close();
  });
});
