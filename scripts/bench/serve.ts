/**
 * A process for the HTTP benchmark (scripts/bench/http.ts), so the load generator never shares an
 * event loop with what it measures, and a probe's latency never waits behind a crowd's callbacks.
 *   tsx scripts/bench/serve.ts app  <port>          — Porewise, as `npm start` runs it (logging on)
 *   tsx scripts/bench/serve.ts bare <port> <file>   — a bare Express 5 app answering each path
 *                                                     in <file> ({ "/api/x": body }) with that JSON,
 *                                                     and POST /api/runs/:id/readings with one
 *                                                     INSERT … ON CONFLICT into run_readings
 *                                                     (DATABASE_URL, a pool of 10 like the app's)
 *   tsx scripts/bench/serve.ts post <port> <path> <clients> <seconds> <cookie> <extra-json>
 *                                                   — a crowd: <clients> keep-alive loops each
 *                                                     POSTing a new reading to <path> for <seconds>;
 *                                                     prints {"n": answered, "errors": e} at the end
 * Prints "ready" on stdout once listening (or, for a crowd, once started).
 */
import express from 'express';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import pg from 'pg';

async function main() {
  const [mode, portText, file] = process.argv.slice(2);
  const port = Number(portText);
  if (mode === 'post') {
    const [, , urlPath, clients, seconds, cookie, extra] = process.argv.slice(2);
    const agent = new http.Agent({ keepAlive: true, maxSockets: Number(clients) });
    const more = JSON.parse(extra) as Record<string, unknown>;
    let key = 0;
    let n = 0;
    let errors = 0;
    const deadline = performance.now() + Number(seconds) * 1000;
    const one = () =>
      new Promise<void>((resolve) => {
        key += 1;
        const body = JSON.stringify({ clientKey: `crowd-${String(process.pid)}-${String(key)}`, stageIndex: key % 2, volumeL: 400_000, upstreamBar: 2.5, downstreamBar: 0.1, ...more });
        const headers = { cookie, origin: `http://127.0.0.1:${String(port)}`, 'content-type': 'application/json' };
        const req = http.request({ host: '127.0.0.1', port, path: urlPath, method: 'POST', agent, headers }, (res) => {
          res.on('data', () => {});
          res.on('end', () => {
            if (res.statusCode && res.statusCode < 300) n += 1;
            else errors += 1;
            resolve();
          });
        });
        req.on('error', () => {
          errors += 1;
          resolve();
        });
        req.end(body);
      });
    process.stdout.write('ready\n');
    await Promise.all(Array.from({ length: Number(clients) }, async () => {
      while (performance.now() < deadline) await one();
    }));
    process.stdout.write(`${JSON.stringify({ n, errors })}\n`);
    process.exit(0);
  }
  if (mode === 'bare') {
    const bodies = JSON.parse(readFileSync(file, 'utf8')) as Record<string, unknown>;
    const app = express();
    for (const [path, body] of Object.entries(bodies)) {
      const url = new URL(path, 'http://x');
      app.get(url.pathname, (_req, res) => {
        res.json(body);
      });
    }
    // The reading ingest peer: the same table, the same row, no session, checks or counters.
    const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10, options: '-c jit=off' });
    // Its health check: one `select 1`, like the app's.
    app.get('/api/health', async (_req, res) => {
      await pool.query('select 1');
      res.json({ ok: true, db: true });
    });
    app.post('/api/runs/:id/readings', express.json(), async (req, res) => {
      const b = req.body as { wineryId: string; stageIndex: number; volumeL: number; upstreamBar: number; downstreamBar: number; clientKey: string };
      const r = await pool.query(
        `insert into run_readings (winery_id, run_id, stage_index, at, volume_l, upstream_bar, downstream_bar, client_key)
         values ($1, $2, $3, now(), $4, $5, $6, $7) on conflict (run_id, client_key) do nothing returning *`,
        [b.wineryId, req.params.id, b.stageIndex, b.volumeL, b.upstreamBar, b.downstreamBar, b.clientKey],
      );
      res.status(201).json(r.rows[0] ?? null);
    });
    await new Promise<void>((r) => app.listen(port, '127.0.0.1', () => r()));
  } else {
    const { parseEnv } = await import('../../server/env');
    const { startServer } = await import('../../server/server');
    await startServer(parseEnv({ ...process.env, PORT: String(port), HOST: '127.0.0.1', CLIENT_DIR: '.data/bench-no-client' }));
  }
  // A clean exit on SIGTERM, so `node --cpu-prof` writes its profile.
  process.on('SIGTERM', () => process.exit(0));
  process.stdout.write('ready\n');
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
