// `npm test`: the same set-up as `npm start` (own database), then the whole suite —
// unit, integration over HTTP against PostgreSQL, and end-to-end in headless Chromium.
import { execFileSync, spawn } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
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
  stopLanesOnSignal(() => {
    if (startedCluster) stopCluster();
  });
  let status = 1;
  let lanes: Lane[] = [];
  try {
    await prepareTestDatabase({ fresh: true });
    ensureDebianPackage('/usr/bin/chromium', 'chromium', 'Chromium', 'for the browser tests');
    ensureDebianPackage('/usr/bin/pdftotext', 'poppler-utils', 'poppler-utils', 'to check the record PDFs');
    ensureDebianPackage('/usr/bin/unzip', 'unzip', 'unzip', 'for the export tests');
    buildClientIfChanged();

    const tmp = join(root, '.data', 'tmp');
    rmSync(tmp, { recursive: true, force: true });
    mkdirSync(tmp, { recursive: true });
    const env = { ...process.env, NODE_ENV: 'test', TMPDIR: tmp, POREWISE_TEST_DB_READY: '1' };
    const extra = process.argv.slice(2);

    // Two lanes start as soon as the client is built, beside the type check and lint:
    // the browser tests, and the unit and API tests (much of either is waiting on a browser, the
    // database or the job queue, so two cores keep up). They share the test database: every test
    // file signs up its own wineries, and each test app has its own job-queue schema, mail server
    // and rate-limit counters, so neither lane sees the other's data.
    const e2eLog = join(root, '.data', 'vitest-e2e.log');
    if (!extra.length) {
      console.log(`[porewise] the browser tests run beside the others; their output follows at the end (as it happens: ${e2eLog})`);
      lanes.push(startVitest('e2e', ['--project', 'e2e'], { ...env, FORCE_COLOR: process.stdout.isTTY ? '1' : '0' }, e2eLog));
      lanes.push(startVitest('main', ['--project', 'shared', '--project', 'client', '--project', 'server'], env));
    }
    console.log('[porewise] type-checking and linting …');
    // Not execFileSync: while the lanes run, this process must stay free to pass on a Ctrl-C.
    await runTool('tsc', ['--noEmit']);
    await runTool('eslint', ['.', '--max-warnings=0']);

    let results: LaneResult[];
    if (extra.length) {
      // Arguments after `npm test --` (a file, a project) go to one plain vitest run.
      results = [await startVitest('all', extra, env).done];
    } else {
      const [e2e, others] = await Promise.all(lanes.map((lane) => lane.done));
      lanes = [];
      console.log('\n[porewise] browser tests (e2e):');
      process.stdout.write(readFileSync(e2eLog, 'utf8'));
      // The faults last and alone: they restart the database cluster and stop servers.
      const faults = await startVitest('faults', ['--project', 'faults'], env).done;
      results = [others, e2e, faults];
    }
    status = results.every((r) => r.status === 0) ? 0 : 1;
    writeMergedReport(results);
    // After the tests: the audit waits for the registry without holding anything up.
    const auditOk = runAudit(root);
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
    // A failed type check or lint ends the run: the test lanes stop with it.
    await Promise.all(lanes.map((lane) => lane.stop()));
    if (startedCluster) stopCluster();
  }
  process.exit(status);
}

/** Runs a tool from node_modules/.bin with the terminal as its output; rejects when it fails. */
function runTool(tool: string, args: string[]): Promise<void> {
  const child = spawn(join(root, 'node_modules/.bin', tool), args, { cwd: root, stdio: ['ignore', 'inherit', 'inherit'] });
  return new Promise((resolvePromise, reject) => {
    child.on('error', reject);
    child.on('close', (code, signal) => (code === 0 ? resolvePromise() : reject(new Error(`${tool} ${args.join(' ')} failed (${signal ?? `exit code ${code}`})`))));
  });
}

type VitestReport = { numPassedTests: number; numFailedTests: number; numTotalTests: number; success: boolean; startTime: number; testResults: unknown[] } & Record<string, unknown>;
type LaneResult = { name: string; status: number; report: VitestReport | null };
type Lane = { done: Promise<LaneResult>; stop(signal?: NodeJS.Signals): Promise<LaneResult> };

/**
 * Starts one `vitest run` with its own JSON report (.data/vitest-<name>.json). With `logFile`,
 * its output goes straight to that file (the caller prints it when the run is done).
 */
function startVitest(name: string, args: string[], env: NodeJS.ProcessEnv, logFile?: string): Lane {
  const report = join(root, '.data', `vitest-${name}.json`);
  rmSync(report, { force: true });
  const log = logFile ? openSync(logFile, 'w') : null;
  // Its own process group, so stopping the run ends its workers too (a worker left behind would
  // go on testing, Chromium with it); Ctrl-C reaches the group through stopLanesOnSignal.
  const child = spawn(join(root, 'node_modules/.bin/vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...args], {
    cwd: root,
    env,
    stdio: log === null ? ['ignore', 'inherit', 'inherit'] : ['ignore', log, log],
    detached: true,
  });
  if (log !== null) closeSync(log);
  const done = new Promise<LaneResult>((resolvePromise) => {
    child.on('close', (code) => {
      const parsed = existsSync(report) ? (JSON.parse(readFileSync(report, 'utf8')) as VitestReport) : null;
      resolvePromise({ name, status: code ?? 1, report: parsed });
    });
  });
  const lane: Lane = {
    done,
    stop(signal = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) {
        try {
          process.kill(-child.pid!, signal);
        } catch {
          // the group has already gone
        }
      }
      return done;
    },
  };
  running.add(lane);
  void done.then(() => running.delete(lane));
  return lane;
}

/** The vitest runs under way, for a signal to stop. */
const running = new Set<Lane>();

/** Ctrl-C (or a SIGTERM) to `npm test` stops every vitest run, then the cluster it started. */
function stopLanesOnSignal(onStopped: () => void) {
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.once(signal, () => {
      void Promise.all([...running].map((lane) => lane.stop(signal))).then(() => {
        onStopped();
        process.exit(130);
      });
    });
  }
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
