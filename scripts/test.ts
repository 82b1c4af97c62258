// `npm test`: the same set-up as `npm start` (own database), then the whole suite —
// unit, integration over HTTP against PostgreSQL, and end-to-end in headless Chromium.
import { spawnSync, execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { runMigrations } from '../server/db/migrate';
import { runAudit } from './lib/audit';
import { buildClientIfChanged } from './lib/build';
import { databaseUrl, ensureDatabase, startCluster, stopCluster } from './lib/postgres';

const root = resolve(import.meta.dirname, '..');

/**
 * Installs a Debian package (apt-get) when its program is missing: Chromium for the browser
 * tests, poppler-utils (pdftotext, pdfinfo, pdffonts) to read the record PDFs from outside the
 * project, unzip to list the whole-winery export.
 */
function ensureDebianPackage(program: string, pkg: string, name: string, neededFor: string) {
  if (existsSync(program)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`${name} is needed ${neededFor}. Install it with: sudo apt-get install -y ${pkg}`);
  }
  console.log(`[porewise] installing ${name} from Debian packages (apt-get) …`);
  execFileSync('apt-get', ['update'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', pkg], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

async function main() {
  const startedCluster = startCluster();
  let status = 1;
  try {
    ensureDatabase('porewise_test', { fresh: true });
    await runMigrations(databaseUrl('porewise_test'));
    ensureDebianPackage('/usr/bin/chromium', 'chromium', 'Chromium', 'for the browser tests');
    ensureDebianPackage('/usr/bin/pdftotext', 'poppler-utils', 'poppler-utils', 'to check the record PDFs');
    ensureDebianPackage('/usr/bin/unzip', 'unzip', 'unzip', 'for the export tests');
    buildClientIfChanged();
    console.log('[porewise] type-checking and linting …');
    execFileSync(join(root, 'node_modules/.bin/tsc'), ['--noEmit'], { cwd: root, stdio: 'inherit' });
    execFileSync(join(root, 'node_modules/.bin/eslint'), ['.', '--max-warnings=0'], { cwd: root, stdio: 'inherit' });
    const auditOk = runAudit(root);

    const tmp = join(root, '.data', 'tmp');
    rmSync(tmp, { recursive: true, force: true });
    mkdirSync(tmp, { recursive: true });
    const report = join(root, '.data', 'vitest.json');
    rmSync(report, { force: true });
    const extra = process.argv.slice(2);
    const run = spawnSync(
      join(root, 'node_modules/.bin/vitest'),
      ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...extra],
      {
        cwd: root,
        stdio: 'inherit',
        env: { ...process.env, NODE_ENV: 'test', TMPDIR: tmp, POREWISE_TEST_DB_READY: '1' },
      },
    );
    status = run.status ?? 1;
    if (!auditOk && status === 0) {
      console.log('[porewise] the suite passed, but npm audit found high or critical advisories with a fix (see above)');
      status = 1;
    }
    if (existsSync(report)) {
      const { numPassedTests, numFailedTests } = JSON.parse(readFileSync(report, 'utf8'));
      console.log(`\n${numPassedTests} passed, ${numFailedTests} failed`);
    } else {
      console.log('\n0 passed, 1 failed (the test runner did not write its report)');
    }
  } finally {
    if (startedCluster) stopCluster();
  }
  process.exit(status);
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.stack : error}`);
  process.exit(1);
});
