// `npm run worker`: the job workers alone (mail delivery, alert sweep, digest), without the web
// server, so a deployment can scale web and workers separately (run the web with WORKERS=false).
import { createDatabase } from './db/client';
import { runMigrations } from './db/migrate';
import { parseEnv } from './env';
import { startWorkers } from './jobs/workers';
import { startFakeSmtp } from './lib/fake-services';
import { logger } from './lib/logger';
import { createSmtpMailer } from './lib/mail';
import { createQueue, queuedMailer } from './lib/queue';
import { createAlertsService } from './modules/alerts/alerts.service';

const env = parseEnv();
const { db, pool } = createDatabase(env.DATABASE_URL);
await runMigrations(env.DATABASE_URL);
const fake = env.SMTP_HOST ? undefined : await startFakeSmtp();
if (fake) logger.warn('SMTP_HOST is not set: this worker delivers to a local fake SMTP server whose mail only it sees.');
const smtp = createSmtpMailer(
  fake
    ? { host: '127.0.0.1', port: fake.port, from: env.MAIL_FROM }
    : { host: env.SMTP_HOST!, port: env.SMTP_PORT, secure: env.SMTP_SECURE, user: env.SMTP_USER, password: env.SMTP_PASSWORD, from: env.MAIL_FROM },
);
const queue = await createQueue({
  connectionString: env.DATABASE_URL,
  schema: env.QUEUE_SCHEMA,
  mailRetryDelaySeconds: env.MAIL_RETRY_DELAY_SECONDS,
  mailRetryLimit: env.MAIL_RETRY_LIMIT,
  mailExpireSeconds: env.MAIL_EXPIRE_SECONDS,
  maintenanceIntervalSeconds: env.QUEUE_MAINTENANCE_SECONDS,
  pollingIntervalSeconds: env.QUEUE_POLL_SECONDS,
});
const alerts = createAlertsService({ db, mailer: queuedMailer(queue), appUrl: env.appUrl });
await startWorkers({ queue, smtp, alerts });
logger.info('Porewise workers are running');

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    Promise.allSettled([alerts.idle().then(() => queue.stop())])
      .then(() => Promise.allSettled([fake?.close(), pool.end()]))
      .then(() => process.exit(0));
  });
}
