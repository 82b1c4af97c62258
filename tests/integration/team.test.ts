// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roles, type Role } from '../../shared/permissions';
import { addMember, Client, linkFrom, signUp, startTestApp, TEST_PASSWORD, uniqueEmail, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app.close();
});

async function inviteToken(owner: Client, email: string, role: Role) {
  const before = app.mail.messages.length;
  const res = await owner.post('/api/team/invitations', { email, role });
  expect(res.status).toBe(201);
  const mail = await app.mail.waitFor(email, { after: before });
  return new URL(linkFrom(mail.text, '/invitation')).searchParams.get('token')!;
}

describe('invitations', () => {
  it('invites by e-mail; the invitee sets a name and password and joins with that role', async () => {
    const { client: owner, me } = await signUp(app.baseUrl, { wineryName: 'Invite Test Winery' });
    const email = uniqueEmail('tech');
    const token = await inviteToken(owner, email, 'technician');

    const preview = await new Client(app.baseUrl).post('/api/invitations/preview', { token });
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ wineryName: 'Invite Test Winery', role: 'technician', email, accountExists: false });

    const invitee = new Client(app.baseUrl);
    const missing = await invitee.post('/api/invitations/accept', { token });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty('password');

    const accepted = await invitee.post('/api/invitations/accept', { token, name: 'Tia Tech', password: TEST_PASSWORD });
    expect(accepted.status).toBe(200);
    const mine = await invitee.get('/api/me');
    expect(mine.body.memberships).toEqual([{ wineryId: me.activeWineryId, wineryName: 'Invite Test Winery', role: 'technician' }]);

    const team = await owner.get('/api/team');
    expect(team.body.members.map((m: { email: string }) => m.email)).toContain(email);
    expect(team.body.invitations).toEqual([]);

    const reused = await new Client(app.baseUrl).post('/api/invitations/accept', { token, name: 'Other', password: TEST_PASSWORD });
    expect(reused.status).toBe(410);
  });

  it('an existing account signs in first, then joins; the person can switch wineries', async () => {
    const { client: ownerA, me: meA } = await signUp(app.baseUrl, { wineryName: 'Winery A' });
    const { client: consultant, email, me: meB } = await signUp(app.baseUrl, { wineryName: 'Consultancy B' });
    const token = await inviteToken(ownerA, email, 'winemaker');

    const anon = await new Client(app.baseUrl).post('/api/invitations/accept', { token, name: 'X', password: TEST_PASSWORD });
    expect(anon.status).toBe(409);
    expect(anon.body.error.code).toBe('sign_in_required');

    const res = await consultant.post('/api/invitations/accept', { token });
    expect(res.status).toBe(200);
    // Accepting again is harmless (idempotent retry).
    expect((await consultant.post('/api/invitations/accept', { token })).status).toBe(200);

    const me = (await consultant.get('/api/me')).body;
    expect(me.activeWineryId).toBe(meA.activeWineryId);
    expect(me.memberships.map((m: { role: string }) => m.role).sort()).toEqual(['owner', 'winemaker']);

    const switched = await consultant.put('/api/me/active-winery', { wineryId: meB.activeWineryId });
    expect(switched.status).toBe(200);
    expect(switched.body.activeWineryId).toBe(meB.activeWineryId);
    const team = await consultant.get('/api/team');
    expect(team.body.members).toHaveLength(1);
  });

  it('refuses an invitation meant for someone else', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    const { client: other } = await signUp(app.baseUrl);
    const token = await inviteToken(owner, uniqueEmail('intended'), 'auditor');
    expect((await other.post('/api/invitations/accept', { token })).status).toBe(403);
  });

  it('re-inviting the same address renews the one pending invitation', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    const email = uniqueEmail('twice');
    const first = await inviteToken(owner, email, 'auditor');
    const second = await inviteToken(owner, email, 'winemaker');
    const team = (await owner.get('/api/team')).body;
    expect(team.invitations).toHaveLength(1);
    expect(team.invitations[0]).toMatchObject({ email, role: 'winemaker' });
    expect((await new Client(app.baseUrl).post('/api/invitations/preview', { token: first })).status).toBe(404);
    expect((await new Client(app.baseUrl).post('/api/invitations/preview', { token: second })).status).toBe(200);
  });

  it('refuses to invite someone who is already a member', async () => {
    const { client: owner, email } = await signUp(app.baseUrl);
    const res = await owner.post('/api/team/invitations', { email, role: 'auditor' });
    expect(res.status).toBe(409);
  });

  it('an owner revokes a pending invitation; its link then fails', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    const email = uniqueEmail('revoked');
    const token = await inviteToken(owner, email, 'auditor');
    const id = (await owner.get('/api/team')).body.invitations[0].id;
    expect((await owner.delete(`/api/team/invitations/${id}`)).status).toBe(204);
    expect((await new Client(app.baseUrl).post('/api/invitations/accept', { token, name: 'N', password: TEST_PASSWORD })).status).toBe(404);
  });

  it('validates the invitation body', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    const res = await owner.post('/api/team/invitations', { email: 'nope', role: 'boss' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'role']);
  });
});

