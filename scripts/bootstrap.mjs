// First step of `npm start` and `npm test`: make sure the dependencies are installed.
// Plain JavaScript on purpose: it runs before TypeScript tooling exists on a fresh clone.
import { execSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';

const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Porewise needs Node.js 20.19 or newer (found ${process.versions.node}).`);
  process.exit(1);
}

const lock = 'package-lock.json';
const installed = 'node_modules/.package-lock.json';
const stamp = 'node_modules/.porewise-lock-hash';

function lockHash() {
  return createHash('sha256').update(readFileSync(lock)).digest('hex');
}

// The install is keyed on the lockfile's content: the same lock as at the last install means
// nothing to do. Without a stamp (an install made by hand), compare the packages, ignoring
// entries npm marks extraneous or optional (npm ci never installs those).
function installedIsCurrent() {
  if (!existsSync(installed) || !existsSync(lock)) return false;
  try {
    if (existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === lockHash()) return true;
    const want = JSON.parse(readFileSync(lock, 'utf8')).packages ?? {};
    const have = JSON.parse(readFileSync(installed, 'utf8')).packages ?? {};
    for (const [path, meta] of Object.entries(want)) {
      if (path === '' || meta.optional || meta.peer || meta.extraneous) continue;
      if (!have[path] || have[path].version !== meta.version) return false;
    }
    writeFileSync(stamp, lockHash());
    return true;
  } catch {
    return false;
  }
}

if (!installedIsCurrent()) {
  const cmd = existsSync(lock) ? 'npm ci --no-audit --no-fund' : 'npm install --no-audit --no-fund';
  console.log(`[porewise] installing dependencies (${cmd}) …`);
  execSync(cmd, { stdio: 'inherit' });
  if (existsSync(lock)) writeFileSync(stamp, lockHash());
}
