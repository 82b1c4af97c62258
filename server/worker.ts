// `npm run worker`: the job workers alone (mail delivery, alert sweep, digest), without the web
// server, so a deployment can scale web and workers separately (run the web with WORKERS=false).
import { createDatabase } from './db/client';
import { runMigrations } from './db/migrate';
import { parseEnv } from './env';
import { startWorkers } from './jobs/workers';
import { startFakeSmtp } from './lib/fake-services';
import { logger } from './lib/logger';
import { createSmtpMailer, smtpSettingsFrom } from './lib/mail';
import { createQueue, queueOptionsFrom, queuedMailer } from './lib/queue';
import { createAlertsService } from './modules/alerts/alerts.service';

const env = parseEnv();
const { db, pool } = createDatabase(env.DATABASE_URL);
await runMigrations(env.DATABASE_URL);
const fake = env.SMTP_HOST ? undefined : await startFakeSmtp();
if (fake) logger.warn('SMTP_HOST is not set: this worker delivers to a local fake SMTP server whose mail only it sees.');
const smtp = createSmtpMailer(smtpSettingsFrom(env, fake?.port));
const queue = await createQueue(queueOptionsFrom(env));
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
