// @vitest-environment node
// Sessions asked for in the same round of the event loop are looked up in one query
// (server/lib/auth.ts): many people at once must each still get themselves, their own role and
// winery, and a session ended in between must not be served from a neighbour's lookup.
import { describe, expect, it } from 'vitest';
import { MEMBER_ROLES, setupApiApp } from '../support/api-app';
import { Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Session Lookup Winery', otherWineryName: 'Session Lookup Neighbour', members: true });

describe('session lookups taken together', () => {
  it('each of many concurrent requests answers as its own person, role and winery', async () => {
    const people = [
      { client: app.owner, role: 'owner', winery: app.wineryId },
      { client: app.other, role: 'owner', winery: app.otherWineryId },
      ...MEMBER_ROLES.map((role) => ({ client: app.members[role], role, winery: app.wineryId })),
    ];
    const asked = Array.from({ length: 8 }, () => people).flat();
    const answers = await Promise.all(asked.map((p) => p.client.get('/api/me')));
    answers.forEach((res, i) => {
      expect(res.status).toBe(200);
      const me = res.body as { user: { email: string }; activeWineryId: string; memberships: { wineryId: string; role: string }[] };
      expect(me.activeWineryId).toBe(asked[i].winery);
      expect(me.memberships.find((m) => m.wineryId === asked[i].winery)?.role).toBe(asked[i].role);
    });
    // The same person always comes back as the same e-mail.
    const emails = new Map<unknown, Set<string>>();
    answers.forEach((res, i) => emails.set(asked[i].client, (emails.get(asked[i].client) ?? new Set()).add((res.body as { user: { email: string } }).user.email)));
    for (const set of emails.values()) expect(set.size).toBe(1);
    expect(new Set([...emails.values()].map((s) => [...s][0])).size).toBe(people.length);
  });

  it('a request with an unknown session beside valid ones is refused alone', async () => {
    const stranger = new Client(app.baseUrl);
    stranger.cookies.set('porewise_session', 'not-a-session');
    const [good, bad] = await Promise.all([app.owner.get('/api/me'), stranger.get('/api/me')]);
    expect(good.status).toBe(200);
    expect(bad.status).toBe(401);
  });
});
