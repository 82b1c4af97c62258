// @vitest-environment node
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionsTable, usersTable } from '../../server/db/schema';
import { Client, linkFrom, signUp, startTestApp, TEST_PASSWORD, uniqueEmail, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app.close();
});

/** Follows the link of the sign-up mail to `email`; returns the confirmation's answer. */
async function confirmFromMail(client: Client, email: string, on: TestApp = app) {
  const mail = await on.mail.waitFor(email, { subject: /Confirm your Porewise account/, timeoutMs: 20_000 });
  const token = new URL(linkFrom(mail.text, '/confirm-sign-up')).searchParams.get('token')!;
  return client.post('/api/auth/sign-up/confirm', { token });
}

describe('health', () => {
  it('reports the database', async () => {
    const res = await new Client(app.baseUrl).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, db: true });
  });
});

describe('sign-up, sign-in, sign-out', () => {
  it('signs up as owner of a new winery and sets an HttpOnly, SameSite=Lax session cookie', async () => {
    const client = new Client(app.baseUrl);
    const email = uniqueEmail();
    const asked = await client.post('/api/auth/sign-up', { name: 'Ada Field', email, password: TEST_PASSWORD, wineryName: 'Hillcrest Test' });
    expect(asked.status).toBe(202);
    expect(client.cookies.has('porewise_session')).toBe(false); // nothing exists until the mailed link is opened
    const res = await confirmFromMail(client, email);
    expect(res.status).toBe(201);
    const cookie = client.lastSetCookie.find((c) => c.startsWith('porewise_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // loopback over plain HTTP
    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ name: 'Ada Field', email, units: 'metric' });
    expect(me.body.memberships).toEqual([{ wineryId: me.body.activeWineryId, wineryName: 'Hillcrest Test', role: 'owner' }]);
  });

  it('marks the cookie Secure when the app runs behind HTTPS', async () => {
    const secureApp = await startTestApp({ config: { secureCookies: true } });
    try {
      const client = new Client(secureApp.baseUrl);
      const email = uniqueEmail();
      await client.post('/api/auth/sign-up', { name: 'Sec', email, password: TEST_PASSWORD, wineryName: 'W' });
      await confirmFromMail(client, email, secureApp);
      expect(client.lastSetCookie.find((c) => c.startsWith('porewise_session='))).toMatch(/Secure/);
    } finally {
      await secureApp.close();
    }
  });

  // Finding 7 of the hardening issue: sign-up answered 409 email_taken, which told anyone which
  // addresses have accounts. Now a taken address gets the same answer, and its owner a mail.
  it('answers a taken address exactly like a new one, creates no second account, and mails the owner', async () => {
    const { email } = await signUp(app.baseUrl);
    const before = app.mail.messages.length;
    const taken = await new Client(app.baseUrl).post('/api/auth/sign-up', { name: 'X', email: email.toUpperCase(), password: TEST_PASSWORD, wineryName: 'W' });
    const fresh = await new Client(app.baseUrl).post('/api/auth/sign-up', { name: 'X', email: uniqueEmail(), password: TEST_PASSWORD, wineryName: 'W' });
    expect(taken.status).toBe(202);
    expect(taken.status).toBe(fresh.status);
    expect(taken.body).toEqual(fresh.body);
    expect(taken.headers.get('set-cookie')).toBe(fresh.headers.get('set-cookie'));
    const note = await app.mail.waitFor(email, { after: before, subject: /tried to create/ });
    expect(note.text).toMatch(/already has one/);
    expect(note.text).not.toMatch(/confirm-sign-up/);
    const users = await app.db.select().from(usersTable).where(eq(usersTable.email, email));
    expect(users).toHaveLength(1);
  });

  it('a sign-up link works once; the second use is 410', async () => {
    const client = new Client(app.baseUrl);
    const email = uniqueEmail();
    await client.post('/api/auth/sign-up', { name: 'Once', email, password: TEST_PASSWORD, wineryName: 'W' });
    const mail = await app.mail.waitFor(email, { subject: /Confirm/, timeoutMs: 20_000 });
    const token = new URL(linkFrom(mail.text, '/confirm-sign-up')).searchParams.get('token')!;
    expect((await client.post('/api/auth/sign-up/confirm', { token })).status).toBe(201);
    expect((await new Client(app.baseUrl).post('/api/auth/sign-up/confirm', { token })).status).toBe(410);
    expect((await new Client(app.baseUrl).post('/api/auth/sign-up/confirm', { token: 'x'.repeat(40) })).status).toBe(410);
  });

  it('gives the same 401 for a wrong password and an unknown e-mail', async () => {
    const { email } = await signUp(app.baseUrl);
    const wrong = await new Client(app.baseUrl).post('/api/auth/sign-in', { email, password: 'not-the-password' });
    const unknown = await new Client(app.baseUrl).post('/api/auth/sign-in', { email: uniqueEmail(), password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('signs in and out; the old session no longer works after sign-out', async () => {
    const { email } = await signUp(app.baseUrl);
    const client = new Client(app.baseUrl);
    expect((await client.post('/api/auth/sign-in', { email, password: TEST_PASSWORD })).status).toBe(200);
    const stolen = client.cookies.get('porewise_session')!;
    expect((await client.get('/api/me')).status).toBe(200);
    expect((await client.post('/api/auth/sign-out')).status).toBe(204);
    expect((await client.get('/api/me')).status).toBe(401);
    const replay = new Client(app.baseUrl);
    replay.cookies.set('porewise_session', stolen);
    expect((await replay.get('/api/me')).status).toBe(401);
  });

  it('rejects an expired session', async () => {
    const { client, me } = await signUp(app.baseUrl);
    await app.db.update(sessionsTable).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(sessionsTable.userId, me.user.id));
    const res = await client.get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('stores the password as an Argon2id hash', async () => {
    const { me } = await signUp(app.baseUrl);
    const [row] = await app.db.select().from(usersTable).where(eq(usersTable.id, me.user.id));
    expect(row.passwordHash).toMatch(/^\$argon2id\$/);
  });
});

describe('/api/me', () => {
  it('changes name and units', async () => {
    const { client } = await signUp(app.baseUrl);
    const res = await client.put('/api/me', { units: 'us', name: 'Renamed' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ units: 'us', name: 'Renamed' });
    expect((await client.get('/api/me')).body.user.units).toBe('us');
  });

  it('rejects unknown units with a field message', async () => {
    const { client } = await signUp(app.baseUrl);
    const res = await client.put('/api/me', { units: 'imperial' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.units).toMatch(/metric or US/);
  });

  it('needs a session', async () => {
    expect((await new Client(app.baseUrl).get('/api/me')).status).toBe(401);
  });
});

describe('password reset', () => {
  it('mails a single-use link that sets a new password and ends other sessions', async () => {
    const { client: oldSession, email } = await signUp(app.baseUrl);
    const before = app.mail.messages.length;
    const anon = new Client(app.baseUrl);
    expect((await anon.post('/api/auth/password-reset/request', { email })).status).toBe(202);
    const mail = await app.mail.waitFor(email, { subject: /reset/i, after: before });
    const token = new URL(linkFrom(mail.text, '/reset-password')).searchParams.get('token')!;

    const confirm = await anon.post('/api/auth/password-reset/confirm', { token, password: 'a-brand-new-password' });
    expect(confirm.status).toBe(200);
    expect((await anon.get('/api/me')).status).toBe(200);
    expect((await oldSession.get('/api/me')).status).toBe(401);

    const again = await new Client(app.baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'another-new-password' });
    expect(again.status).toBe(410);
    expect((await new Client(app.baseUrl).post('/api/auth/sign-in', { email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await new Client(app.baseUrl).post('/api/auth/sign-in', { email, password: 'a-brand-new-password' })).status).toBe(200);
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    const email = uniqueEmail('nobody');
    const res = await new Client(app.baseUrl).post('/api/auth/password-reset/request', { email });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 100));
    expect(app.mail.messages.some((m) => m.to.includes(email))).toBe(false);
  });

  it('refuses an expired link', async () => {
    const { email } = await signUp(app.baseUrl);
    const before = app.mail.messages.length;
    await new Client(app.baseUrl).post('/api/auth/password-reset/request', { email });
    const mail = await app.mail.waitFor(email, { after: before });
    const token = new URL(linkFrom(mail.text, '/reset-password')).searchParams.get('token')!;
    const { passwordResetsTable } = await import('../../server/db/schema');
    const { hashToken } = await import('../../server/lib/tokens');
    await app.db.update(passwordResetsTable).set({ expiresAt: new Date(Date.now() - 1) }).where(eq(passwordResetsTable.tokenHash, await hashToken(token)));
    const res = await new Client(app.baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'a-brand-new-password' });
    expect(res.status).toBe(410);
  });

  it('stores only a hash of the token', async () => {
    const { email, me } = await signUp(app.baseUrl);
    const before = app.mail.messages.length;
    await new Client(app.baseUrl).post('/api/auth/password-reset/request', { email });
    const mail = await app.mail.waitFor(email, { after: before });
    const token = new URL(linkFrom(mail.text, '/reset-password')).searchParams.get('token')!;
    const { passwordResetsTable } = await import('../../server/db/schema');
    const rows = await app.db.select().from(passwordResetsTable).where(eq(passwordResetsTable.userId, me.user.id));
    expect(rows).toHaveLength(1);
    expect(rows[0].tokenHash).not.toBe(token);
    expect(rows[0].tokenHash).toMatch(/^[0-9a-f]{64}$/);
  });
});

describe('password reset links', () => {
  it('using one link ends the other open links of the same person', async () => {
    const { email } = await signUp(app.baseUrl);
    const tokens: string[] = [];
    for (let i = 0; i < 2; i += 1) {
      const before = app.mail.messages.length;
      await new Client(app.baseUrl).post('/api/auth/password-reset/request', { email });
      const mail = await app.mail.waitFor(email, { after: before });
      tokens.push(new URL(linkFrom(mail.text, '/reset-password')).searchParams.get('token')!);
    }
    expect((await new Client(app.baseUrl).post('/api/auth/password-reset/confirm', { token: tokens[1], password: 'first-new-password' })).status).toBe(200);
    expect((await new Client(app.baseUrl).post('/api/auth/password-reset/confirm', { token: tokens[0], password: 'second-new-password' })).status).toBe(410);
  });
});
