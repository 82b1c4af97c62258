/**
 * `npm run bench`: runs every benchmark module in scripts/bench/*.ts and prints the
 * median and 90th-percentile time per call of each case, with the machine it ran on.
 *
 * A module exports
 *   export const cases: { name: string; run: () => unknown; warmup?: number; iterations?: number }[]
 * and may export `external` comparisons: the same data written to a JSON file in .data/
 * and timed by another program (e.g. a Python/scipy script), printed beside the case it
 * is compared to. A missing interpreter or library prints a note and the run carries on.
 * A module may instead (or also) export `report(): Promise<void>`, which measures and prints
 * on its own (the HTTP and bundle benchmarks: servers, load, sizes).
 * `npm run bench -- http bundle` runs only the modules whose file names contain those words.
 * This is a benchmark, not a test: nothing fails on a slow machine.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

type Case = { name: string; run: () => unknown; warmup?: number; iterations?: number };
type External = {
  name: string;
  compareTo?: string;
  command: string[];
  input: () => unknown;
  reference?: () => Record<string, Record<string, number>>;
};

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const benchDir = path.join(root, 'scripts', 'bench');
const dataDir = path.join(root, '.data');

const fmt = (ms: number) => (ms >= 100 ? ms.toFixed(0) : ms >= 10 ? ms.toFixed(1) : ms >= 1 ? ms.toFixed(2) : ms.toFixed(3));

function quantile(sorted: number[], q: number): number {
  if (sorted.length === 0) return NaN;
  const pos = (sorted.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return sorted[lo] + (sorted[hi] - sorted[lo]) * (pos - lo);
}

let sink: unknown;

function time(c: Case): { median: number; p90: number; n: number } {
  const warmup = c.warmup ?? 50;
  for (let i = 0; i < warmup; i++) sink = c.run();
  // default: as many calls as fit in about one second, between 20 and 1000
  let iterations = c.iterations;
  if (iterations === undefined) {
    const t0 = performance.now();
    sink = c.run();
    const one = Math.max(performance.now() - t0, 1e-3);
    iterations = Math.min(1000, Math.max(20, Math.round(1000 / one)));
  }
  const times = new Array<number>(iterations);
  for (let i = 0; i < iterations; i++) {
    const t0 = performance.now();
    sink = c.run();
    times[i] = performance.now() - t0;
  }
  times.sort((a, b) => a - b);
  return { median: quantile(times, 0.5), p90: quantile(times, 0.9), n: iterations };
}

function runExternal(ext: External, slug: string): { median: number; p90: number; info: string; fits?: Record<string, Record<string, number>> } | string {
  mkdirSync(dataDir, { recursive: true });
  const file = path.join(dataDir, `bench-${slug}-${process.pid}.json`);
  writeFileSync(file, JSON.stringify(ext.input()));
  try {
    const [cmd, ...args] = ext.command;
    const r = spawnSync(cmd, [...args, file], { cwd: root, encoding: 'utf8', timeout: 300_000 });
    if (r.error) return `not run: ${cmd} is not available (${r.error.message})`;
    if (r.status !== 0) {
      const msg = (r.stderr || r.stdout || '').trim().split('\n').slice(-1)[0] ?? '';
      return `not run: ${cmd} exited with status ${String(r.status)}${msg ? ` (${msg})` : ''}`;
    }
    const out = JSON.parse(r.stdout.trim().split('\n').slice(-1)[0]) as {
      median_ms: number;
      p90_ms: number;
      repeats: number;
      scipy?: string;
      numpy?: string;
      fits?: Record<string, Record<string, number>>;
    };
    const info = [out.scipy && `scipy ${out.scipy}`, out.numpy && `numpy ${out.numpy}`, `${String(out.repeats)} runs`]
      .filter(Boolean)
      .join(', ');
    return { median: out.median_ms, p90: out.p90_ms, info, fits: out.fits };
  } catch (e) {
    return `not run: ${(e as Error).message}`;
  } finally {
    rmSync(file, { force: true });
  }
}

async function main(): Promise<void> {
  const cpus = os.cpus();
  console.log('Porewise benchmarks');
  console.log(`  CPU     ${cpus[0]?.model ?? 'unknown'} × ${String(cpus.length)} (${os.arch()})`);
  console.log(`  Node    ${process.version} on ${os.platform()} ${os.release()}`);
  console.log(`  Memory  ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB`);
  console.log('');

  const only = process.argv.slice(2).filter((a) => !a.startsWith('-'));
  const files = readdirSync(benchDir)
    .filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts') && !f.endsWith('.d.ts') && f !== 'serve.ts')
    .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
    .sort();
  const medians = new Map<string, number>();
  for (const f of files) {
    const mod = (await import(pathToFileURL(path.join(benchDir, f)).href)) as { cases?: Case[]; external?: External[]; report?: () => Promise<void> };
    if (typeof mod.report === 'function') {
      console.log(`${f}`);
      await mod.report();
      console.log('');
    }
    if (!Array.isArray(mod.cases)) {
      if (typeof mod.report !== 'function') console.log(`${f}: no \`cases\` export, skipped`);
      continue;
    }
    console.log(`${f}`);
    for (const c of mod.cases) {
      const r = time(c);
      medians.set(c.name, r.median);
      console.log(`  ${c.name}\n    median ${fmt(r.median)} ms   p90 ${fmt(r.p90)} ms   (${String(r.n)} calls)`);
    }
    for (const [i, ext] of (mod.external ?? []).entries()) {
      const slug = `${path.basename(f, '.ts')}-${String(i)}`;
      const r = runExternal(ext, slug);
      console.log(`  ${ext.name}`);
      if (typeof r === 'string') {
        console.log(`    ${r}; carrying on`);
        continue;
      }
      const ours = ext.compareTo ? medians.get(ext.compareTo) : undefined;
      const ratio = ours ? `   → TypeScript is ${(r.median / ours).toFixed(1)}× faster` : '';
      console.log(`    median ${fmt(r.median)} ms   p90 ${fmt(r.p90)} ms   (${r.info})${ratio}`);
      if (r.fits && ext.reference) {
        const ref = ext.reference();
        const diffs = Object.entries(r.fits).map(([law, p]) => {
          const q = ref[law];
          if (!q) return `${law} ?`;
          const dK = Math.abs(p.kPerL / q.kPerL - 1);
          const dRss = (q.rss - p.rss) / p.rss;
          return `${law} ΔK ${dK.toExponential(1)}, RSS ours−scipy ${dRss >= 0 ? '+' : ''}${dRss.toExponential(1)}`;
        });
        console.log(`    agreement: ${diffs.join('; ')}`);
      }
    }
    console.log('');
  }
  void sink;
}

main().then(
  () => process.exit(0),
  (e: unknown) => {
    console.error(e);
    process.exit(1);
  },
);
