/**
 * A server process for the HTTP benchmark (scripts/bench/http.ts), so the load generator never
 * shares an event loop with what it measures.
 *   tsx scripts/bench/serve.ts app  <port>          — Porewise, as `npm start` runs it (logging on)
 *   tsx scripts/bench/serve.ts bare <port> <file>   — a bare Express 5 app answering each path
 *                                                     in <file> ({ "/api/x": body }) with that JSON,
 *                                                     and POST /api/runs/:id/readings with one
 *                                                     INSERT … ON CONFLICT into run_readings
 *                                                     (DATABASE_URL, a pool of 10 like the app's)
 * Prints "ready" on stdout once listening.
 */
import express from 'express';
import { readFileSync } from 'node:fs';
import pg from 'pg';

async function main() {
  const [mode, portText, file] = process.argv.slice(2);
  const port = Number(portText);
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
