/**
 * Numbered PostgreSQL migrations: server/store/postgres/migrations/NNNN_name.sql,
 * applied in order, each in its own transaction, each recorded in
 * schema_migrations with the SHA-256 of its text (the same rules and file naming as
 * server/store/sqlite/migrate.ts, whose loader this reuses). The server refuses a
 * database that has a migration this code does not know, or whose recorded
 * checksum differs from the file. A session advisory lock keeps two starting
 * servers from migrating at once.
 */
import { fileURLToPath } from 'node:url';
import type pg from 'pg';
import { StoreStartupError } from '../errors';
import { loadMigrations, verifyAppliedMigrations, type AppliedRow, type Migration } from '../sqlite/migrate';

export const PG_MIGRATIONS_DIR = fileURLToPath(new URL('./migrations/', import.meta.url));

export function loadPgMigrations(): Migration[] {
  return loadMigrations(PG_MIGRATIONS_DIR);
}

/** Key of the advisory lock held while migrating ("charg" in ASCII). */
const MIGRATE_LOCK = 0x6368617267;



export async function checkPgMigrationHistory(client: pg.ClientBase, location: string, migrations: Migration[]): Promise<AppliedRow[]> {
  const applied = (await client.query<AppliedRow>('SELECT id, name, checksum, applied_at FROM schema_migrations ORDER BY id')).rows;
  verifyAppliedMigrations(applied, location, migrations);
  return applied;
}

/** Applies pending migrations; refuses an unknown or altered schema history. Answers the schema version. */
export async function migratePg(
  client: pg.ClientBase, location: string, migrations: Migration[] = loadPgMigrations(),
): Promise<{ schemaVersion: number; applied: string[] }> {
  await client.query('SELECT pg_advisory_lock($1)', [MIGRATE_LOCK]);
  try {
    const has = (await client.query<{ t: string | null }>("SELECT to_regclass('schema_migrations')::text AS t")).rows[0]?.t ?? null;
    if (has === null) {
      const other = (await client.query<{ table_name: string }>(
        'SELECT table_name FROM information_schema.tables WHERE table_schema = current_schema() LIMIT 1')).rows[0];
      if (other) {
        throw new StoreStartupError(`${location} is not a chargewalk database (it has a table "${other.table_name}" but no schema_migrations): point DATABASE_URL at another database`);
      }
      await client.query(`CREATE TABLE schema_migrations (
        id INTEGER PRIMARY KEY, name TEXT NOT NULL, checksum TEXT NOT NULL, applied_at TEXT NOT NULL)`);
    }
    const applied = await checkPgMigrationHistory(client, location, migrations);
    const appliedIds = new Set(applied.map((r) => r.id));
    const done: string[] = [];
    for (const mig of migrations) {
      if (appliedIds.has(mig.id)) continue;
      await client.query('BEGIN');
      try {
        await client.query(mig.sql);
        await client.query('INSERT INTO schema_migrations (id, name, checksum, applied_at) VALUES ($1, $2, $3, $4)',
          [mig.id, mig.name, mig.checksum, new Date().toISOString()]);
        await client.query('COMMIT');
      } catch (e) {
        await client.query('ROLLBACK');
        throw new StoreStartupError(`${location}: migration ${mig.name} failed: ${(e as Error).message}`);
      }
      done.push(mig.name);
    }
    return { schemaVersion: migrations.length === 0 ? 0 : migrations[migrations.length - 1]!.id, applied: done };
  } finally {
    await client.query('SELECT pg_advisory_unlock($1)', [MIGRATE_LOCK]);
  }
}
