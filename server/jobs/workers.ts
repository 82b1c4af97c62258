// The job workers: mail delivery with retries, the alert sweep, the daily stock check and the daily digest. They run in
// the web server by default (WORKERS=false turns them off) or alone with `npm run worker`.
import type PgBoss from 'pg-boss';
import { logger } from '../lib/logger';
import type { Mailer } from '../lib/mail';
import { ALERTS_DIGEST_QUEUE, ALERTS_STOCK_QUEUE, ALERTS_SWEEP_QUEUE, MAIL_QUEUE, type MailJob, type Queue } from '../lib/queue';
import type { AlertsService } from '../modules/alerts/alerts.service';

/** Every 10 minutes: conditions that come with time (a day drawing near) and a backstop for missed events (all rules but stock). */
export const SWEEP_CRON = '*/10 * * * *';
/** Every hour on the hour: each winery gets its digest in the hour that is 07:00 in its own time zone. */
export const DIGEST_CRON = '0 * * * *';
/**
 * Every hour on the hour: each winery gets its stock check once a day, in the hour that is
 * STOCK_CHECK_HOUR (06:00) in its own time zone (the hourly schedule is what lets each winery
 * have its own local hour; a winery is checked in one hour of the 24).
 */
export const STOCK_CRON = '0 * * * *';

export type WorkerDeps = { queue: Queue; smtp: Mailer; alerts: AlertsService; schedules?: boolean };

export async function startWorkers({ queue, smtp, alerts, schedules = true }: WorkerDeps) {
  const { boss } = queue;
  const polling = { pollingIntervalSeconds: queue.pollingIntervalSeconds };

  await boss.work<MailJob>(MAIL_QUEUE, { ...polling, batchSize: 1, includeMetadata: true }, async (jobs: PgBoss.JobWithMetadata<MailJob>[]) => {
    for (const job of jobs) {
      const { to, subject, text, html } = job.data;
      try {
        await smtp.send({ to, subject, text, ...(html ? { html } : {}) });
      } catch (error) {
        const message = error instanceof Error ? error.message : String(error);
        if (job.retryCount >= job.retryLimit) {
          // The last attempt: keep the message for the owners to see and resend.
          await alerts.keepMailFailure({
            wineryId: job.data.wineryId ?? null,
            jobId: job.id,
            to,
            subject,
            text,
            html: html ?? null,
            error: message.slice(0, 500),
            attempts: job.retryCount + 1,
          });
          logger.warn({ jobId: job.id, subject }, 'mail could not be delivered; kept for resending');
        }
        throw error;
      }
    }
  });
  await boss.work<{ nowMs?: number }>(ALERTS_SWEEP_QUEUE, polling, async ([job]) => {
    await alerts.sweep(job?.data?.nowMs ? new Date(job.data.nowMs) : new Date());
  });
  await boss.work<{ nowMs?: number; wineryId?: string }>(ALERTS_DIGEST_QUEUE, polling, async ([job]) => {
    await alerts.digest(job?.data?.nowMs ?? Date.now(), job?.data?.wineryId);
  });
  await boss.work<{ nowMs?: number; wineryId?: string }>(ALERTS_STOCK_QUEUE, polling, async ([job]) => {
    await alerts.stockCheck(job?.data?.nowMs ?? Date.now(), job?.data?.wineryId);
  });
  if (schedules) await registerSchedules(boss);
}

/** The recurring jobs: the alert sweep, the daily stock check and the digest (pg-boss keeps one schedule per queue). */
export async function registerSchedules(boss: PgBoss) {
  await boss.schedule(ALERTS_SWEEP_QUEUE, SWEEP_CRON, {});
  await boss.schedule(ALERTS_DIGEST_QUEUE, DIGEST_CRON, {}, { tz: 'UTC' });
  await boss.schedule(ALERTS_STOCK_QUEUE, STOCK_CRON, {}, { tz: 'UTC' });
}
