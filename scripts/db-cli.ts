// `npm run db:stop | db:migrate | db:seed | db:backup | db:restore FILE` — database chores.
import { backupDatabase, databaseUrl, ensureDatabase, restoreDatabase, startCluster, stopCluster } from './lib/postgres';

const [command, ...rest] = process.argv.slice(2);

/** `--database NAME` (default porewise); the remaining arguments are positional. */
function options(args: string[]) {
  const positional: string[] = [];
  let database = 'porewise';
  for (let i = 0; i < args.length; i += 1) {
    if (args[i] === '--database') database = args[++i] ?? database;
    else positional.push(args[i]);
  }
  return { database, positional };
}

async function main() {
  if (command === 'stop') return stopCluster();
  startCluster();
  const { database, positional } = options(rest);
  if (command === 'backup') {
    const file = backupDatabase(database, positional[0]);
    console.log(`[porewise] backup of ${database} written to ${file}`);
    return;
  }
  if (command === 'restore') {
    if (!positional[0]) throw new Error('usage: npm run db:restore -- FILE [--database NAME]');
    const { keptAs } = restoreDatabase(positional[0], database);
    console.log(`[porewise] ${positional[0]} restored into a fresh database ${database}`);
    if (keptAs) console.log(`[porewise] the previous ${database} is kept as ${keptAs} (drop it when you no longer need it)`);
    return;
  }
  ensureDatabase('porewise');
  process.env.DATABASE_URL ??= databaseUrl('porewise');
  if (command === 'migrate') {
    const { runMigrations } = await import('../server/db/migrate');
    await runMigrations(process.env.DATABASE_URL);
  } else if (command === 'seed') {
    const { runSeed } = await import('../server/db/seed');
    await runSeed(process.env.DATABASE_URL);
  } else {
    console.error('usage: tsx scripts/db-cli.ts stop | migrate | seed | backup [FILE] | restore FILE  [--database NAME]');
    process.exitCode = 1;
  }
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
