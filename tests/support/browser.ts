// Headless Chromium from Debian's package, driven by playwright-core, against the real app.
//
// Every browser test file starts with one line:
//
//   const app = setupBrowserApp();            // or setupBrowserApp({ demo: true, withStorage: true })
//
// It registers the beforeAll/afterAll hooks that start the app over HTTP (serving the built
// client), seed the demo wineries if asked, launch Chromium, and close both afterwards. The
// answer is the running TestApp (baseUrl, db, mail …, so `addMember(app, …)` works) plus the ways
// a test gets a page:
//
//   app.signIn(email, { viewport: PHONE, mobile: true })  signs in through the form
//   app.pageFor(client, { viewport })                     a page with the session of a test Client
//   app.newPage({ viewport })                             a signed-out page
//   app.contextFor(client, opts) / app.newContext(opts)   just the browser context
//
// Each page answer is { context, page, errors }: `errors` gathers page errors and console errors
// (CSP violations included); tests end with `expect(errors).toEqual([])` and `context.close()`.
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import type { AppConfig } from '../../server/app';
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed';
import { startTestApp, TEST_PASSWORD, type Client, type TestApp } from './test-app';

export const outputDir = resolve(import.meta.dirname, '../../test-output');

/** The built client the browser tests load (E2E_CLIENT_DIR overrides, e.g. a private build folder). */
export const clientDir = resolve(process.env.E2E_CLIENT_DIR ?? resolve(import.meta.dirname, '../../dist/client'));

export type Viewport = { width: number; height: number };
/** A laptop. */
export const DESKTOP: Viewport = { width: 1280, height: 900 };
/** A phone 390 px wide. */
export const PHONE: Viewport = { width: 390, height: 844 };

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

/** A browser context's options: the viewport (desktop unless told), `mobile` for a touch phone, and any of Playwright's own. */
export type ContextOptions = Omit<BrowserContextOptions, 'viewport'> & { viewport?: Viewport; mobile?: boolean };

/** A page in its own context, with its page errors gathered. */
export type OpenPage = { context: BrowserContext; page: Page; errors: string[] };

export type BrowserApp = TestApp & {
  readonly browser: Browser;
  /** A fresh, signed-out browser context. */
  newContext(opts?: ContextOptions): Promise<BrowserContext>;
  /** A fresh, signed-out page. */
  newPage(opts?: ContextOptions): Promise<OpenPage>;
  /** A browser context carrying the session of a test `Client` (the same session cookie). */
  contextFor(client: Client, opts?: ContextOptions): Promise<BrowserContext>;
  /** A page carrying the session of a test `Client`. */
  pageFor(client: Client, opts?: ContextOptions): Promise<OpenPage>;
  /** Signs in through the sign-in form (the demo password on a demo app, the test password otherwise); lands in the shell. */
  signIn(email: string, opts?: ContextOptions & { password?: string }): Promise<OpenPage>;
};

export type BrowserAppOptions = {
  /** Seed the demo wineries (Quillwater, Brambleford) before the tests. */
  demo?: boolean;
  /** Also start a fake S3 server for attachments and exports. */
  withStorage?: boolean;
  config?: Partial<AppConfig>;
};

/**
 * The one set-up of a browser test file: registers beforeAll (start the app serving the built
 * client, seed the demo if asked, launch Chromium) and afterAll (close both). Call it at the top
 * of the file; use the answer inside the tests.
 */
export function setupBrowserApp(opts: BrowserAppOptions = {}): BrowserApp {
  let app: TestApp | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    app = await startTestApp({ config: { clientDir, ...opts.config }, withStorage: opts.withStorage });
    if (opts.demo) await seedDemo(app.db);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });
  const started = () => {
    if (!app || !browser) throw new Error('setupBrowserApp: the app is used before its beforeAll ran (use it inside a test)');
    return { app, browser };
  };
  const newContext = ({ viewport = DESKTOP, mobile = false, ...rest }: ContextOptions = {}) =>
    started().browser.newContext({ ...rest, viewport, isMobile: mobile, hasTouch: mobile });
  const open = async (context: BrowserContext): Promise<OpenPage> => {
    const page = await context.newPage();
    return { context, page, errors: watchPageErrors(page) };
  };
  const contextFor = async (client: Client, o: ContextOptions = {}) => {
    const context = await newContext(o);
    await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: started().app.baseUrl })));
    return context;
  };
  const web = {
    get browser() {
      return started().browser;
    },
    newContext,
    newPage: async (o?: ContextOptions) => open(await newContext(o)),
    contextFor,
    pageFor: async (client: Client, o?: ContextOptions) => open(await contextFor(client, o)),
    async signIn(email: string, { password, ...o }: ContextOptions & { password?: string } = {}) {
      const opened = await open(await newContext(o));
      const { page } = opened;
      await page.goto(`${started().app.baseUrl}/sign-in`);
      await page.getByLabel('E-mail', { exact: true }).fill(email);
      await page.getByLabel('Password', { exact: true }).fill(password ?? (opts.demo ? DEMO_PASSWORD : TEST_PASSWORD));
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('navigation', { name: 'Sections' }).waitFor();
      return opened;
    },
  };
  // The running TestApp's own fields, read through once the app has started.
  for (const key of ['baseUrl', 'mail', 'db', 'pool', 'queue', 'alerts', 'close'] as const) {
    Object.defineProperty(web, key, { enumerable: true, get: () => started().app[key] });
  }
  return web as BrowserApp;
}
