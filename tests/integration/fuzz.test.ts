// @vitest-environment node
// Property tests over every route of the API, found by walking Express's router (a route added
// later is fuzzed without touching this file): generated bodies to every write route, generated
// ids to every route with an id, and another winery's real ids to every route with an id. The
// answers must never be a 5xx, a stack trace or an internal message; another winery's ids must
// answer exactly like a missing record (404 for reads and deletes).
import { randomUUID } from 'node:crypto';
import express, { type Express } from 'express';
import { getTableColumns, inArray, sql, type Table } from 'drizzle-orm';
import { PgTable } from 'drizzle-orm/pg-core';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import * as schema from '../../server/db/schema';
import { createTank } from '../factories/cellar';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { addMember, Client, signUp, startTestApp, type TestApp } from '../support/test-app';

type RouteInfo = { method: string; path: string };

/** Records the path each router is mounted at, so the route tree can be walked afterwards. */
const mountPaths = new WeakMap<object, string>();
const routerProto = Object.getPrototypeOf(Object.getPrototypeOf(express.Router())) as { use: (...args: unknown[]) => unknown };
const originalUse = routerProto.use;

/** Every (method, full path) of the app, from Express's own router. */
function enumerateRoutes(app: Express): RouteInfo[] {
  const out: RouteInfo[] = [];
  type Layer = { route?: { path: unknown; methods: Record<string, boolean> }; handle: { stack?: Layer[]; routers?: { stack: Layer[] }[] } };
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        if (typeof layer.route.path !== 'string') continue; // the client's catch-all (a RegExp)
        for (const method of Object.keys(layer.route.methods)) {
          if (method !== '_all') out.push({ method: method.toUpperCase(), path: prefix + (layer.route.path === '/' && prefix ? '' : layer.route.path) });
        }
      } else if (Array.isArray(layer.handle.stack)) {
        walk(layer.handle.stack, prefix + (mountPaths.get(layer.handle) ?? ''));
      } else if (Array.isArray(layer.handle.routers)) {
        // routeBySegment (server/lib/route-by-segment.ts): its routers, where it is mounted
        for (const router of layer.handle.routers) walk(router.stack, prefix);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return out;
}

let app: TestApp;
let routes: RouteInfo[];
let ownerA: Client;
let foreignIds: string[];

const INTERNAL =
  /\bat [\w$.<>]+ \(|at .*\.(ts|js):\d+|node_modules|Maximum call stack|RangeError|TypeError|ReferenceError|Cannot read prop|is not a function|violates|syntax error|relation "|column "|duplicate key|invalid input (syntax|value)|unsupported Unicode|DrizzleQueryError|Failed query|\bselect\b.*\bfrom\b/i;

function checkAnswer(what: string, res: { status: number; text: string }) {
  expect(res.status, `${what} → ${res.status} ${res.text.slice(0, 300)}`).toBeLessThan(500);
  expect(res.text, what).not.toMatch(INTERNAL);
}

const fill = (path: string, ids: (i: number) => string) => {
  let i = 0;
  return path.replace(/:(\w+)/g, () => ids(i++));
};

beforeAll(async () => {
  routerProto.use = function patchedUse(this: unknown, ...args: unknown[]) {
    const [first] = args;
    if (typeof first === 'string') {
      for (const fn of args.slice(1).flat(Infinity)) if (typeof fn === 'function' && 'stack' in fn) mountPaths.set(fn, first === '/' ? '' : first);
    }
    return originalUse.apply(this, args);
  };
  app = await startTestApp({ withStorage: false });
  // The same createApp as the server's, used only to read its route table.
  const inspected = createApp({
    db: app.db,
    mailer: { send: async () => {} } as never,
    storage: { ensureBucket: async () => {}, put: async () => {}, get: async () => { throw new Error('unused'); }, remove: async () => {} } as never,
    outbox: app.mail,
    config: { appUrl: app.baseUrl, allowedOrigins: [], secureCookies: false, rateLimitScale: 100, logRequests: false },
  });
  routes = enumerateRoutes(inspected);
  routerProto.use = originalUse;

  ownerA = (await signUp(app.baseUrl, { wineryName: 'Fuzz Winery A' })).client;
  // Winery B with a record of every kind the factories make, and a member.
  const { client: ownerB, me: meB } = await signUp(app.baseUrl, { wineryName: 'Fuzz Winery B' });
  await addMember(app, ownerB, 'technician');
  await createTank(ownerB);
  const world = await createPlanWorld(ownerB);
  await fillTrainHousings(ownerB, world);
  const plan = await createPlan(ownerB, world.lineId);
  const planLotId = (await addPlanLot(ownerB, plan.id, world.lotId, 6000)).lots[0].id;
  const trainId = (await addTrain(ownerB, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
  await ownerB.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
  await ownerB.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' });
  await ownerB.post('/api/runs', { planLotId });
  const cartridge = await ownerB.post('/api/cartridges', { serial: `FZ${Date.now().toString(36).toUpperCase()}`, typeId: world.membraneTypeId, lengthIn: 30 });
  expect(cartridge.status).toBe(201);
  await ownerB.post(`/api/cartridges/${cartridge.body.id}/cycles`, { kind: 'hot-water', tempC: 85, durationMin: 20 });
  // Every id in every winery-owned table that belongs to B (found from the schema, not listed by hand).
  const wineryB = meB.activeWineryId!;
  const ids = new Set<string>([wineryB]);
  for (const table of Object.values(schema)) {
    if (!(table instanceof PgTable)) continue;
    const cols = getTableColumns(table as Table) as Record<string, { name: string }>;
    if (!cols.id || !cols.wineryId) continue;
    const rows = await app.db.execute(sql`select ${sql.identifier(cols.id.name)}::text as id from ${table} where ${sql.identifier(cols.wineryId.name)} = ${wineryB} limit 1`);
    for (const row of rows.rows as { id: string }[]) ids.add(row.id);
  }
  const members = await app.db.select({ userId: schema.membershipsTable.userId }).from(schema.membershipsTable).where(inArray(schema.membershipsTable.wineryId, [wineryB]));
  for (const m of members) ids.add(m.userId);
  foreignIds = [...ids];
}, 180_000);

afterAll(async () => {
  routerProto.use = originalUse;
  await app?.close();
});

const keyArb = fc.oneof(
  fc.constantFrom('name', 'email', 'password', 'token', 'code', 'notes', 'reason', 'agent', 'kind', 'stages', 'lots', 'volumeL', 'clientKey', 'stageIndex', 'tankId', 'lotId', 'lineId', 'planLotId', 'role', 'units', 'wineryId', 'readinessThresholds', 'source', 'hoses', 'points', 'sampledAt', 'plannedDate', '__proto__', 'constructor', 'toString'),
  fc.string({ maxLength: 12 }),
);
const leafArb = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 20 }), // lone surrogates and NUL included
  fc.double(),
  fc.integer(),
  fc.constantFrom(0, -1, 1e308, -1e308, 2 ** 53 + 1, '', ' ', '\u0000', '\ud800', '1e999', 'NaN', null, true, false, '2025-02-30', '0000-01-01', randomUUID(), '%ff'),
);
const valueArb = fc.letrec((tie) => ({
  value: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leafArb, fc.array(tie('value'), { maxLength: 4 }), fc.dictionary(keyArb, tie('value'), { maxKeys: 5 })),
})).value;
const bodyArb = fc.oneof(fc.dictionary(keyArb, valueArb, { maxKeys: 8 }), valueArb, fc.jsonValue({ maxDepth: 4 }));
const idArb = fc.oneof(
  fc.uuid(),
  fc.string({ maxLength: 30 }).map(encodeURIComponent),
  fc.constantFrom('%ff', '%', '%zz', '%00', '%c0%80', '%ed%a0%80', '..', '%2e%2e', 'a'.repeat(3000), '00000000-0000-0000-0000-000000000000', 'null', '-1', '1e9'),
);

