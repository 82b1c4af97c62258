// Starts the real app over HTTP against the real test database, with the fake SMTP server.
import type { AnswerCache } from '../../server/middleware/answer-cache';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createApp, type AppConfig } from '../../server/app';
import { createDatabase } from '../../server/db/client';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { startFakeS3, startFakeSmtp, type FakeSmtp } from '../../server/lib/fake-services';
import { createSmtpMailer } from '../../server/lib/mail';
import { createQueue, queuedMailer, type Queue } from '../../server/lib/queue';
import { startWorkers } from '../../server/jobs/workers';
import { createAlertsService, type AlertsService } from '../../server/modules/alerts/alerts.service';
import { randomBytes } from 'node:crypto';
import { createS3Storage, type Storage } from '../../server/lib/storage';
import { databaseUrl } from '../../scripts/lib/postgres';
import { duringSchemaChange } from './schema-lock';

export type TestApp = {
  baseUrl: string;
  mail: FakeSmtp;
  db: ReturnType<typeof createDatabase>['db'];
  pool: ReturnType<typeof createDatabase>['pool'];
  /** The app's own job queue (its own pg-boss schema, so parallel test files never share jobs). */
  queue: Queue;
  alerts: AlertsService;
  /** The app's kept read answers (server/middleware/answer-cache.ts): its counters tell a reuse. */
  answers: AnswerCache;
  close(): Promise<void>;
};

const unusedStorage: Storage = {
  ensureBucket: async () => {},
  put: async () => {
    throw new Error('storage not configured in this test');
  },
  get: async () => {
    throw new Error('storage not configured in this test');
  },
  remove: async () => {},
};

/** The fake mail server of each running test app, so signUp(baseUrl) can follow its link. */
const mailOf = new Map<string, FakeSmtp>();

/** The secret that opens the development outbox of a test app without signing in. */
export const TEST_OUTBOX_KEY = 'test-outbox-key-5a1f0c9e';

/** Starts the app; with `withStorage` also a fake S3 server in a temporary folder. */
export async function startTestApp(
  opts: { config?: Partial<AppConfig>; withStorage?: boolean; databaseUrl?: string; mailRetryDelaySeconds?: number; mailRetryLimit?: number } = {},
): Promise<TestApp> {
  const { db, pool } = createDatabase(opts.databaseUrl ?? databaseUrl('porewise_test'), { max: 5 });
  const mail = await startFakeSmtp();
  // Mail goes through the job queue (polled every 0.5 s); with both test lanes of `npm test` on
  // two cores, one can take longer than the fake server's 5 s default. A test that means a
  // shorter wait says so.
  const waitForMail = mail.waitFor;
  mail.waitFor = (address, opts = {}) => waitForMail(address, { timeoutMs: 20_000, ...opts });
  let storage = unusedStorage;
  let closeStorage = async () => {};
  if (opts.withStorage) {
    const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-s3-'));
    const s3 = await startFakeS3({ directory: dir });
    storage = createS3Storage({ endpoint: s3.endpoint, region: 'us-east-1', bucket: 'porewise-test', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' });
    await storage.ensureBucket();
    closeStorage = async () => {
      await s3.close();
      rmSync(dir, { recursive: true, force: true });
    };
  }
  const smtp = createSmtpMailer({ host: '127.0.0.1', port: mail.port, from: 'Porewise <no-reply@porewise.test>' });
  const queue = await duringSchemaChange(pool, () =>
    createQueue({
      connectionString: databaseUrl('porewise_test'),
      schema: `pgboss_t_${randomBytes(6).toString('hex')}`,
      mailRetryDelaySeconds: opts.mailRetryDelaySeconds ?? 1,
      mailRetryLimit: opts.mailRetryLimit ?? 3,
      pollingIntervalSeconds: 0.5,
    }),
  );
  const mailer = queuedMailer(queue);
  let alerts: AlertsService | null = null;
  const app = (baseUrl: string) =>
    createApp({
      db,
      mailer,
      storage,
      outbox: mail,
      outboxKey: TEST_OUTBOX_KEY,
      alerts: (alerts = createAlertsService({ db, mailer, appUrl: baseUrl })),
      config: {
        appUrl: baseUrl,
        allowedOrigins: [],
        secureCookies: false,
        rateLimitScale: 100,
        // the rate-limit counters live in the one test database: each test app counts its own
        rateLimitNamespace: `t-${randomBytes(6).toString('hex')}:`,
        logRequests: false,
        ...opts.config,
      },
    });
  // Listen first to learn the port, then mount the app that knows its own URL.
  const { createServer } = await import('node:http');
  let handler: ReturnType<typeof app> | null = null;
  const server: Server = createServer((req, res) => handler!(req, res));
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  handler = app(baseUrl);
  mailOf.set(baseUrl, mail);
  await startWorkers({ queue, smtp, alerts: alerts!, schedules: false });
  return {
    baseUrl,
    mail,
    db,
    pool,
    queue,
    alerts: alerts!,
    answers: handler.locals.answers as AnswerCache,
    async close() {
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
      mailOf.delete(baseUrl);
      await alerts!.idle();
      await queue.stop();
      await duringSchemaChange(pool, () => pool.query(`drop schema if exists ${queue.schema} cascade`)).catch(() => {});
      await mail.close();
      await closeStorage();
      await pool.end();
    },
  };
}

/** A tiny HTTP client with one cookie jar, sending the app's Origin like a browser would. */
export class Client {
  cookies = new Map<string, string>();
  lastSetCookie: string[] = [];
  constructor(
    readonly baseUrl: string,
    readonly origin: string | null = baseUrl,
  ) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}) {
    const h: Record<string, string> = { ...headers };
    if (this.origin) h.origin = this.origin;
    if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    let payload: string | undefined;
    if (body !== undefined) {
      payload = typeof body === 'string' ? body : JSON.stringify(body);
      h['content-type'] ??= 'application/json';
    }
    const res = await fetch(this.baseUrl + path, { method, headers: h, body: payload, redirect: 'manual' });
    this.lastSetCookie = res.headers.getSetCookie();
    for (const line of this.lastSetCookie) {
      const [pair] = line.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i);
      const value = pair.slice(i + 1);
      if (value === '' || /max-age=0/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    const text = await res.text();
    let json: any = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = null;
    }
    return { status: res.status, headers: res.headers, body: json, text };
  }
  get = (path: string) => this.request('GET', path);
  post = (path: string, body?: unknown) => this.request('POST', path, body ?? {});
  put = (path: string, body?: unknown) => this.request('PUT', path, body ?? {});
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body ?? {});
  delete = (path: string) => this.request('DELETE', path);
}

