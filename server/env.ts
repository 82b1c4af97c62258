import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0'])
  .transform((v) => v === 'true' || v === '1')
  .optional();

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().url(),
  APP_URL: z.string().url().optional(),
  ALLOWED_ORIGINS: z.string().optional(),
  SECURE_COOKIES: bool,
  RATE_LIMIT_SCALE: z.coerce.number().positive().default(1),
  /** Memory for read answers kept in this process (server/middleware/answer-cache.ts); 0 keeps none. */
  ANSWER_CACHE_MB: z.coerce.number().min(0).max(4096).default(32),
  /** Express "trust proxy" setting when behind a reverse proxy (e.g. 1, or loopback). */
  TRUST_PROXY: z.string().optional(),
  /** Allow the development mail outbox on a non-loopback address (never in production). */
  DEV_MAIL_OUTBOX: bool,
  /** Secret that opens the development outbox without signing in; generated per start when unset. */
  DEV_OUTBOX_KEY: z.string().min(16).optional(),
  SMTP_HOST: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().positive().default(587),
  SMTP_SECURE: bool,
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Porewise <no-reply@porewise.test>'),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().default('porewise-attachments'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  FAKE_SERVICES_DIR: z.string().default('.data'),
  CLIENT_DIR: z.string().default('dist/client'),
  /** Run the job workers (mail, alert sweep, digest) in this process; false for a web-only process. */
  WORKERS: bool,
  /** The PostgreSQL schema of the job queue. */
  QUEUE_SCHEMA: z.string().regex(/^[a-z_][a-z0-9_]{0,62}$/).default('pgboss'),
  MAIL_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  MAIL_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(6),
  QUEUE_POLL_SECONDS: z.coerce.number().min(0.5).max(60).default(2),
  /** A mail job a stopped process left half-done is given back to the queue after this long. */
  MAIL_EXPIRE_SECONDS: z.coerce.number().int().min(1).max(3600).default(120),
  /** How often the queue's upkeep runs (expired jobs back to the queue, old ones archived). */
  QUEUE_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(3600).default(120),
  /** Connections this process's app pool may open (the job queue keeps 4 more of its own). */
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(500).default(10),
  /**
   * On SIGTERM, how long /api/health/ready answers 503 while the server still serves, so a load
   * balancer stops sending new requests before the listener closes (0 locally).
   */
  SHUTDOWN_DRAIN_MS: z.coerce.number().int().min(0).max(300_000).default(0),
  /** Then how long requests in flight get to finish before their connections are cut. */
  SHUTDOWN_GRACE_MS: z.coerce.number().int().min(0).max(300_000).default(10_000),
});

export type Env = z.infer<typeof envSchema> & { appUrl: string; secureCookies: boolean; allowedOrigins: string[]; loopbackOnly: boolean };

/** Parses process.env once, with clear messages for anything missing or malformed. */
export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const env = result.data;
  const appUrl = (env.APP_URL ?? `http://127.0.0.1:${env.PORT}`).replace(/\/$/, '');
  const host = new URL(appUrl).hostname;
  const local = host === '127.0.0.1' || host === 'localhost' || host === '::1';
  if (env.NODE_ENV === 'production' && !env.SMTP_HOST) throw new Error('SMTP_HOST is required in production.');
  if (env.NODE_ENV === 'production' && !env.S3_ENDPOINT && env.S3_ACCESS_KEY_ID === 'S3RVER') {
    throw new Error('S3 settings (S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY) are required in production.');
  }
  const allowedOrigins = (env.ALLOWED_ORIGINS ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  if (local) allowedOrigins.push(appUrl.replace('127.0.0.1', 'localhost'), appUrl.replace('localhost', '127.0.0.1'));
  const loopbackOnly = local && ['127.0.0.1', 'localhost', '::1'].includes(env.HOST);
  return { ...env, appUrl, secureCookies: env.SECURE_COOKIES ?? !local, allowedOrigins, loopbackOnly };
}
