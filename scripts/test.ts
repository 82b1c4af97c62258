// `npm test`: the same set-up as `npm start` (own database), then the whole suite —
// unit, integration over HTTP against PostgreSQL, and end-to-end in headless Chromium.
import { execFileSync, spawn } from 'node:child_process';
import { createWriteStream, existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { runAudit } from './lib/audit';
import { buildClientIfChanged } from './lib/build';
import { prepareTestDatabase } from '../tests/setup/test-database';
import { startCluster, stopCluster } from './lib/postgres';

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
    await prepareTestDatabase({ fresh: true });
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
    const env = { ...process.env, NODE_ENV: 'test', TMPDIR: tmp, POREWISE_TEST_DB_READY: '1' };
    const extra = process.argv.slice(2);
    // Arguments after `npm test --` (a file, a project) go to one plain vitest run.
    const results = extra.length ? [await runVitest('all', extra, env)] : await runLanes(env);
    status = results.every((r) => r.status === 0) ? 0 : 1;
    writeMergedReport(results);
    if (!auditOk && status === 0) {
      console.log('[porewise] the suite passed, but npm audit found high or critical advisories with a fix (see above)');
      status = 1;
    }
    const passed = results.reduce((n, r) => n + (r.report?.numPassedTests ?? 0), 0);
    const failed = results.reduce((n, r) => n + (r.report?.numFailedTests ?? 0), 0);
    const missing = results.filter((r) => !r.report).map((r) => r.name);
    if (missing.length) console.log(`\n[porewise] no test report from: ${missing.join(', ')} (the test runner stopped early)`);
    console.log(`\n${passed} passed, ${failed + missing.length} failed`);
  } finally {
    if (startedCluster) stopCluster();
  }
  process.exit(status);
}

type VitestReport = { numPassedTests: number; numFailedTests: number; numTotalTests: number; success: boolean; startTime: number; testResults: unknown[] } & Record<string, unknown>;
type LaneResult = { name: string; status: number; report: VitestReport | null };

/**
 * One `vitest run` with its own JSON report (.data/vitest-<name>.json). With `logFile`, its
 * output goes to that file instead of the terminal (printed by the caller when it is done).
 */
function runVitest(name: string, args: string[], env: NodeJS.ProcessEnv, logFile?: string): Promise<LaneResult> {
  const report = join(root, '.data', `vitest-${name}.json`);
  rmSync(report, { force: true });
  const child = spawn(join(root, 'node_modules/.bin/vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...args], {
    cwd: root,
    env,
    stdio: logFile ? ['ignore', 'pipe', 'pipe'] : 'inherit',
  });
  const out = logFile ? createWriteStream(logFile) : null;
  if (out) {
    child.stdout!.pipe(out, { end: false });
    child.stderr!.pipe(out, { end: false });
  }
  return new Promise((resolvePromise) => {
    child.on('close', (code) => {
      const parsed = existsSync(report) ? (JSON.parse(readFileSync(report, 'utf8')) as VitestReport) : null;
      const result = { name, status: code ?? 1, report: parsed };
      // 'close' comes after the child's output ended; the log file is whole once its stream finishes.
      if (out) out.end(() => resolvePromise(result));
      else resolvePromise(result);
    });
  });
}

/**
 * The suite in lanes. The browser tests (mostly waiting on Chromium and the app) and the rest
 * (unit tests, then the API tests, one file at a time) run side by side in two vitest processes:
 * on two cores that takes little more than the browser tests alone. They share the test database;
 * every test file signs up its own wineries and its app gets its own job-queue schema, mail
 * server and rate-limit counters, so neither lane sees the other's data. The faults come last
 * and alone: they restart the database cluster and stop servers.
 */
async function runLanes(env: NodeJS.ProcessEnv): Promise<LaneResult[]> {
  const e2eLog = join(root, '.data', 'vitest-e2e.log');
  console.log(`[porewise] the browser tests run alongside the others; their output follows theirs (as it happens: ${e2eLog})`);
  const browser = runVitest('e2e', ['--project', 'e2e'], { ...env, FORCE_COLOR: process.stdout.isTTY ? '1' : '0' }, e2eLog);
  const others = await runVitest('main', ['--project', 'shared', '--project', 'client', '--project', 'server'], env);
  const e2e = await browser;
  console.log('\n[porewise] browser tests (e2e):');
  process.stdout.write(readFileSync(e2eLog, 'utf8'));
  const faults = await runVitest('faults', ['--project', 'faults'], env);
  return [others, e2e, faults];
}

/** .data/vitest.json: the lanes' JSON reports as one (counts summed, test files listed together). */
function writeMergedReport(results: LaneResult[]) {
  const reports = results.map((r) => r.report).filter((r): r is VitestReport => r !== null);
  const target = join(root, '.data', 'vitest.json');
  rmSync(target, { force: true });
  if (!reports.length) return;
  const merged: Record<string, unknown> = { ...reports[0] };
  for (const key of Object.keys(reports[0])) {
    if (key.startsWith('num') && typeof reports[0][key] === 'number') merged[key] = reports.reduce((n, r) => n + ((r[key] as number) ?? 0), 0);
  }
  merged.startTime = Math.min(...reports.map((r) => r.startTime));
  merged.success = results.every((r) => r.status === 0 && r.report?.success);
  merged.testResults = reports.flatMap((r) => r.testResults);
  writeFileSync(target, JSON.stringify(merged));
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.stack : error}`);
  process.exit(1);
});