const BODIES_PER_ROUTE = 12;
const IDS_PER_ROUTE = 8;

describe('the route table', () => {
  it('is found by walking the router (the fuzzing below covers every route)', () => {
    expect(routes.length).toBeGreaterThan(50);
    expect(routes).toContainEqual({ method: 'POST', path: '/api/runs/:id/readings' });
    expect(routes).toContainEqual({ method: 'GET', path: '/api/health' });
  });
});

describe('fuzzing', () => {
  it('generated bodies to every write route: no 5xx, no stack, no internal message', async () => {
    const writes = routes.filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method));
    expect(writes.length).toBeGreaterThan(20);
    for (const route of writes) {
      const path = fill(route.path, () => randomUUID());
      // Session-changing auth routes get a fresh, signed-out client so the owner's session stays.
      const who = () => (route.path.startsWith('/api/auth/') ? new Client(app.baseUrl) : ownerA);
      await fc.assert(
        fc.asyncProperty(bodyArb, async (body) => {
          const res = await who().request(route.method, path, JSON.stringify(body === undefined ? null : body), { 'content-type': 'application/json' });
          checkAnswer(`${route.method} ${route.path} ${JSON.stringify(body)?.slice(0, 200)}`, res);
        }),
        { numRuns: BODIES_PER_ROUTE, seed: 20251202 },
      );
    }
  }, 180_000);

  it('generated ids to every route with an id, signed in and signed out: no 5xx, no stack', async () => {
    const withIds = routes.filter((r) => r.path.includes(':'));
    expect(withIds.length).toBeGreaterThan(20);
    for (const route of withIds) {
      await fc.assert(
        fc.asyncProperty(idArb, fc.boolean(), async (id, signedIn) => {
          const path = fill(route.path, () => id);
          const res = await (signedIn ? ownerA : new Client(app.baseUrl)).request(route.method, path, route.method === 'GET' || route.method === 'DELETE' ? undefined : {});
          checkAnswer(`${route.method} ${path.slice(0, 120)}`, res);
        }),
        { numRuns: IDS_PER_ROUTE, seed: 20251202 },
      );
    }
  }, 180_000);

  it("another winery's ids answer exactly like a missing record (404 for reads and deletes)", async () => {
    expect(foreignIds.length).toBeGreaterThan(8);
    const withIds = routes.filter((r) => r.path.includes(':'));
    for (const route of withIds) {
      const body = route.method === 'GET' || route.method === 'DELETE' ? undefined : {};
      const missing = await ownerA.request(route.method, fill(route.path, () => randomUUID()), body);
      for (let k = 0; k < foreignIds.length; k += 1) {
        const path = fill(route.path, (i) => foreignIds[(k + i) % foreignIds.length]);
        const res = await ownerA.request(route.method, path, body);
        checkAnswer(`${route.method} ${path}`, res);
        expect(res.status, `${route.method} ${path}: ${res.text.slice(0, 200)}`).toBe(missing.status);
        expect(res.body?.error?.code, `${route.method} ${path}`).toBe(missing.body?.error?.code);
        if (body === undefined) expect(res.status, `${route.method} ${path}`).toBe(404);
      }
    }
  }, 180_000);
});
