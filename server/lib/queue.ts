// The durable job queue: pg-boss in the same PostgreSQL (its own schema). Mail is a job enqueued
// in the transaction of the change that causes it, so a crash loses neither the change nor the mail.
import PgBoss from 'pg-boss';
import { driverClientOf, type DbOrTx } from '../db/client';
import type { Env } from '../env';
import { logger } from './logger';
import type { MailMessage, Mailer } from './mail';

export const MAIL_QUEUE = 'mail';
export const ALERTS_SWEEP_QUEUE = 'alerts-sweep';
export const ALERTS_DIGEST_QUEUE = 'alerts-digest';
/** The daily stock check of each winery (at its local STOCK_CHECK_HOUR). */
export const ALERTS_STOCK_QUEUE = 'alerts-stock';
export const QUEUES = [MAIL_QUEUE, ALERTS_SWEEP_QUEUE, ALERTS_DIGEST_QUEUE, ALERTS_STOCK_QUEUE] as const;

/** A mail job: the message and the winery it belongs to (for the owners' list of failures). */
export type MailJob = MailMessage & { wineryId?: string | null; failureId?: string };

export type QueueOptions = {
  connectionString: string;
  /** The PostgreSQL schema pg-boss owns (tests use one per app). */
  schema?: string;
  /** Seconds before the first retry of a mail; doubles each time (exponential back-off, with jitter). */
  mailRetryDelaySeconds?: number;
  /** Retries after the first attempt. */
  mailRetryLimit?: number;
  /** Seconds before a mail job left active by a stopped process goes back to the queue (default 120). */
  mailExpireSeconds?: number;
  /** Seconds between the queue's upkeep runs, which return expired jobs (default 120). */
  maintenanceIntervalSeconds?: number;
  /** Seconds between polls for new jobs. */
  pollingIntervalSeconds?: number;
  /** False for a web-only process: it enqueues, and leaves upkeep and schedules to the workers. */
  workers?: boolean;
};

export const DEFAULT_MAIL_RETRY_DELAY_SECONDS = 30;
export const DEFAULT_MAIL_RETRY_LIMIT = 6;

/** The queue's options from the environment (the web server and `npm run worker` alike). */
export function queueOptionsFrom(env: Env, workers?: boolean): QueueOptions {
  return {
    connectionString: env.DATABASE_URL,
    schema: env.QUEUE_SCHEMA,
    mailRetryDelaySeconds: env.MAIL_RETRY_DELAY_SECONDS,
    mailRetryLimit: env.MAIL_RETRY_LIMIT,
    mailExpireSeconds: env.MAIL_EXPIRE_SECONDS,
    maintenanceIntervalSeconds: env.QUEUE_MAINTENANCE_SECONDS,
    pollingIntervalSeconds: env.QUEUE_POLL_SECONDS,
    workers,
  };
}

/** pg-boss's "db" option: its SQL run on the caller's connection, so it joins the caller's transaction. */
function executorOf(db: DbOrTx) {
  const client = driverClientOf(db);
  return { executeSql: (text: string, values?: unknown[]) => client.query({ text, values }) };
}

export type Queue = Awaited<ReturnType<typeof createQueue>>;

/** Starts pg-boss (creating its schema and the queues when missing). */
export async function createQueue(opts: QueueOptions) {
  const schema = opts.schema ?? 'pgboss';
  const workers = opts.workers ?? true;
  const boss = new PgBoss({
    connectionString: opts.connectionString,
    schema,
    max: 4,
    supervise: workers,
    schedule: workers,
    maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds ?? 120,
  });
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
  await boss.start();
  const retryDelay = opts.mailRetryDelaySeconds ?? DEFAULT_MAIL_RETRY_DELAY_SECONDS;
  const retryLimit = opts.mailRetryLimit ?? DEFAULT_MAIL_RETRY_LIMIT;
  for (const name of QUEUES) {
    if (!(await boss.getQueue(name))) {
      await boss.createQueue(name, name === MAIL_QUEUE ? { name, retryLimit, retryDelay, retryBackoff: true, expireInSeconds: opts.mailExpireSeconds ?? 120 } : { name, retryLimit: 2, retryDelay: 30 });
    }
  }
  let stopped = false;
  return {
    boss,
    schema,
    pollingIntervalSeconds: opts.pollingIntervalSeconds ?? 2,
    /** Enqueues a mail; with `db` a transaction, the job exists only if that transaction commits. */
    async enqueueMail(job: MailJob, db?: DbOrTx) {
      await boss.send(MAIL_QUEUE, job, { retryLimit, retryDelay, retryBackoff: true, ...(db ? { db: executorOf(db) } : {}) });
    },
    /** Any other job, optionally in the caller's transaction. */
    async enqueue(name: (typeof QUEUES)[number], data: object, options: { db?: DbOrTx; singletonKey?: string } = {}) {
      await boss.send(name, data, { singletonKey: options.singletonKey, ...(options.db ? { db: executorOf(options.db) } : {}) });
    },
    async stop() {
      if (stopped) return;
      stopped = true;
      await boss.stop({ graceful: true, timeout: 5000, wait: true });
    },
  };
}

/** A Mailer whose send() enqueues: pass the transaction in `opts.db` to send with the change. */
export function queuedMailer(queue: Pick<Queue, 'enqueueMail'>): Mailer {
  return {
    async send(message, opts) {
      await queue.enqueueMail({ ...message, wineryId: opts?.wineryId ?? null }, opts?.db);
    },
  };
}
