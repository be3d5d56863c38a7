/**
 * `npm run demo:reset`: wipes the database named by CHARGEWALK_DB (default
 * ./data/chargewalk.db) and loads the invented demo site. No prompt; it refuses
 * while a server is using that database (stop it first), and prints what it did.
 * Take a backup first if the database holds anything you want to keep.
 */
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { dirname } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ConfigError, loadConfig } from '../config';
import { loadDemo } from '../demo';
import { runningServerPid } from '../pidfile';
import { openSqliteStore } from '../store/sqlite';

async function main(): Promise<void> {
  const config = loadConfig(process.env, []);
  const pid = runningServerPid(config.dbPath);
  if (pid !== null) {
    console.error(`chargewalk demo:reset: a chargewalk server (pid ${pid}) is using ${config.dbPathGiven}: stop it first`);
    process.exit(1);
  }
  const existed = existsSync(config.dbPath);
  for (const suffix of ['', '-wal', '-shm']) rmSync(`${config.dbPath}${suffix}`, { force: true });
  mkdirSync(dirname(config.dbPath), { recursive: true });
  const store = openSqliteStore({ path: config.dbPath, synchronous: config.synchronous });
  try {
    const c = await loadDemo(store);
    console.log(`chargewalk demo:reset: ${existed ? 'wiped and reloaded' : 'created'} ${config.dbPathGiven}`);
    console.log(`  invented demo site: ${c.areas} areas, ${c.spots} spots, ${c.meters} meters, ${c.rounds} rounds, ${c.readings} readings, `
      + `${c.corrections} corrections, ${c.tombstones} deleted, ${c.skips} skips`);
  } finally {
    await store.close();
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  main().catch((e: unknown) => {
    console.error(e instanceof ConfigError ? e.message : `chargewalk demo:reset: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  });
}
