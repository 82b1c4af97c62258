/**
 * HTTP benchmark: Porewise's read endpoints against a bare Express 5 app serving the same JSON,
 * both in their own process, loaded by the same small keep-alive load generator in this
 * process, one after the other in the same run. Prints requests per second, p50/p95 and the
 * ratio app ÷ bare; then p95 at 50 connections on the demo; then Today at 10,000 cartridges
 * against Today on the demo data, and the 10k cartridge list sorted by received date and
 * searched, with the query plans PostgreSQL chooses.
 *
 * It uses its own database (porewise_bench, recreated each run) in the worktree's cluster.
 * Requests carry no Accept-Encoding, so neither side compresses: the ratio is the app's own
 * cost (session, authorization, queries, engine, JSON), not gzip's.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { writeFileSync, mkdirSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { runMigrations } from '../../server/db/migrate';
import { DEMO_PASSWORD, demoWineries, runSeed } from '../../server/db/seed';
import { databaseUrl, ensureDatabase, startCluster } from '../lib/postgres';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const DB = 'porewise_bench';
const SECONDS = Number(process.env.BENCH_HTTP_SECONDS ?? 3);
const CONNECTIONS = 10;
const WIDE = 50;
const INGEST_CLIENTS = 100;
/** BENCH_HTTP_PARTS=ingest,wide (of load, wide, today, runpage, ingest) runs only those parts; all by default. */
const PARTS = new Set((process.env.BENCH_HTTP_PARTS ?? 'load,wide,today,runpage,ingest').split(',').map((x) => x.trim()));
const BIG_WINERY = '7a2e0c1d-0000-4000-8000-00000000a10c';
const BIG_OWNER = 'benchowner10k001';

type Load = { rps: number; p50: number; p95: number; errors: number; n: number };
type Slice = { latencies: number[]; elapsed: number; errors: number };

const fmt = (v: number) => (v >= 100 ? v.toFixed(0) : v >= 10 ? v.toFixed(1) : v.toFixed(2));

function quantile(sorted: number[], q: number) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((sorted.length - 1) * q))];
}

/**
 * `connections` keep-alive loops, each sending one request after the other for `seconds`: a GET,
 * or a POST of `body()` (a new body each time) when given. Any 2xx counts as answered.
 */
async function slice(port: number, urlPath: string, headers: Record<string, string>, connections: number, seconds: number, body?: () => string): Promise<Slice> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
  const latencies: number[] = [];
  let errors = 0;
  const deadline = performance.now() + seconds * 1000;
  const one = () =>
    new Promise<void>((resolve) => {
      const t0 = performance.now();
      const payload = body?.();
      const method = payload === undefined ? 'GET' : 'POST';
      const sent = payload === undefined ? headers : { ...headers, 'content-type': 'application/json' };
      const req = http.request({ host: '127.0.0.1', port, path: urlPath, agent, method, headers: sent }, (res) => {
        res.on('data', () => {});
        res.on('end', () => {
          if (!res.statusCode || res.statusCode < 200 || res.statusCode > 299) errors += 1;
          else latencies.push(performance.now() - t0);
          resolve();
        });
      });
      req.on('error', () => {
        errors += 1;
        resolve();
      });
      req.end(payload);
    });
  const start = performance.now();
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (performance.now() < deadline) await one();
    }),
  );
  const elapsed = (performance.now() - start) / 1000;
  agent.destroy();
  return { latencies, elapsed, errors };
}

function summarise(slices: Slice[]): Load {
  const latencies = slices.flatMap((s) => s.latencies).sort((a, b) => a - b);
  const elapsed = slices.reduce((t, s) => t + s.elapsed, 0);
  return { rps: latencies.length / elapsed, p50: quantile(latencies, 0.5), p95: quantile(latencies, 0.95), errors: slices.reduce((t, s) => t + s.errors, 0), n: latencies.length };
}

/**
 * The app and its peer in alternating half-second slices, so both see the same load from
 * anything else on the machine; `seconds` of each in all.
 */
