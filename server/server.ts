import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { join, resolve } from 'node:path';
import { createApp } from './app';
import { createDatabase } from './db/client';
import type { Env } from './env';
import { startFakeS3, startFakeSmtp, type FakeS3, type FakeSmtp } from './lib/fake-services';
import { logger } from './lib/logger';
import { FOLD_EVERY_MS, foldWineryChanges } from './db/winery-changes';
import { startWorkers } from './jobs/workers';
import { createSmtpMailer, smtpSettingsFrom } from './lib/mail';
import { createQueue, queueOptionsFrom, queuedMailer } from './lib/queue';
import { createAlertsService } from './modules/alerts/alerts.service';
import { createS3Storage } from './lib/storage';

/**
 * Assembles the running server from the environment: database pool, mail (real SMTP, or the
 * local fake when SMTP_HOST is unset), object storage (S3, or the local fake when S3_ENDPOINT is
 * unset), then listens. Returns the URL and a close() for graceful shutdown.
 */
export async function startServer(env: Env) {
  const { db, pool } = createDatabase(env.DATABASE_URL, { max: env.DATABASE_POOL_MAX });
  // Set when shutting down: readiness answers 503 so a load balancer drains this instance.
  const lifecycle = { draining: false };
  let fakeSmtp: FakeSmtp | undefined;
  let fakeS3: FakeS3 | undefined;

  if (!env.SMTP_HOST) {
    // The outbox shows every message, reset links included: only on a machine nobody else can reach.
    if (!env.loopbackOnly && !env.DEV_MAIL_OUTBOX) {
      throw new Error('SMTP_HOST is not set and the server is reachable beyond this machine: set SMTP_HOST (or DEV_MAIL_OUTBOX=true for a trusted test network).');
    }
    fakeSmtp = await startFakeSmtp();
  }
  const smtp = createSmtpMailer(smtpSettingsFrom(env, fakeSmtp?.port));

  // The development outbox opens without signing in only with this key (printed by `npm start`).
  const outboxKey = fakeSmtp ? (env.DEV_OUTBOX_KEY ?? randomBytes(18).toString('base64url')) : undefined;
  // Mail goes through the job queue: the app enqueues, the workers deliver over SMTP with retries.
  const workers = env.WORKERS ?? true;
  const queue = await createQueue(queueOptionsFrom(env, workers));
  const mailer = queuedMailer(queue);
  const alerts = createAlertsService({ db, mailer, appUrl: env.appUrl });
  if (workers) await startWorkers({ queue, smtp, alerts });

  if (!env.S3_ENDPOINT) fakeS3 = await startFakeS3({ directory: join(resolve(env.FAKE_SERVICES_DIR), 's3') });
  const storage = createS3Storage({
    endpoint: fakeS3?.endpoint ?? env.S3_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
  });
  await storage.ensureBucket();

  const app = createApp({
    db,
    mailer,
    storage,
    outbox: fakeSmtp,
    outboxKey,
    alerts,
    lifecycle,
    config: {
      appUrl: env.appUrl,
      allowedOrigins: env.allowedOrigins,
      secureCookies: env.secureCookies,
      rateLimitScale: env.RATE_LIMIT_SCALE,
      answerCacheBytes: env.ANSWER_CACHE_MB * 1024 * 1024,
      trustProxy: env.TRUST_PROXY,
      clientDir: resolve(env.CLIENT_DIR),
      logRequests: env.NODE_ENV !== 'test',
    },
  });

  const server = app.listen(env.PORT, env.HOST);
  await new Promise<void>((resolveListen, reject) => {
    server.once('listening', resolveListen);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${env.HOST}:${port}`;

  /**
   * Graceful shutdown: readiness turns 503 at once and the server keeps serving for
   * SHUTDOWN_DRAIN_MS (the load balancer's time to notice); then the listener closes, idle
   * keep-alive connections are dropped, requests in flight get SHUTDOWN_GRACE_MS to finish,
   * and whatever is left is cut. Then the workers, the queue and the pool stop.
   */
  // The data versions' rows folded into their counts now and then (server/db/winery-changes.ts).
  const folding = setInterval(() => {
    foldWineryChanges(db).catch((error: unknown) => logger.warn({ err: error }, 'folding the winery data versions failed; tried again later'));
  }, FOLD_EVERY_MS);
  folding.unref();

  async function close() {
    clearInterval(folding);
    lifecycle.draining = true;
    if (env.SHUTDOWN_DRAIN_MS > 0) await new Promise((r) => setTimeout(r, env.SHUTDOWN_DRAIN_MS));
    await new Promise<void>((r) => {
      const cut = setTimeout(() => server.closeAllConnections(), env.SHUTDOWN_GRACE_MS);
      server.close(() => {
        clearTimeout(cut);
        r();
      });
      server.closeIdleConnections();
    });
    await alerts.idle();
    await queue.stop();
    await Promise.allSettled([fakeSmtp?.close(), fakeS3?.close(), pool.end()]);
  }
  logger.debug({ url, workers }, 'listening');
  return { url, port, close, fakeSmtp, outboxKey };
}
