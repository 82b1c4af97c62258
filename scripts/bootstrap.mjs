// First step of `npm start` and `npm test`: make sure the dependencies are installed.
// Plain JavaScript on purpose: it runs before TypeScript tooling exists on a fresh clone.
import { execSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';

const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Porewise needs Node.js 20.19 or newer (found ${process.versions.node}).`);
  process.exit(1);
}

const lock = 'package-lock.json';
const installed = 'node_modules/.package-lock.json';

function installedIsCurrent() {
  if (!existsSync(installed) || !existsSync(lock)) return false;
  try {
    const want = JSON.parse(readFileSync(lock, 'utf8')).packages ?? {};
    const have = JSON.parse(readFileSync(installed, 'utf8')).packages ?? {};
    for (const [path, meta] of Object.entries(want)) {
      if (path === '' || meta.optional || meta.peer) continue;
      if (!have[path] || have[path].version !== meta.version) return false;
    }
    return statSync(installed).mtimeMs > 0;
  } catch {
    return false;
  }
}

if (!installedIsCurrent()) {
  const cmd = existsSync(lock) ? 'npm ci --no-audit --no-fund' : 'npm install --no-audit --no-fund';
  console.log(`[porewise] installing dependencies (${cmd}) …`);
  execSync(cmd, { stdio: 'inherit' });
}
