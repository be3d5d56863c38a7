/**
 * `npm run restore -- <backup file>`: puts a backup in place of CHARGEWALK_DB.
 *
 * Stop the server first: restore refuses while a server is using the database
 * (it writes <database>.pid while it runs; a pid file left by a killed server is
 * ignored). Steps: integrity_check of the backup and a check that its migrations
 * are known to this version; the current database is checkpointed and kept as
 * <database>.before-restore (or .before-restore-<time> when that exists already);
 * the backup is copied in beside it and renamed into place (atomic), stale -wal
 * and -shm files removed; then the restored file is opened, checked and migrated
 * like at server start.
 */
import Database from 'better-sqlite3';
import { copyFileSync, existsSync, renameSync, rmSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ConfigError, loadConfig } from '../config';
import { runningServerPid } from '../pidfile';
import { StoreStartupError } from '../store/errors';
import { openSqliteStore } from '../store/sqlite';
import { checkMigrationHistory } from '../store/sqlite/migrate';
import { integrityCheck } from './backup';

export interface RestoreResult {
  restored: string;
  keptAs: string | null;
  readings: number;
}

function stamp(): string {
  return new Date().toISOString().replace(/[-:]/g, '').replace('T', '-').slice(0, 15);
}

function moveAside(path: string, to: string): void {
  if (existsSync(path)) renameSync(path, to);
}

export async function restoreDatabase(backup: string, dbPath: string): Promise<RestoreResult> {
  if (!existsSync(backup) || !statSync(backup).isFile()) throw new Error(`no backup file at ${backup}`);
  if (resolve(backup) === resolve(dbPath)) throw new Error('the backup is the database itself');
  const pid = runningServerPid(dbPath);
  if (pid !== null) throw new Error(`a chargewalk server (pid ${pid}) is using ${dbPath}: stop it first, then restore`);

  let integrity: string;
  try {
    integrity = integrityCheck(backup);
  } catch (e) {
    throw new Error(`${backup} is not a readable SQLite database (${(e as Error).message})`);
  }
  if (integrity !== 'ok') throw new Error(`${backup} fails its integrity check (${integrity}); not restored`);
  const check = new Database(backup, { readonly: true, fileMustExist: true });
  try {
    if (!check.prepare("SELECT 1 FROM sqlite_master WHERE name = 'schema_migrations'").get()) {
      throw new Error(`${backup} is not a chargewalk database (no schema_migrations table)`);
    }
    checkMigrationHistory(check, backup);
  } finally {
    check.close();
  }

  // Keep the current database: fold its WAL in, then move it aside.
  let keptAs: string | null = null;
  if (existsSync(dbPath)) {
    try {
      const cur = new Database(dbPath, { fileMustExist: true });
      cur.pragma('busy_timeout = 5000');
      cur.pragma('wal_checkpoint(TRUNCATE)');
      cur.close();
    } catch {
      // a damaged current file is kept as it is, with its -wal beside it
    }
    keptAs = existsSync(`${dbPath}.before-restore`) ? `${dbPath}.before-restore-${stamp()}` : `${dbPath}.before-restore`;
    moveAside(dbPath, keptAs);
    moveAside(`${dbPath}-wal`, `${keptAs}-wal`);
    rmSync(`${dbPath}-shm`, { force: true });
  }
  const incoming = `${dbPath}.restoring`;
  copyFileSync(backup, incoming);
  rmSync(`${dbPath}-wal`, { force: true });
  rmSync(`${dbPath}-shm`, { force: true });
  renameSync(incoming, dbPath);

  const store = openSqliteStore({ path: dbPath, check: 'full' });
  const readings = (store.db.prepare('SELECT count(*) AS n FROM readings').get() as { n: number }).n;
  await store.close();
  return { restored: dbPath, keptAs, readings };
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  if (args.length !== 1 || args[0]!.startsWith('-')) {
    console.error('usage: npm run restore -- <backup file>   (stop the server first)');
    process.exit(2);
  }
  const config = loadConfig(process.env, []);
  const r = await restoreDatabase(resolve(args[0]!), config.dbPath);
  console.log(`chargewalk restore: ${args[0]} is now ${config.dbPathGiven} (${r.readings} readings, integrity_check ok)`);
  if (r.keptAs) console.log(`  the previous database is kept as ${r.keptAs}`);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  main().catch((e: unknown) => {
    const msg = e instanceof ConfigError ? e.message : `chargewalk restore: ${e instanceof StoreStartupError || e instanceof Error ? e.message : String(e)}`;
    console.error(msg);
    process.exit(1);
  });
}
