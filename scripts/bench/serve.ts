/**
 * A server process for the HTTP benchmark (scripts/bench/http.ts), so the load generator never
 * shares an event loop with what it measures.
 *   tsx scripts/bench/serve.ts app  <port>          — Porewise, as `npm start` runs it (logging on)
 *   tsx scripts/bench/serve.ts bare <port> <file>   — a bare Express 5 app answering each path
 *                                                     in <file> ({ "/api/x": body }) with that JSON
 * Prints "ready" on stdout once listening.
 */
import express from 'express';
import { readFileSync } from 'node:fs';

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