async function compare(targets: { port: number; path: string; headers: Record<string, string>; body?: () => string }[], connections: number, seconds: number): Promise<Load[]> {
  const slices: Slice[][] = targets.map(() => []);
  for (let round = 0; round < seconds * 2; round++) {
    for (const [i, t] of targets.entries()) slices[i].push(await slice(t.port, t.path, t.headers, connections, 0.5, t.body));
  }
  return slices.map(summarise);
}

function startProcess(args: string[], env: NodeJS.ProcessEnv): Promise<ChildProcess> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/bench/serve.ts'), ...args], {
      cwd: root,
      env,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let err = '';
    child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
    child.stdout!.on('data', (d: Buffer) => {
      if (d.toString().includes('ready')) resolve(child);
    });
    child.on('exit', (code) => reject(new Error(`bench server exited (${String(code)}): ${err.slice(-500)}`)));
  });
}

async function request(port: number, method: string, urlPath: string, body: unknown, cookie?: string) {
  const res = await fetch(`http://127.0.0.1:${port}${urlPath}`, {
    method,
    headers: { 'content-type': 'application/json', origin: `http://127.0.0.1:${port}`, ...(cookie ? { cookie } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  return { status: res.status, text, json: text ? (JSON.parse(text) as any) : null, setCookie: res.headers.getSetCookie() };
}

async function signIn(port: number, email: string): Promise<string> {
  const res = await request(port, 'POST', '/api/auth/sign-in', { email, password: DEMO_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${String(res.status)} ${JSON.stringify(res.json)}`);
  return res.setCookie.map((c) => c.split(';')[0]).join('; ');
}

/** A second winery with 10,000 cartridges and 20,000 events, its types copied from the demo's. */
async function seedBigWinery(client: pg.Client) {
  const q = demoWineries.quillwater.id;
  await client.query('begin');
  await client.query(`insert into wineries (id, name) values ($1, 'Bench Cellars (10k)')`, [BIG_WINERY]);
  await client.query(
    `insert into users (id, email, name, password_hash, active_winery_id)
     select $1, 'owner@bench10k.test', 'Bench Owner', password_hash, $2 from users where email = 'owner@quillwater.test'`,
    [BIG_OWNER, BIG_WINERY],
  );
  await client.query(`insert into memberships (winery_id, user_id, role) values ($1, $2, 'owner')`, [BIG_WINERY, BIG_OWNER]);
  await client.query(`create temp table bench_types as select * from cartridge_types where winery_id = $1`, [q]);
  await client.query(`update bench_types set id = gen_random_uuid(), winery_id = $1, certificate_attachment_id = null`, [BIG_WINERY]);
  await client.query(`insert into cartridge_types select * from bench_types`);
  await client.query(
    `insert into cartridges (winery_id, serial, batch, type_id, length_in, status, received_at, litres_filtered, hot_water_cycles)
     select $1, 'BX-' || lpad(g::text, 6, '0'), 'LOT' || (g % 250)::text,
            (select id from bench_types order by name offset (g % (select count(*) from bench_types)) limit 1),
            30,
            (array['in-stock','in-stock','in-stock','in-stock','installed','installed','installed','regenerating','retired','retired'])[1 + g % 10],
            date '2024-01-01' + (g % 700), (g % 50) * 1000, case when g <= 5000 then 2 else 0 end
     from generate_series(1, 10000) g`,
    [BIG_WINERY],
  );
  await client.query(
    `insert into cartridge_events (winery_id, cartridge_id, kind, details, at)
     select winery_id, id, 'registered', '{"waterFlowNewLh": 1000}'::jsonb, now() - interval '400 days' from cartridges where winery_id = $1`,
    [BIG_WINERY],
  );
  await client.query(
    `insert into cartridge_events (winery_id, cartridge_id, kind, details, at)
     select c.winery_id, c.id, 'cycle',
            jsonb_build_object('kind', 'hot-water', 'tempC', 85, 'durationMin', 30, 'waterFlowAfterLh', 1000 - (n.k * 7 + (substr(c.serial, 4)::int % 45) * 8)),
            now() - make_interval(days => 300 - n.k * 30)
     from cartridges c cross join (values (1), (2)) n(k)
     where c.winery_id = $1 and substr(c.serial, 4)::int <= 5000`,
    [BIG_WINERY],
  );
  await client.query('commit');
  await client.query('analyze');
}

export async function report() {
  console.log('  (servers in their own processes; load generator: node:http keep-alive loops in this process)');
  startCluster();
  ensureDatabase(DB, { fresh: true });
  const url = databaseUrl(DB);
  await runMigrations(url);
  await runSeed(url);
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  // A run needs an approved plan: approve the demo's plan directly.
  await client.query(`update plans set status = 'approved', approved_at = now() where winery_id = $1`, [demoWineries.quillwater.id]).catch(async () => {
    await client.query(`update plans set status = 'approved' where winery_id = $1`, [demoWineries.quillwater.id]);
  });
  await seedBigWinery(client);

  const appPort = 3900 + (process.pid % 50);
  const barePort = appPort + 50;
  mkdirSync(path.join(root, '.data'), { recursive: true });
  const env = { ...process.env, DATABASE_URL: url, NODE_ENV: 'development', FAKE_SERVICES_DIR: '.data/bench-services', LOG_LEVEL: 'info' };
  const app = await startProcess(['app', String(appPort)], env);
  const children: ChildProcess[] = [app];
  try {
    const cookie = await signIn(appPort, 'owner@quillwater.test');
    const plan = (await request(appPort, 'GET', '/api/plans', undefined, cookie)).json.items[0];
    const options = (await request(appPort, 'GET', '/api/runs/start-options', undefined, cookie)).json;
    const planLotId = (Array.isArray(options) ? options : options.items)[0].planLotId as string;
    const run = (await request(appPort, 'POST', '/api/runs', { planLotId }, cookie)).json;
    for (let i = 0; i < 100; i++) {
      await request(appPort, 'POST', `/api/runs/${run.id}/readings`, { clientKey: `bench-${i}`, stageIndex: i % 2, volumeL: 60 * (i + 1), upstreamBar: 0.4 + i * 0.01, downstreamBar: 0.1 }, cookie);
    }
    const endpoints: [string, string][] = [
      ['cartridge list', '/api/cartridges?page=1&pageSize=50'],
      ['plan detail', `/api/plans/${plan.id as string}`],
      ['run detail', `/api/runs/${run.id as string}`],
      ['runs list', '/api/runs'],
      ['Today', '/api/today'],
    ];
    const bodies: Record<string, unknown> = {};
    for (const [, p] of endpoints) {
      const res = await request(appPort, 'GET', p, undefined, cookie);
      if (res.status !== 200) throw new Error(`${p}: ${String(res.status)}`);
      bodies[p] = res.json;
    }
    const file = path.join(root, '.data', `bench-bodies-${process.pid}.json`);
    writeFileSync(file, JSON.stringify(bodies));
    const bare = await startProcess(['bare', String(barePort), file], env);
    children.push(bare);

    const bigCookie = await signIn(appPort, 'owner@bench10k.test');
    const once = async (c: string, p: string) => {
      const t0 = performance.now();
      const res = await request(appPort, 'GET', p, undefined, c);
      if (res.status !== 200) throw new Error(`${p}: ${String(res.status)}`);
      return performance.now() - t0;
    };
    /** Median of n requests to each path, one at a time, the paths taking turns (same machine load for both). */
    const alternating = async (n: number, ...targets: [string, string][]) => {
      const times: number[][] = targets.map(() => []);
      for (let i = 0; i < n; i++) for (const [j, [c, p]] of targets.entries()) times[j].push(await once(c, p));
      return times.map((t) => quantile(t.sort((x, y) => x - y), 0.5));
    };
    const runPath = `/api/runs/${run.id as string}`;
    const headers = { cookie };
    if (PARTS.has('load')) {
      console.log(`  ${String(CONNECTIONS)} connections, ${String(SECONDS)} s each, app and bare in alternating half-second slices`);
      for (const [name, p] of endpoints) {
        await compare([{ port: appPort, path: p, headers }, { port: barePort, path: p, headers: {} }], CONNECTIONS, 0.5); // warm-up
        const [a, b] = await compare([{ port: appPort, path: p, headers }, { port: barePort, path: p, headers: {} }], CONNECTIONS, SECONDS);
        const kb = (JSON.stringify(bodies[p]).length / 1024).toFixed(1);
        console.log(
          `  ${name.padEnd(15)} app ${fmt(a.rps).padStart(6)} req/s (p50 ${fmt(a.p50)} ms, p95 ${fmt(a.p95)} ms)   bare ${fmt(b.rps).padStart(6)} req/s   → app at ${((a.rps / b.rps) * 100).toFixed(0)} % of bare   (${kb} KB${a.errors ? `, ${String(a.errors)} errors` : ''})`,
        );
      }
    }

    if (PARTS.has('wide')) {
      console.log(`  ${String(WIDE)} connections, ${String(SECONDS)} s each: the app, the bare app serving the same JSON, and the app's /api/health, in turns (goal: app p95 ≤ 50 ms)`);
      for (const [name, p] of endpoints) {
        // warm-up, as for 10 connections: 50 sockets opened and the pool's connections made before measuring
        await compare([{ port: appPort, path: p, headers }, { port: barePort, path: p, headers: {} }], WIDE, 0.5);
        const [a, b, h] = await compare(
          [
            { port: appPort, path: p, headers },
            { port: barePort, path: p, headers: {} },
            { port: appPort, path: '/api/health', headers: {} },
          ],
          WIDE,
          SECONDS,
        );
        console.log(
          `  ${name.padEnd(15)} app ${fmt(a.rps).padStart(6)} req/s   p50 ${fmt(a.p50)} ms   p95 ${fmt(a.p95)} ms   (bare p95 ${fmt(b.p95)} ms at ${fmt(b.rps)} req/s; health p95 ${fmt(h.p95)} ms)${a.errors ? `   ${String(a.errors)} errors` : ''}`,
        );
      }
    }

    let demoToday = NaN;
    let bigToday = NaN;
    if (PARTS.has('today')) {
      // Today at 10,000 cartridges: one request at a time, against Today on the demo.
      await alternating(4, [cookie, '/api/today'], [bigCookie, '/api/today']);
      [demoToday, bigToday] = await alternating(20, [cookie, '/api/today'], [bigCookie, '/api/today']);
      const bigBody = (await request(appPort, 'GET', '/api/today', undefined, bigCookie)).json;
      console.log('  Today, one request at a time, demo and 10k taking turns (median)');
      console.log(`  demo data        ${fmt(demoToday)} ms`);
      console.log(
        `  10,000 cartridges ${fmt(bigToday)} ms   → ${(bigToday / demoToday).toFixed(1)}× the demo   (${String(bigBody.cartridges.attentionTotal)} cartridges to look at)`,
      );
      // Cold: every stored life check removed, so this one request works out all of them again.
      await client.query(`delete from cartridge_life_flags f using cartridges c where c.id = f.cartridge_id and c.winery_id = $1`, [BIG_WINERY]);
      const cold = await once(bigCookie, '/api/today');
      console.log(`  10,000 cartridges, cold (no stored life check) ${fmt(cold)} ms, once   (the first visit after a change checks only the cartridges it touched)`);
      const [demoList, bySort, search] = await alternating(
        15,
        [cookie, '/api/cartridges?page=1&pageSize=50'],
        [bigCookie, '/api/cartridges?sort=receivedAt&order=desc&page=3&pageSize=50'],
        [bigCookie, '/api/cartridges?q=BX-0042&page=1&pageSize=50'],
      );
      console.log(`  cartridge list, demo ${fmt(demoList)} ms; at 10k sorted by received date ${fmt(bySort)} ms (${(bySort / demoList).toFixed(1)}×), searched ${fmt(search)} ms (${(search / demoList).toFixed(1)}×)`);
    }

    if (PARTS.has('runpage')) {
      // The run page at 5,000 readings against the same run at 100 (one request at a time, median;
      // the run is measured at 100, then grown to 5,000 through the batch endpoint).
      await alternating(4, [cookie, runPath]);
      const [run100] = await alternating(20, [cookie, runPath]);
      const kb100 = (await request(appPort, 'GET', runPath, undefined, cookie)).text.length / 1024;
      for (let from = 100; from < 5000; from += 1000) {
        const readings = Array.from({ length: Math.min(1000, 5000 - from) }, (_x, k) => {
          const i = from + k;
          return { clientKey: `bench-${String(i)}`, stageIndex: i % 2, volumeL: 60 * (i + 1), upstreamBar: 1.4 + (i - 100) * 0.0002, downstreamBar: 0.1 };
        });
        const res = await request(appPort, 'POST', `${runPath}/readings/batch`, { readings }, cookie);
        if (res.status !== 200) throw new Error(`readings batch: ${String(res.status)}`);
      }
      await alternating(4, [cookie, runPath]);
      const [run5k, page5k] = await alternating(20, [cookie, runPath], [cookie, `${runPath}/readings?stage=0&page=1&pageSize=10`]);
      const kb5k = (await request(appPort, 'GET', runPath, undefined, cookie)).text.length / 1024;
      // Today with that run in progress at 5,000 readings (its stored figures current), against Today before it grew.
      const [today5k] = await alternating(20, [cookie, '/api/today']);
      // Cold: the run's stored figures removed, so the next request works them out from every reading again.
      await client.query(`delete from run_figures where run_id = $1`, [run.id]);
      const run5kCold = await once(cookie, runPath);
      await client.query(`delete from run_figures where run_id = $1`, [run.id]);
      const today5kCold = await once(cookie, '/api/today');
      const posted = await request(appPort, 'POST', `${runPath}/readings?with=stage`, { clientKey: 'bench-5000', stageIndex: 0, volumeL: 60 * 5001, upstreamBar: 2.4, downstreamBar: 0.1 }, cookie);
      console.log('  Run page, one request at a time (median), the same run at 100 and then 5,000 readings');
      console.log(`  run detail, 100 readings   ${fmt(run100)} ms   ${kb100.toFixed(1)} KB`);
      console.log(
        `  run detail, 5,000 readings ${fmt(run5k)} ms   ${kb5k.toFixed(1)} KB   → ${(run5k / run100).toFixed(1)}× the time, ${(kb5k / kb100).toFixed(1)}× the bytes (goal ≤ 2×, ≤ 150 KB)`,
      );
      console.log(`  run detail, 5,000 readings, cold (no stored figures) ${fmt(run5kCold)} ms, once   (the first read after a change)`);
      console.log(`  Today with that run at 5,000 readings ${fmt(today5k)} ms (demo before it grew ${fmt(demoToday)} ms); cold ${fmt(today5kCold)} ms, once`);
      console.log(`  readings table page (10 of 2,500) ${fmt(page5k)} ms; a reading's POST with its stage ${(posted.text.length / 1024).toFixed(1)} KB`);
    }

    if (PARTS.has('ingest')) {
      // Reading ingest on one run: 100 clients posting readings (each with its own key; one volume
      // for all, so none is refused for litres going down whatever order they arrive in), against
      // the bare app's single INSERT … ON CONFLICT into the same table for the same run (the
      // table's triggers fire for both); then /api/health and the cartridge list, one request at a
      // time, idle and while the 100 clients post.
      let key = 0;
      const reading = (extra: Record<string, unknown>) => () =>
        JSON.stringify({ clientKey: `ingest-${String((key += 1))}`, stageIndex: key % 2, volumeL: 400_000, upstreamBar: 2.5, downstreamBar: 0.1, ...extra });
      const appPost = { port: appPort, path: `${runPath}/readings`, headers: { cookie, origin: `http://127.0.0.1:${String(appPort)}` }, body: reading({}) };
      const barePost = { port: barePort, path: `${runPath}/readings`, headers: {}, body: reading({ wineryId: demoWineries.quillwater.id }) };
      await compare([appPost, barePost], INGEST_CLIENTS, 0.5); // warm-up
      const [ingestApp, ingestBare] = await compare([appPost, barePost], INGEST_CLIENTS, SECONDS);
      console.log(`  Reading ingest, ${String(INGEST_CLIENTS)} clients on one run, app and bare in alternating half-second slices`);
      console.log(
        `  app ${fmt(ingestApp.rps).padStart(6)} readings/s (p50 ${fmt(ingestApp.p50)} ms)   bare INSERT … ON CONFLICT ${fmt(ingestBare.rps).padStart(6)}/s (p50 ${fmt(ingestBare.p50)} ms)   → app at ${((ingestApp.rps / ingestBare.rps) * 100).toFixed(0)} % of bare (goal ≥ 50 %)${ingestApp.errors ? `   ${String(ingestApp.errors)} errors` : ''}`,
      );
      const probes: [string, number, string, Record<string, string>, string, string][] = [
        ['/api/health', appPort, '/api/health', {}, cookie, '{}'],
        ['cartridge list', appPort, '/api/cartridges?page=1&pageSize=50&probe=1', { cookie }, cookie, '{}'],
        // The peer: the bare app's own `select 1` health check while 100 clients post to its INSERT.
        ['bare health', barePort, '/api/health', {}, '', JSON.stringify({ wineryId: demoWineries.quillwater.id })],
      ];
      for (const [name, port, p, h, crowdCookie, extra] of probes) {
        const idle = summarise([await slice(port, p, h, 1, SECONDS)]);
        // The crowd in its own process: the probe's answers must not wait behind its callbacks here.
        const crowd = await startProcess(['post', String(port), appPost.path, String(INGEST_CLIENTS), String(SECONDS + 1), crowdCookie, extra], env);
        await new Promise((r) => setTimeout(r, 500));
        const busy = summarise([await slice(port, p, h, 1, SECONDS)]);
        const done = await new Promise<{ n: number }>((resolve) => {
          let out = '';
          crowd.stdout!.on('data', (d: Buffer) => {
            out += d.toString();
            const line = out.split('\n').find((l) => l.startsWith('{'));
            if (line) resolve(JSON.parse(line) as { n: number });
          });
        });
        console.log(
          `  ${name.padEnd(15)} p50 idle ${fmt(idle.p50)} ms, while ${String(INGEST_CLIENTS)} clients post readings (${fmt(done.n / (SECONDS + 1))}/s) ${fmt(busy.p50)} ms → ${(busy.p50 / idle.p50).toFixed(1)}× idle${port === barePort ? ' (the peer, for comparison)' : ' (goal ≤ 3×)'}`,
        );
      }
    }

    const plan10k = async (sql: string, params: unknown[]) => {
      const res = await client.query(`explain ${sql}`, params);
      return (res.rows as { 'QUERY PLAN': string }[])
        .map((r) => r['QUERY PLAN'])
        .filter((l) => /Scan|Index/.test(l))
        .map((l) => l.trim().replace(/\s+\(cost.*$/, ''))
        .join('; ');
    };
    console.log(
      `  plan, sorted by received date: ${await plan10k(`select id from cartridges where winery_id = $1 order by received_at desc, id limit 50 offset 100`, [BIG_WINERY])}`,
    );
    console.log(
      `  plan, search count: ${await plan10k(`select count(*) from cartridges where winery_id = $1 and (serial ilike $2 or batch ilike $2)`, [BIG_WINERY, '%BX-0042%'])}`,
    );
    console.log(
      `  plan, used-cartridge check: ${await plan10k(
        `select count(*) from cartridges c where c.winery_id = $1 and exists (select 1 from cartridge_events e where e.cartridge_id = c.id and e.kind in ('cycle','integrity','run'))`,
        [BIG_WINERY],
      )}`,
    );
  } finally {
    for (const c of children) c.kill('SIGTERM');
    await client.end();
  }
}
