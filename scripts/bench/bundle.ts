/**
 * Client bundle sizes per route: what a first visit to each page downloads before it can
 * paint (the entry chunk and the route's chunk, with every chunk they import statically;
 * chunks loaded later with import() are listed apart), raw, gzip and brotli as the server's
 * compression middleware sends them. Builds the client into .data/bench-client (or reads
 * BENCH_CLIENT_DIR, a build made with --manifest).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

type Chunk = { file: string; imports?: string[]; dynamicImports?: string[]; css?: string[]; isEntry?: boolean };

const routes: [string, string][] = [
  ['sign-in', 'src/app/routes/auth/sign-in.tsx'],
  ['Today', 'src/app/routes/app/today.tsx'],
  ['cartridges', 'src/app/routes/app/cartridges.tsx'],
  ['cartridge', 'src/app/routes/app/cartridge.tsx'],
  ['cellar', 'src/app/routes/app/cellar.tsx'],
  ['plan', 'src/app/routes/app/plan.tsx'],
  ['runs', 'src/app/routes/app/runs.tsx'],
  ['run', 'src/app/routes/app/run.tsx'],
  ['care', 'src/app/routes/app/care.tsx'],
];

export async function report() {
  let dir = process.env.BENCH_CLIENT_DIR;
  if (!dir) {
    dir = path.join(root, '.data', 'bench-client');
    execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', dir, '--emptyOutDir', '--manifest', '--logLevel', 'error'], { cwd: root, stdio: 'inherit' });
  }
  const manifestFile = [path.join(dir, '.vite', 'manifest.json'), path.join(dir, 'manifest.json')].find((f) => existsSync(f));
  if (!manifestFile) {
    console.log(`  no manifest in ${dir}; build with --manifest`);
    return;
  }
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Record<string, Chunk>;
  const sizes = new Map<string, { raw: number; gz: number; br: number }>();
  const sizeOf = (file: string) => {
    let s = sizes.get(file);
    if (!s) {
      const buf = readFileSync(path.join(dir, file));
      s = { raw: buf.length, gz: gzipSync(buf).length, br: brotliCompressSync(buf, { params: { [constants.BROTLI_PARAM_QUALITY]: 4 } }).length };
      sizes.set(file, s);
    }
    return s;
  };
  const closure = (keys: string[]) => {
    const seen = new Set<string>();
    const visit = (k: string) => {
      if (seen.has(k) || !manifest[k]) return;
      seen.add(k);
      for (const i of manifest[k].imports ?? []) visit(i);
    };
    keys.forEach(visit);
    return seen;
  };
  const entry = Object.keys(manifest).find((k) => manifest[k].isEntry)!;
  const kb = (n: number) => (n / 1024).toFixed(1).padStart(6);
  console.log('  JavaScript a first visit loads before the page paints, KB (raw / gzip / brotli q4); then what it loads later');
  for (const [name, key] of routes) {
    if (!manifest[key]) {
      console.log(`  ${name.padEnd(11)} (no chunk for ${key})`);
      continue;
    }
    const first = closure([entry, key]);
    const total = { raw: 0, gz: 0, br: 0 };
    for (const k of first) {
      const s = sizeOf(manifest[k].file);
      total.raw += s.raw;
      total.gz += s.gz;
      total.br += s.br;
    }
    // Chunks the route imports dynamically (its lazy parts), beyond what it already has.
    const later = closure((manifest[key].dynamicImports ?? []).filter((k) => !first.has(k)));
    let laterGz = 0;
    for (const k of later) if (!first.has(k)) laterGz += sizeOf(manifest[k].file).gz;
    const heavy = [...first]
      .map((k) => ({ k, gz: sizeOf(manifest[k].file).gz }))
      .sort((a, b) => b.gz - a.gz)
      .slice(0, 3)
      .map(({ k, gz }) => `${path.basename(manifest[k].file).replace(/-[\w-]{8}\.js$/, '')} ${(gz / 1024).toFixed(0)}`)
      .join(', ');
    console.log(
      `  ${name.padEnd(11)} ${kb(total.raw)} / ${kb(total.gz)} / ${kb(total.br)}   later ${kb(laterGz)} gz   (largest: ${heavy})`,
    );
  }
}
