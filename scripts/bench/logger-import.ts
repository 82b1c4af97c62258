/**
 * Logger import benchmark: a 100,000-row logger file (semicolons, decimal commas, a date-time
 * in Europe/Vienna, a totaliser in hL, pressures in psi, °F) imported into a run's stage through
 * the same service the API route calls: papaparse streaming into the row reader, then the runs'
 * chunked bulk insert in one transaction and the file kept (in memory here, not S3). Prints rows
 * per second for the whole import and for its parts (reading the file; storing the rows), so
 * the share of each is a ratio on this machine. Each round imports a new file into a new
 * stretch of the run (a fresh fingerprint), three rounds, the median.
 *
 * It uses its own database (porewise_bench_logger, recreated each run) in the worktree's cluster.
 */
import os from 'node:os';
import { sql } from 'drizzle-orm';
import { createDatabase } from '../../server/db/client';
import { runMigrations } from '../../server/db/migrate';
import { demoWineries, runSeed } from '../../server/db/seed';
import type { Storage } from '../../server/lib/storage';
import type { TenantContext } from '../../server/middleware/authorize';
import { createLoggerService, readLoggerFile, decodeLoggerFile } from '../../server/modules/logger/logger.service';
import { createRunsService } from '../../server/modules/runs/runs.service';
import { loggerMappingSchema } from '../../shared/schemas/logger';
import { databaseUrl, ensureDatabase, startCluster } from '../lib/postgres';

const DB = 'porewise_bench_logger';
const ROWS = 100_000;
const ROUNDS = 3;

const mapping = loggerMappingSchema.parse({
  delimiter: ';',
  decimal: ',',
  timeZone: 'Europe/Vienna',
  time: { column: 'Datum/Zeit', format: 'DD.MM.YYYY HH:mm:ss' },
  volume: { column: 'Zähler hL', unit: 'hL', kind: 'totaliser' },
  upstream: { column: 'P vor (psi)', unit: 'psi' },
  downstream: { column: 'P nach (psi)', unit: 'psi' },
  temp: { column: 'Temp °F', unit: 'degF' },
});

/** A logger file of `ROWS` rows, one a second from `startMs`; `salt` makes each round's file (and fingerprint) its own. */
function loggerFile(startMs: number, salt: number): Uint8Array {
  const p2 = (n: number) => String(n).padStart(2, '0');
  const comma = (n: number, d: number) => n.toFixed(d).replace('.', ',');
  const lines = [`Gerät;DL-7 Bench;Lauf ${String(salt)}`, 'Datum/Zeit;Zähler hL;P vor (psi);P nach (psi);Temp °F'];
  for (let i = 0; i < ROWS; i++) {
    const d = new Date(startMs + i * 1000);
    // wall-clock digits of the instant read as UTC: the mapping says Vienna, so every row is one zone conversion
    const stamp = `${p2(d.getUTCDate())}.${p2(d.getUTCMonth() + 1)}.${String(d.getUTCFullYear())} ${p2(d.getUTCHours())}:${p2(d.getUTCMinutes())}:${p2(d.getUTCSeconds())}`;
    lines.push(`${stamp};${comma(1000 + i * 0.01, 2)};${comma(20 + i / 20_000, 3)};14,5;${comma(50 + (i % 7) / 10, 1)}`);
  }
  return new TextEncoder().encode(lines.join('\r\n'));
}

const memoryStorage = (): Storage => {
  const objects = new Map<string, Uint8Array>();
  return {
    ensureBucket: async () => {},
    put: async (key, body) => void objects.set(key, body),
    get: async (key) => ({ body: objects.get(key) ?? new Uint8Array(), contentType: 'text/csv' }),
    remove: async (key) => void objects.delete(key),
  };
};

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const rate = (ms: number) => `${Math.round(ROWS / (ms / 1000)).toLocaleString('en-US')} rows/s`;

export async function report() {
  console.log(`  ${ROWS.toLocaleString('en-US')}-row logger file (European CSV, totaliser in hL, psi, °F, Europe/Vienna), through the import service`);
  startCluster();
  ensureDatabase(DB, { fresh: true });
  const url = databaseUrl(DB);
  await runMigrations(url);
  await runSeed(url);
  const { db, pool } = createDatabase(url, { max: 4 });
  try {
    const wineryId = demoWineries.quillwater.id;
    await db.execute(sql`update plans set status = 'approved', approved_at = now() where winery_id = ${wineryId}::uuid`);
    const owner = (await db.execute(sql`select u.id, u.name from memberships m join users u on u.id = m.user_id where m.winery_id = ${wineryId}::uuid and m.role = 'owner' limit 1`)).rows[0] as { id: string; name: string };
    const tenant: TenantContext = { wineryId, role: 'owner', userId: owner.id, userName: owner.name };
    const runs = createRunsService(db);
    const option = (await runs.startOptions(tenant)).items[0];
    if (!option) throw new Error('the demo has no approved lot to run');
    const runId = option.runningRunId ?? (await runs.start(tenant, { planLotId: option.planLotId })).id;
    const service = createLoggerService({ db, storage: memoryStorage() });

    const parse: number[] = [];
    const whole: number[] = [];
    for (let round = 0; round < ROUNDS; round++) {
      const file = loggerFile(Date.UTC(2026, 2, 14 + round, 6, 0, 0), round);
      const t0 = performance.now();
      const read = readLoggerFile(decodeLoggerFile(file), mapping);
      parse.push(performance.now() - t0);
      if (read.errorCount > 0) throw new Error(`bench file has errors: ${read.errors[0]?.message ?? ''}`);
      const t1 = performance.now();
      const result = await service.importFile(tenant, runId, { buffer: file, originalName: `bench-${String(round)}.csv` }, { stageIndex: 0, mapping }, { dryRun: false });
      whole.push(performance.now() - t1);
      if (!('imported' in result) || result.imported !== ROWS) throw new Error(`imported ${JSON.stringify(result)}`);
    }
    const p = median(parse);
    const w = median(whole);
    const store = Math.max(w - p, 1);
    console.log(`  whole import      ${(w / 1000).toFixed(2)} s   ${rate(w)}   (median of ${String(ROUNDS)}; aim: under 5 s)`);
    console.log(`  reading the file  ${(p / 1000).toFixed(2)} s   ${rate(p)}   → ${((p / w) * 100).toFixed(0)} % of the import`);
    const load = os.loadavg()[0];
    console.log(`  storing the rows  ${(store / 1000).toFixed(2)} s   ${rate(store)}   → ${((store / w) * 100).toFixed(0)} % (bulk insert, keys, attachment, change log)`);
    console.log(`  (machine load average ${load.toFixed(1)} on ${String(os.cpus().length)} cores while measuring)`);
  } finally {
    await pool.end();
  }
}
