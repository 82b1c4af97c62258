// @vitest-environment node
// Fault: the real server process is killed (SIGKILL) after it answered a password reset and
// before the mail was delivered; started again, it delivers the mail, once.
import type { ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { databaseUrl } from '../../scripts/lib/postgres';
import { startFakeSmtp } from '../../server/lib/fake-services';
import { freePort, spawnServer } from '../support/server-process';
import { Client, signUp, startTestApp } from '../support/test-app';

const schema = `pgboss_crash_${randomBytes(5).toString('hex')}`;
const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-crash-'));
const children: ChildProcess[] = [];

/** Starts `server/index.ts` as its own process; resolves once it answers /api/health. */
async function startServerProcess(port: number, smtpPort: number) {
  const started = await spawnServer({
    port,
    dir,
    startMs: 60_000,
    env: {
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(smtpPort),
      QUEUE_SCHEMA: schema,
      MAIL_RETRY_DELAY_SECONDS: '1',
      // The first process may have taken the job before it was killed: it comes back after this.
      MAIL_EXPIRE_SECONDS: '5',
      QUEUE_MAINTENANCE_SECONDS: '1',
      RATE_LIMIT_SCALE: '100',
    },
  });
  children.push(started.child);
  return started;
}

afterAll(async () => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
  const pool = new pg.Pool({ connectionString: databaseUrl('porewise_test'), max: 1 });
  await pool.query(`drop schema if exists ${schema} cascade`).catch(() => {});
  await pool.end();
  rmSync(dir, { recursive: true, force: true });
});

describe('a server killed between the request and the delivery', () => {
  it('delivers the password reset mail once after it starts again', async () => {
    const smtp = await startFakeSmtp();
    // A port with nothing listening: the first server cannot deliver before it is killed.
    const deadSmtpPort = await freePort();
    try {
      // The account is made through an in-process test app (sign-up confirms by mail, which the
      // first server here cannot deliver); both use the same test database.
      const helper = await startTestApp();
      const { email } = await signUp(helper.baseUrl, { wineryName: 'Crash Test Winery' });
      await helper.close();
      const first = await startServerProcess(await freePort(), deadSmtpPort);
      const res = await new Client(first.url).post('/api/auth/password-reset/request', { email });
      expect(res.status).toBeLessThan(300);
      first.child.kill('SIGKILL');
      await new Promise((r) => first.child.once('exit', r));
      expect(smtp.messages).toHaveLength(0);

      const second = await startServerProcess(await freePort(), smtp.port);
      const mail = await smtp.waitFor(email, { subject: /Reset your Porewise password/, timeoutMs: 30_000 }).catch(async (error: Error) => {
        const pool = new pg.Pool({ connectionString: databaseUrl('porewise_test'), max: 1 });
        const { rows } = await pool.query(`select state, retry_count, start_after, started_on, output from ${schema}.job where name = 'mail'`);
        await pool.end();
        throw new Error(`${error.message}; jobs: ${JSON.stringify(rows)}`);
      });
      expect(mail.text).toMatch(/reset-password\?token=/);
      await new Promise((r) => setTimeout(r, 2000));
      expect(smtp.messages.filter((m) => m.to.includes(email))).toHaveLength(1);
      second.child.kill('SIGTERM');
      await new Promise((r) => second.child.once('exit', r));
    } finally {
      await smtp.close();
    }
  }, 120_000);
});
