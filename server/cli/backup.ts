/**
 * `npm run backup [-- <target file>]`: a consistent online backup of CHARGEWALK_DB
 * while the server keeps running, made with SQLite's backup API (better-sqlite3
 * db.backup). The copy is taken in one step, i.e. from one read snapshot, so it
 * holds exactly the transactions committed before the step began; the server
 * goes on writing meanwhile (WAL). The copy is then switched to a single file
 * (journal_mode=DELETE) and checked with integrity_check.
 *
 * Default target: <folder of the database>/backups/chargewalk-YYYYMMDD-HHMMSS.db
 * (UTC), i.e. ./data/backups/... with the default database. An existing target is
 * never overwritten.
 */
import Database from 'better-sqlite3';
import { existsSync, mkdirSync, rmSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ConfigError, loadConfig } from '../config';

export interface BackupResult {
  target: string;
  integrity: string;
  readings: number;
  bytes: number;
}

export function defaultBackupPath(dbPath: string, now = new Date()): string {
  const stamp = now.toISOString().replace(/[-:]/g, '').replace('T', '-').slice(0, 15);
  return join(dirname(dbPath), 'backups', `chargewalk-${stamp}.db`);
}

/** Integrity check of a database file; 'ok' or the problems found. */
export function integrityCheck(path: string): string {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    const rows = db.pragma('integrity_check(20)', { simple: false }) as Record<string, string>[];
    return rows.map((r) => Object.values(r)[0]).join('; ');
  } finally {
    db.close();
  }
}

export async function backupDatabase(source: string, target: string): Promise<BackupResult> {
  if (!existsSync(source)) throw new Error(`no database at ${source}`);
  if (existsSync(target)) throw new Error(`${target} exists already; give another name`);
  mkdirSync(dirname(target), { recursive: true });
  const db = new Database(source, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 10000');
    // After the first (sizing) step, copy every page in one step: one read snapshot.
    await db.backup(target, { progress: () => 0x7fffffff });
  } catch (e) {
    rmSync(target, { force: true });
    throw e;
  } finally {
    db.close();
  }
  const copy = new Database(target, { fileMustExist: true });
  let readings = 0;
  try {
    copy.pragma('journal_mode = DELETE');
    const hasReadings = copy.prepare("SELECT 1 FROM sqlite_master WHERE name = 'readings'").get() !== undefined;
    readings = hasReadings ? (copy.prepare('SELECT count(*) AS n FROM readings').get() as { n: number }).n : 0;
  } finally {
    copy.close();
  }
  const integrity = integrityCheck(target);
  return { target, integrity, readings, bytes: statSync(target).size };
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  if (args.some((a) => a.startsWith('-'))) {
    console.error('usage: npm run backup [-- <target file>]');
    process.exit(2);
  }
  const config = loadConfig(process.env, []);
  const target = args[0] ? resolve(args[0]) : defaultBackupPath(config.dbPath);
  const r = await backupDatabase(config.dbPath, target);
  if (r.integrity !== 'ok') {
    console.error(`chargewalk backup: the copy ${r.target} FAILED its integrity check: ${r.integrity}`);
    process.exit(1);
  }
  console.log(`chargewalk backup: ${r.target} (${(r.bytes / 1024).toFixed(0)} KiB, ${r.readings} readings, integrity_check ok)`);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  main().catch((e: unknown) => {
    console.error(e instanceof ConfigError ? e.message : `chargewalk backup: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  });
}
