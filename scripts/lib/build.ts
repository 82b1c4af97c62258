// Builds the client only when its sources changed since the last build.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(import.meta.dirname, '../..');
const stampFile = join(root, 'dist', '.client-stamp');
const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json', 'public'];

function walk(path: string, out: string[]) {
  if (!existsSync(path)) return;
  const st = statSync(path);
  if (st.isDirectory()) {
    for (const entry of readdirSync(path).sort()) if (!entry.endsWith('.test.ts') && !entry.endsWith('.test.tsx')) walk(join(path, entry), out);
  } else out.push(`${path}:${st.size}:${st.mtimeMs}`);
}

function sourcesStamp() {
  const files: string[] = [];
  for (const input of inputs) walk(join(root, input), files);
  return createHash('sha256').update(files.join('\n')).digest('hex');
}

export function buildClientIfChanged(opts: { force?: boolean } = {}) {
  const stamp = sourcesStamp();
  const upToDate = existsSync(join(root, 'dist/client/index.html')) && existsSync(stampFile) && readFileSync(stampFile, 'utf8') === stamp;
  if (upToDate && !opts.force) {
    console.log('[porewise] client build is up to date');
    return;
  }
  console.log('[porewise] building the client …');
  execFileSync(join(root, 'node_modules/.bin/vite'), ['build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  writeFileSync(stampFile, stamp);
}
