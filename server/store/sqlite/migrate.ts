/**
 * Numbered migrations: server/store/sqlite/migrations/NNNN_name.sql, applied in
 * order, each in its own transaction, each recorded in schema_migrations with the
 * SHA-256 of its text. The server refuses a database that has a migration this
 * code does not know (written by a newer chargewalk) or whose recorded checksum
 * differs from the file (an applied migration was edited: add a new one instead).
 *
 * To add a migration: create the next number, e.g. 0002_follow_ups.sql; never edit
 * an applied one. The migration test replays the chain and compares the schema.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { StoreStartupError } from '../errors';
import type { Db } from './db';

export interface Migration {
  id: number;
  name: string;
  sql: string;
  checksum: string;
}

export const MIGRATIONS_DIR = fileURLToPath(new URL('./migrations/', import.meta.url));

const FILE = /^(\d{4})_([a-z0-9_]+)\.sql$/;

export function migrationChecksum(sql: string): string {
  return createHash('sha256').update(sql.replace(/\r\n/g, '\n')).digest('hex');
}

/** The migrations shipped with this code, in order; ids must run 1, 2, 3 ... without gaps. */
export function loadMigrations(dir: string = MIGRATIONS_DIR): Migration[] {
  const list = readdirSync(dir)
    .filter((f) => f.endsWith('.sql'))
    .map((file) => {
      const m = FILE.exec(file);
      if (!m) throw new Error(`migration file ${file} must be named NNNN_name.sql (lower case, digits, underscores)`);
      const sql = readFileSync(join(dir, file), 'utf8');
      return { id: Number(m[1]), name: file.replace(/\.sql$/, ''), sql, checksum: migrationChecksum(sql) };
    })
    .sort((a, b) => a.id - b.id);
  list.forEach((mig, i) => {
    if (mig.id !== i + 1) throw new Error(`migrations must be numbered 0001, 0002, ... without gaps; found ${mig.name} at place ${i + 1}`);
  });
  return list;
}

export interface AppliedRow { id: number; name: string; checksum: string; applied_at: string }

const pad = (id: number) => String(id).padStart(4, '0');

/**
 * Checks the migrations recorded in a database against the ones this code ships:
 * an unknown id or a changed checksum throws StoreStartupError. Answers the rows.
 */
/**
 * The rule both stores keep: every applied migration must be one this code knows,
 * with the same checksum. Throws StoreStartupError naming the migration otherwise.
 * `restoreHint` tells how to go back (SQLite: npm run restore; PostgreSQL: the dump).
 */
export function verifyAppliedMigrations(applied: readonly AppliedRow[], location: string, migrations: readonly Migration[], restoreHint = ''): void {
  const known = new Map(migrations.map((m) => [m.id, m]));
  for (const row of applied) {
    const mig = known.get(row.id);
    if (!mig) {
      throw new StoreStartupError(
        `${location} has migration ${pad(row.id)} (${row.name}, applied ${row.applied_at}) that this version of chargewalk does not know: `
        + `it was written by a newer version. Run that version, or restore a backup made with this one${restoreHint}.`);
    }
    if (mig.checksum !== row.checksum) {
      throw new StoreStartupError(
        `${location}: migration ${mig.name} differs from the one applied on ${row.applied_at} (checksum mismatch). `
        + 'Applied migrations must never be edited; undo the edit and add a new numbered migration instead.');
    }
  }
}

export function checkMigrationHistory(db: Db, location: string, migrations: Migration[] = loadMigrations()): AppliedRow[] {
  const applied = db.prepare('SELECT id, name, checksum, applied_at FROM schema_migrations ORDER BY id').all() as AppliedRow[];
  verifyAppliedMigrations(applied, location, migrations, ' (npm run restore -- <file>)');
  return applied;
}

/** Applies pending migrations; refuses an unknown or altered schema history. Answers the schema version. */
export function migrate(db: Db, location: string, migrations: Migration[] = loadMigrations()): { schemaVersion: number; applied: string[] } {
  const hasTable = db.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'schema_migrations'").get() !== undefined;
  if (!hasTable) {
    const other = db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' LIMIT 1").get() as { name: string } | undefined;
    if (other) {
      throw new StoreStartupError(`${location} is not a chargewalk database (it has a table "${other.name}" but no schema_migrations): point CHARGEWALK_DB at another file`);
    }
    db.exec(`CREATE TABLE schema_migrations (
      id INTEGER PRIMARY KEY, name TEXT NOT NULL, checksum TEXT NOT NULL, applied_at TEXT NOT NULL) STRICT`);
  }
  const applied = checkMigrationHistory(db, location, migrations);
  const appliedIds = new Set(applied.map((r) => r.id));
  const done: string[] = [];
  for (const mig of migrations) {
    if (appliedIds.has(mig.id)) continue;
    db.transaction(() => {
      db.exec(mig.sql);
      db.prepare('INSERT INTO schema_migrations (id, name, checksum, applied_at) VALUES (?, ?, ?, ?)')
        .run(mig.id, mig.name, mig.checksum, new Date().toISOString());
    }).immediate();
    done.push(mig.name);
  }
  return { schemaVersion: migrations.length === 0 ? 0 : migrations[migrations.length - 1]!.id, applied: done };
}
