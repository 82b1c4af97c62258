import { describe, expect, it } from 'vitest';
import { parseEnv } from './env';

const base = { DATABASE_URL: 'postgres://postgres@127.0.0.1:5432/x' };

describe('parseEnv', () => {
  it('a loopback server is loopback-only, with both local spellings allowed as origins', () => {
    const env = parseEnv({ ...base, PORT: '3100' });
    expect(env.appUrl).toBe('http://127.0.0.1:3100');
    expect(env.loopbackOnly).toBe(true);
    expect(env.secureCookies).toBe(false);
    expect(env.allowedOrigins).toContain('http://localhost:3100');
  });

  it('listening on every interface is not loopback-only (the mail outbox then needs SMTP_HOST or an explicit opt-in)', () => {
    expect(parseEnv({ ...base, HOST: '0.0.0.0' }).loopbackOnly).toBe(false);
  });

  it('a public APP_URL means Secure cookies', () => {
    const env = parseEnv({ ...base, APP_URL: 'https://cellar.example.com', HOST: '0.0.0.0' });
    expect(env.secureCookies).toBe(true);
    expect(env.loopbackOnly).toBe(false);
  });

  it('production requires a mail relay', () => {
    expect(() => parseEnv({ ...base, NODE_ENV: 'production' })).toThrow(/SMTP_HOST/);
  });

  it('explains a missing database URL', () => {
    expect(() => parseEnv({})).toThrow(/DATABASE_URL/);
  });
});