let counter = 0;
/** A unique e-mail address per call, so tests never collide in the shared test database. */
export function uniqueEmail(prefix = 'person') {
  counter += 1;
  return `${prefix}-${Date.now().toString(36)}-${process.pid}-${counter}@example.test`;
}

export const TEST_PASSWORD = 'correct-horse-battery';

/** Signs up a new person with their own winery (and follows the mailed link); returns the signed-in client. */
export async function signUp(baseUrl: string, opts: { name?: string; wineryName?: string; email?: string } = {}) {
  const client = new Client(baseUrl);
  const email = opts.email ?? uniqueEmail('owner');
  const mail = mailOf.get(baseUrl);
  if (!mail) throw new Error(`no test app listens at ${baseUrl}`);
  const before = mail.messages.length;
  const res = await client.post('/api/auth/sign-up', {
    name: opts.name ?? 'Test Owner',
    email,
    password: TEST_PASSWORD,
    wineryName: opts.wineryName ?? 'Test Winery',
  });
  if (res.status !== 202) throw new Error(`sign-up failed: ${res.status} ${res.text}`);
  const message = await mail.waitFor(email, { after: before, subject: /Confirm your Porewise account/, timeoutMs: 20_000 });
  const token = new URL(linkFrom(message.text, '/confirm-sign-up')).searchParams.get('token')!;
  const confirmed = await client.post('/api/auth/sign-up/confirm', { token });
  if (confirmed.status !== 201) throw new Error(`sign-up confirmation failed: ${confirmed.status} ${confirmed.text}`);
  const me = await client.get('/api/me');
  return { client, email, me: me.body as import('../../shared/types/api').MeDto };
}

/** Extracts the first link containing `path` from a mail body. */
export function linkFrom(text: string, path: string): string {
  const match = text.match(new RegExp(`https?://\\S*${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S*`));
  if (!match) throw new Error(`no ${path} link in mail: ${text}`);
  return match[0];
}

/** Invites `email` with `role` as the given owner and accepts as a new account; returns their client. */
export async function addMember(app: TestApp, owner: Client, role: import('../../shared/permissions').Role) {
  const email = uniqueEmail(role);
  const before = app.mail.messages.length;
  const inv = await owner.post('/api/team/invitations', { email, role });
  if (inv.status !== 201) throw new Error(`invite failed: ${inv.status} ${inv.text}`);
  const mail = await app.mail.waitFor(email, { after: before });
  const token = new URL(linkFrom(mail.text, '/invitation')).searchParams.get('token')!;
  const client = new Client(app.baseUrl);
  const acc = await client.post('/api/invitations/accept', { token, name: `Test ${role}`, password: TEST_PASSWORD });
  if (acc.status !== 200) throw new Error(`accept failed: ${acc.status} ${acc.text}`);
  const me = await client.get('/api/me');
  return { client, email, userId: me.body.user.id as string };
}

/**
 * Waits until the app's job queue has no job waiting, retrying or running: every mail enqueued
 * so far has reached the fake mail server (or failed for good). A test that checks that no
 * second mail went out calls this after `app.alerts.idle()` instead of sleeping a while.
 */
export async function jobsSettled(app: Pick<TestApp, 'pool' | 'queue'>, timeoutMs = 25_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const { rows } = await app.pool.query(`select count(*)::int as n from ${app.queue.schema}.job where state in ('created', 'retry', 'active')`);
    if (rows[0].n === 0) return;
    if (Date.now() > deadline) throw new Error(`timed out waiting for the job queue to settle (${rows[0].n} jobs left)`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
