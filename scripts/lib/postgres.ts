// A private PostgreSQL cluster for this checkout: .data/pg, 127.0.0.1 only, a port derived from
// the checkout path (so two clones on one machine do not collide), TCP only (no Unix socket).
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync, chmodSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

const root = resolve(import.meta.dirname, '../..');
/** POREWISE_PG_DIR moves the cluster elsewhere (a test of `npm start`'s clean stop uses its own). */
const pgDir = process.env.POREWISE_PG_DIR ? resolve(process.env.POREWISE_PG_DIR) : join(root, '.data', 'pg');
const dataDir = join(pgDir, 'data');
const logFile = join(pgDir, 'server.log');
const runnerUser = 'pgrunner';
const isRoot = process.getuid?.() === 0;

function log(message: string) {
  console.log(`[porewise] ${message}`);
}

function findBinDir(): string | null {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(a) - Number(b));
  return versions.length ? join(base, versions[versions.length - 1], 'bin') : null;
}

/** Installs Debian's PostgreSQL server packages when none are present (root only). */
function ensureBinaries(): string {
  let bin = findBinDir();
  if (bin) return bin;
  if (!isRoot) {
    throw new Error(
      'PostgreSQL server binaries were not found. Install them with: sudo apt-get install -y postgresql',
    );
  }
  log('installing PostgreSQL from Debian packages (apt-get) …');
  execFileSync('apt-get', ['update'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', 'postgresql'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  bin = findBinDir();
  if (!bin) throw new Error('PostgreSQL was installed but initdb was not found under /usr/lib/postgresql.');
  return bin;
}

function ensureRunnerUser() {
  const exists = spawnSync('id', ['-u', runnerUser]).status === 0;
  if (!exists) {
    execFileSync('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', runnerUser]);
  }
}

/** The cluster's owner must be able to reach .data/pg: open traversal (x only) on parents that block it. */
function ensureTraversable() {
  let dir = pgDir;
  const chain: string[] = [];
  while (dir !== '/') {
    dir = dirname(dir);
    chain.push(dir);
  }
  for (const d of chain.reverse()) {
    const ok = spawnSync('runuser', ['-u', runnerUser, '--', 'test', '-x', d]).status === 0;
    if (!ok) {
      const mode = statSync(d).mode & 0o777;
      chmodSync(d, mode | 0o001);
      log(`allowed traversal of ${d} for the database user`);
    }
  }
}

/** Runs a PostgreSQL server tool as the cluster's owner. */
function asOwner(bin: string, tool: string, args: string[], opts: { check?: boolean } = {}) {
  const cmd = join(bin, tool);
  const res = isRoot
    ? spawnSync('runuser', ['-u', runnerUser, '--', cmd, ...args], { encoding: 'utf8' })
    : spawnSync(cmd, args, { encoding: 'utf8' });
  if (opts.check !== false && res.status !== 0) {
    throw new Error(`${tool} failed: ${res.stderr || res.stdout}`);
  }
  return res;
}

export function clusterPort(): number {
  if (process.env.PGPORT) return Number(process.env.PGPORT);
  const portFile = join(pgDir, 'port');
  if (existsSync(portFile)) return Number(readFileSync(portFile, 'utf8').trim());
  const hash = createHash('sha256').update(root).digest().readUInt16BE(0);
  return 54330 + (hash % 600);
}

export function databaseUrl(database: string): string {
  return `postgres://postgres@127.0.0.1:${clusterPort()}/${database}`;
}

function isRunning(bin: string): boolean {
  if (!existsSync(join(dataDir, 'PG_VERSION'))) return false;
  return asOwner(bin, 'pg_ctl', ['-D', dataDir, 'status'], { check: false }).status === 0;
}

/**
 * Durable storage: fsync and full-page writes on (a power cut must not corrupt or lose records).
 * The same settings for the app and the test databases: one cluster, no special cases.
 */
function serverOptions(port: number) {
  return `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories='' -c fsync=on -c full_page_writes=on -c max_connections=100`;
}

/** True when this checkout's cluster is running. */
export function clusterIsRunning(): boolean {
  const bin = findBinDir();
  return Boolean(bin) && isRunning(bin!);
}

/** Creates (first time) and starts the cluster. Returns true if this call started it. */
export function startCluster(): boolean {
  const bin = ensureBinaries();
  mkdirSync(pgDir, { recursive: true });
  if (isRoot) {
    ensureRunnerUser();
    ensureTraversable();
  }
  if (!existsSync(join(dataDir, 'PG_VERSION'))) {
    log('creating the private database cluster in .data/pg …');
    mkdirSync(dataDir, { recursive: true });
    if (isRoot) execFileSync('chown', ['-R', runnerUser, pgDir]);
    chmodSync(dataDir, 0o700);
    asOwner(bin, 'initdb', ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    writeFileSync(join(pgDir, 'port'), String(clusterPort()));
  }
  const port = clusterPort();
  if (isRunning(bin)) {
    // A cluster started by an older checkout may still run with fsync off: restart it durable.
    if (psql('postgres', 'SHOW fsync').stdout.trim() === 'off') {
      log('restarting PostgreSQL with fsync and full-page writes on …');
      asOwner(bin, 'pg_ctl', ['-D', dataDir, '-l', logFile, '-m', 'fast', '-w', '-t', '60', '-o', serverOptions(port), 'restart']);
    }
    return false;
  }
  if (isRoot) execFileSync('chown', ['-R', runnerUser, pgDir]);
  asOwner(bin, 'pg_ctl', ['-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', serverOptions(port), 'start']);
  log(`PostgreSQL is running on 127.0.0.1:${port}`);
  return true;
}

export function stopCluster() {
  const bin = findBinDir();
  if (!bin || !isRunning(bin)) return;
  asOwner(bin, 'pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { check: false });
  log('PostgreSQL stopped');
}

/**
 * Restarts the running cluster (`pg_ctl -m fast restart`, same options): every open connection
 * is ended with "terminating connection due to administrator command". Tests use it to prove
 * the server survives a database restart.
 */
export function restartCluster() {
  const bin = ensureBinaries();
  asOwner(bin, 'pg_ctl', ['-D', dataDir, '-l', logFile, '-m', 'fast', '-w', '-t', '60', 'restart']);
}

/** A server setting as the running cluster reports it (e.g. "fsync" → "on"). */
export function clusterSetting(name: string): string {
  if (!/^[a-z_]+$/.test(name)) throw new Error(`bad setting name ${name}`);
  const res = psql('postgres', `SHOW ${name}`);
  if (res.status !== 0) throw new Error(res.stderr);
  return res.stdout.trim();
}

export const backupDir = join(root, '.data', 'backups');

/** `pg_dump` in custom format to `.data/backups/<database>-<UTC time>.dump` (or `file`); returns the path. */
export function backupDatabase(database: string, file?: string): string {
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) throw new Error(`bad database name ${database}`);
  const bin = ensureBinaries();
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  const target = resolve(file ?? join(backupDir, `${database}-${stamp}.dump`));
  mkdirSync(dirname(target), { recursive: true });
  const res = spawnSync(join(bin, 'pg_dump'), ['-h', '127.0.0.1', '-p', String(clusterPort()), '-U', 'postgres', '-Fc', '-f', target, database], { encoding: 'utf8' });
  if (res.status !== 0) throw new Error(`pg_dump failed: ${res.stderr || res.stdout}`);
  return target;
}

/**
 * Restores a custom-format dump into a fresh `database`. An existing database of that name is
 * kept, renamed `<database>_before_restore_<time>` (it must have no open connections: stop
 * Porewise first), so a restore never destroys records. Returns the kept name, if any.
 */
export function restoreDatabase(file: string, database: string): { keptAs: string | null } {
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) throw new Error(`bad database name ${database}`);
  if (!existsSync(file)) throw new Error(`no such backup file: ${file}`);
  const bin = ensureBinaries();
  const exists = psql('postgres', `SELECT 1 FROM pg_database WHERE datname = '${database}'`);
  if (exists.status !== 0) throw new Error(exists.stderr);
  let keptAs: string | null = null;
  if (exists.stdout.trim() === '1') {
    keptAs = `${database}_before_restore_${new Date().toISOString().replace(/\D/g, '').slice(0, 14)}`.slice(0, 63);
    const rename = psql('postgres', `ALTER DATABASE ${database} RENAME TO ${keptAs}`);
    if (rename.status !== 0) throw new Error(`cannot set the current database aside (is Porewise still running? stop it first): ${rename.stderr.trim()}`);
  }
  const create = psql('postgres', `CREATE DATABASE ${database}`);
  if (create.status !== 0) throw new Error(create.stderr);
  const res = spawnSync(
    join(bin, 'pg_restore'),
    ['-h', '127.0.0.1', '-p', String(clusterPort()), '-U', 'postgres', '-d', database, '--no-owner', '--exit-on-error', '--single-transaction', resolve(file)],
    { encoding: 'utf8' },
  );
  if (res.status !== 0) throw new Error(`pg_restore failed: ${res.stderr || res.stdout}`);
  return { keptAs };
}

function psql(database: string, sql: string) {
  const bin = findBinDir()!;
  return spawnSync(join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(clusterPort()), '-U', 'postgres', '-d', database, '-tAc', sql], {
    encoding: 'utf8',
  });
}

/** Creates the database when missing; with `fresh`, drops and recreates it. */
export function ensureDatabase(name: string, opts: { fresh?: boolean } = {}) {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`bad database name ${name}`);
  if (opts.fresh) {
    const drop = psql('postgres', `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    if (drop.status !== 0) throw new Error(drop.stderr);
  }
  const found = psql('postgres', `SELECT 1 FROM pg_database WHERE datname = '${name}'`);
  if (found.status !== 0) throw new Error(found.stderr);
  if (found.stdout.trim() !== '1') {
    const create = psql('postgres', `CREATE DATABASE ${name}`);
    if (create.status !== 0) throw new Error(create.stderr);
  }
}
