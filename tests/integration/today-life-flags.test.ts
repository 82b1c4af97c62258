// @vitest-environment node
// Today keeps each cartridge's life check (cartridge_life_flags) and works it out again only
// when something the forecast reads has changed. These tests change each of those things after
// Today has been read, and check Today against a check worked out from nothing (the stored
// rows removed), so a stale stored check would show as a difference.
import { eq, inArray, sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { cartridgeEventsTable, cartridgeLifeFlagsTable, cartridgesTable, cartridgeTypesTable } from '../../server/db/schema';
import type { TodayDto } from '../../shared/types/today';
import { insertCartridgeType, serialPrefix } from '../factories/cartridges';
import { setupApiApp } from '../support/api-app';
import { signUp, type Client } from '../support/test-app';

// Without the kept answers (server/middleware/answer-cache.ts): each read of Today works it out.
const app = setupApiApp({ config: { answerCacheBytes: 0 } });

const prefix = serialPrefix();
let seq = 0;
const day = (n: number) => new Date(Date.UTC(2025, 10, n, 9, 0, 0));

async function cartridgesOnToday(client: Client) {
  const res = await client.get('/api/today');
  expect(res.status).toBe(200);
  return (res.body as TodayDto).cartridges;
}

/** Today's cartridges, then the same worked out from nothing: both must agree. */
async function checkedBothWays(client: Client, ids: string[]) {
  const kept = await cartridgesOnToday(client);
  await app.db.delete(cartridgeLifeFlagsTable).where(inArray(cartridgeLifeFlagsTable.cartridgeId, ids));
  const fresh = await cartridgesOnToday(client);
  expect(kept).toEqual(fresh);
  return kept;
}

describe('Today’s stored life checks', () => {
  it('follow every change the forecast reads: events, litres, type ratings, an event removed', async () => {
    const { client, me } = await signUp(app.baseUrl, { wineryName: 'Life Flags Winery' });
    const wineryId = me.activeWineryId!;
    const type = await insertCartridgeType(app.db, wineryId, { ratedSteamCycles: 20, ratedHotWaterCycles: 100, ratedChemicalCycles: 100 });
    const other = await insertCartridgeType(app.db, wineryId, { ratedSteamCycles: 20, ratedHotWaterCycles: 100, ratedChemicalCycles: 100 });
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      const res = await client.post('/api/cartridges', { serial: `${prefix}-${String(++seq)}`, batch: 'B1', typeId: type.id, lengthIn: 30, receivedAt: '2025-01-10' });
      expect(res.status).toBe(201);
      ids.push(res.body.id as string);
    }
    const [a, b, c] = ids;
    const steam = (cartridgeId: string, n: number, from = 1) =>
      Array.from({ length: n }, (_, i) => ({ wineryId, cartridgeId, kind: 'cycle' as const, at: day(from + i), details: { kind: 'steam', tempC: 121, durationMin: 30 } }));

    // used and back on the shelf, nothing to look at yet
    await app.db.insert(cartridgeEventsTable).values([...steam(a, 5), ...steam(b, 5)]);
    expect((await checkedBothWays(client, ids)).attentionTotal).toBe(0);
    // every cartridge not retired has its check stored (c too: unused, on the shelf, not shown)
    expect(await app.db.select().from(cartridgeLifeFlagsTable).where(inArray(cartridgeLifeFlagsTable.cartridgeId, ids))).toHaveLength(3);

    // more cycles logged: a is near the end of its steam budget
    await app.db.insert(cartridgeEventsTable).values(steam(a, 12, 10));
    let seen = await checkedBothWays(client, ids);
    expect(seen.attention.map((x) => x.id)).toEqual([a]);
    expect(seen.attention[0]).toMatchObject({ figure: { kind: 'cycles-left', cyclesLeft: 3 } });

    // the type's rating lowered to 6: a (17 cycles) is past it, b (5) has one left
    await app.db.update(cartridgeTypesTable).set({ ratedSteamCycles: 6 }).where(eq(cartridgeTypesTable.id, type.id));
    seen = await checkedBothWays(client, ids);
    expect(seen.attention.map((x) => [x.id, x.reason])).toEqual([
      [a, 'Life forecast has ended'],
      [b, 'Near the end of its life'],
    ]);

    // b moved to another type (a generous one): only a is left
    await app.db.update(cartridgesTable).set({ typeId: other.id }).where(eq(cartridgesTable.id, b));
    seen = await checkedBothWays(client, ids);
    expect(seen.attention.map((x) => x.id)).toEqual([a]);

    // a failed integrity test on c (which had no use before) leads
    await app.db.insert(cartridgeEventsTable).values({ wineryId, cartridgeId: c, kind: 'integrity', at: day(20), details: { pass: false, method: 'bubble-point' } });
    seen = await checkedBothWays(client, ids);
    expect(seen.attention[0]).toMatchObject({ id: c, reason: 'Latest integrity test failed' });

    // the failed test removed (a mistaken entry cleared by hand): c has nothing again
    await app.db.delete(cartridgeEventsTable).where(sql`${cartridgeEventsTable.cartridgeId} = ${c} and ${cartridgeEventsTable.kind} = 'integrity'`);
    seen = await checkedBothWays(client, ids);
    expect(seen.attention.map((x) => x.id)).toEqual([a]);

    // the type's rating raised again: a has 17 of 40 steam cycles, nothing to look at
    await app.db.update(cartridgeTypesTable).set({ ratedSteamCycles: 40 }).where(eq(cartridgeTypesTable.id, type.id));
    expect((await checkedBothWays(client, ids)).attentionTotal).toBe(0);

    // litres credited (a run closed) make the stored check stale too
    const version = async () => (await app.db.select().from(cartridgeLifeFlagsTable).where(eq(cartridgeLifeFlagsTable.cartridgeId, a)))[0];
    await cartridgesOnToday(client);
    const before = await version();
    expect(before.checkedVersion).toBe(before.version);
    await app.db.update(cartridgesTable).set({ litresFiltered: sql`${cartridgesTable.litresFiltered} + 1200` }).where(eq(cartridgesTable.id, a));
    expect((await version()).version).toBe(before.version + 1);
    expect((await checkedBothWays(client, ids)).attentionTotal).toBe(0);
  });

  it('a check stored at an older version is never taken for the current one', async () => {
    const { client, me } = await signUp(app.baseUrl, { wineryName: 'Life Flags Race Winery' });
    const wineryId = me.activeWineryId!;
    const type = await insertCartridgeType(app.db, wineryId, { ratedSteamCycles: 4, ratedHotWaterCycles: 100, ratedChemicalCycles: 100 });
    const res = await client.post('/api/cartridges', { serial: `${prefix}-${String(++seq)}`, batch: 'B1', typeId: type.id, lengthIn: 30, receivedAt: '2025-01-10' });
    const id = res.body.id as string;
    await app.db.insert(cartridgeEventsTable).values({ wineryId, cartridgeId: id, kind: 'cycle', at: day(1), details: { kind: 'steam', tempC: 121, durationMin: 30 } });
    expect((await cartridgesOnToday(client)).attentionTotal).toBe(1);
    // a writer bumps the version after a check was read: the stored row is stale until checked again
    const [before] = await app.db.select().from(cartridgeLifeFlagsTable).where(eq(cartridgeLifeFlagsTable.cartridgeId, id));
    await app.db.insert(cartridgeEventsTable).values({ wineryId, cartridgeId: id, kind: 'cycle', at: day(2), details: { kind: 'steam', tempC: 121, durationMin: 30 } });
    const [after] = await app.db.select().from(cartridgeLifeFlagsTable).where(eq(cartridgeLifeFlagsTable.cartridgeId, id));
    expect(after.version).toBe(before.version + 1);
    expect(after.checkedVersion).toBe(before.version);
    const seen = await cartridgesOnToday(client);
    expect(seen.attention[0]).toMatchObject({ id, figure: { kind: 'cycles-left', cyclesLeft: 2 } });
  });
});