describe('roles and the last owner', () => {
  it('the owner changes a role and removes a member', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    const member = await addMember(app, owner, 'technician');
    const changed = await owner.patch(`/api/team/${member.userId}`, { role: 'cellar-master' });
    expect(changed.status).toBe(200);
    expect(changed.body.members.find((m: { userId: string }) => m.userId === member.userId).role).toBe('cellar-master');
    expect((await owner.delete(`/api/team/${member.userId}`)).status).toBe(204);
    expect((await member.client.get('/api/team')).status).toBe(403);
  });

  it('never removes or demotes the last owner', async () => {
    const { client: owner, me } = await signUp(app.baseUrl);
    const demote = await owner.patch(`/api/team/${me.user.id}`, { role: 'auditor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    expect((await owner.delete(`/api/team/${me.user.id}`)).status).toBe(409);
    // With a second owner, the first may step down.
    const second = await addMember(app, owner, 'owner');
    expect((await owner.patch(`/api/team/${me.user.id}`, { role: 'cellar-master' })).status).toBe(200);
    expect((await second.client.get('/api/team')).body.members).toHaveLength(2);
  });
});

describe('each role against each team action', () => {
  const actions = [
    { name: 'read the team', allowed: roles, run: (c: Client) => c.get('/api/team'), ok: 200 },
    { name: 'invite', allowed: ['owner'], run: (c: Client) => c.post('/api/team/invitations', { email: uniqueEmail('x'), role: 'auditor' }), ok: 201 },
    { name: 'change a role', allowed: ['owner'], run: (c: Client, target: string) => c.patch(`/api/team/${target}`, { role: 'winemaker' }), ok: 200 },
    { name: 'remove a member', allowed: ['owner'], run: (c: Client, target: string) => c.delete(`/api/team/${target}`), ok: 204 },
  ] as const;

  for (const role of roles) {
    describe(role, () => {
      let actor: Client;
      let owner: Client;
      beforeAll(async () => {
        const signedUp = await signUp(app.baseUrl);
        owner = signedUp.client;
        actor = role === 'owner' ? owner : (await addMember(app, owner, role)).client;
      });
      for (const action of actions) {
        const allowed = (action.allowed as readonly Role[]).includes(role);
        it(`${allowed ? 'may' : 'may not'} ${action.name}`, async () => {
          const target = await addMember(app, owner, 'auditor');
          const res = await action.run(actor, target.userId);
          expect(res.status).toBe(allowed ? action.ok : 403);
        });
      }
    });
  }
});

describe('wineries never see each other', () => {
  it('a member of winery B gets 404 for winery A records', async () => {
    const { client: ownerA, me: meA } = await signUp(app.baseUrl, { wineryName: 'Alpha' });
    const { client: ownerB } = await signUp(app.baseUrl, { wineryName: 'Beta' });
    const memberA = await addMember(app, ownerA, 'technician');
    await ownerA.post('/api/team/invitations', { email: uniqueEmail('pending'), role: 'auditor' });
    const invitationA = (await ownerA.get('/api/team')).body.invitations[0].id;

    expect((await ownerB.patch(`/api/team/${memberA.userId}`, { role: 'owner' })).status).toBe(404);
    expect((await ownerB.delete(`/api/team/${memberA.userId}`)).status).toBe(404);
    expect((await ownerB.delete(`/api/team/invitations/${invitationA}`)).status).toBe(404);
    expect((await ownerB.put('/api/me/active-winery', { wineryId: meA.activeWineryId })).status).toBe(404);
    const teamB = (await ownerB.get('/api/team')).body;
    expect(teamB.members.map((m: { userId: string }) => m.userId)).not.toContain(memberA.userId);
    expect(teamB.invitations).toEqual([]);

    // Same answer as for an id that does not exist anywhere.
    const ghost = await ownerB.delete('/api/team/invitations/00000000-0000-4000-8000-000000000000');
    const real = await ownerB.delete(`/api/team/invitations/${invitationA}`);
    expect(real.body).toEqual(ghost.body);
    // And A's member is untouched.
    expect((await ownerA.get('/api/team')).body.members.find((m: { userId: string }) => m.userId === memberA.userId).role).toBe('technician');
  });
});
