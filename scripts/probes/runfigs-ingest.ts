// What the stored run figures' trigger costs a single reading's INSERT … ON CONFLICT: the same
// bare statement timed with the statement trigger on and off, taking turns (run after
// `npm run bench -- http`, on its database; prints ratios, changes nothing it does not undo).
import pg from 'pg';
import { databaseUrl } from '../lib/postgres';

const N = 100;
const client = new pg.Client({ connectionString: databaseUrl('porewise_bench') });
await client.connect();
const run = (await client.query(`select id, winery_id from runs where status = 'running' order by reading_count desc limit 1`)).rows[0] as { id: string; winery_id: string };
let k = 0;
async function round(): Promise<number> {
  const t0 = performance.now();
  for (let i = 0; i < N; i++) {
    await client.query(
      `insert into run_readings (winery_id, run_id, stage_index, at, volume_l, upstream_bar, downstream_bar, client_key)
       values ($1, $2, 0, now(), 1, 1.2, 1, $3) on conflict (run_id, client_key) do nothing`,
      [run.winery_id, run.id, `probe-${String(++k)}`],
    );
  }
  return (performance.now() - t0) / N;
}
const on: number[] = [];
const off: number[] = [];
for (let r = 0; r < 16; r++) {
  on.push(await round());
  await client.query(`alter table run_readings disable trigger run_readings_figures_insert`);
  off.push(await round());
  await client.query(`alter table run_readings enable trigger run_readings_figures_insert`);
}
await client.query(`delete from run_readings where run_id = $1 and client_key like 'probe-%'`, [run.id]);
const med = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`single INSERT … ON CONFLICT, median of 16 rounds of ${String(N)}: with the trigger ${med(on).toFixed(3)} ms, without ${med(off).toFixed(3)} ms → ${(med(off) / med(on) * 100).toFixed(0)} % of the bare rate`);
await client.end();
