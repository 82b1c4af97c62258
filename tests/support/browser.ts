// Headless Chromium from Debian's package, driven by playwright-core.
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';

export const outputDir = resolve(import.meta.dirname, '../../test-output');

/** The built client the browser tests load (E2E_CLIENT_DIR overrides, e.g. a private build folder). */
export const clientDir = resolve(process.env.E2E_CLIENT_DIR ?? resolve(import.meta.dirname, '../../dist/client'));

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(outputDir, { recursive: true });
  const path = join(outputDir, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}

/** Fails the test on any uncaught page error or console error (CSP violations included). */
export function watchPageErrors(page: Page) {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource: the server responded with a status of (401|404|409|410)/.test(m.text())) errors.push(`console: ${m.text()}`);
  });
  return errors;
}

/** A fresh browser context signed in as `email` (demo password unless given), with page-error watching. */
export async function signInAs(
  browser: Browser,
  baseUrl: string,
  email: string,
  opts: { viewport: { width: number; height: number }; mobile?: boolean; password?: string },
) {
  const context = await browser.newContext({ viewport: opts.viewport, isMobile: opts.mobile ?? false, hasTouch: opts.mobile ?? false });
  const page = await context.newPage();
  const errors = watchPageErrors(page);
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(opts.password ?? 'porewise-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Sections' }).waitFor();
  return { context, page, errors };
}
