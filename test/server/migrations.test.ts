// Migrations and start-up checks on real SQLite files: the chain replayed on a
// fresh database gives the same schema as applying the migrations one by one;
// unknown or edited migrations, foreign and damaged files are refused with a
// clear message; readings are append-only at the database level.
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, openSync, rmSync, writeFileSync, writeSync, closeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { StoreStartupError } from '../../server/store/errors';
import { openSqliteStore } from '../../server/store/sqlite';
import { loadMigrations, migrate } from '../../server/store/sqlite/migrate';

const dir = mkdtempSync(join(tmpdir(), 'chargewalk-migrations-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
let n = 0;
const fresh = () => join(dir, `db-${++n}.db`);

/** The schema as text: every table, index and trigger, in name order. */
function schemaDump(db: Database.Database): string {
  const rows = db.prepare("SELECT type, name, tbl_name, sql FROM sqlite_master WHERE name NOT LIKE 'sqlite_%' ORDER BY type, name").all() as
    { type: string; name: string; tbl_name: string; sql: string | null }[];
  return rows.map((r) => `-- ${r.type} ${r.name} on ${r.tbl_name}\n${r.sql ?? ''};`).join('\n\n');
}

describe('migrations', () => {
  const migrations = loadMigrations();

  it('are numbered 0001, 0002, ... and named NNNN_name.sql', () => {
    expect(migrations.length).toBeGreaterThan(0);
    migrations.forEach((m, i) => {
      expect(m.id).toBe(i + 1);
      expect(m.name).toMatch(/^\d{4}_[a-z0-9_]+$/);
    });
  });

  it('replaying the whole chain on a fresh database gives the schema of applying them one by one', () => {
    const all = new Database(fresh());
    const r = migrate(all, 'all-at-once', migrations);
    expect(r.applied).toEqual(migrations.map((m) => m.name));
    expect(r.schemaVersion).toBe(migrations.length);

    const stepwise = new Database(fresh());
    for (let i = 1; i <= migrations.length; i++) {
      const step = migrate(stepwise, 'one-by-one', migrations.slice(0, i));
      expect(step.applied).toEqual([migrations[i - 1]!.name]);
    }
    expect(schemaDump(stepwise)).toBe(schemaDump(all));
    // Applying again does nothing.
    expect(migrate(all, 'again', migrations).applied).toEqual([]);
    const recorded = all.prepare('SELECT id, name, checksum FROM schema_migrations ORDER BY id').all();
    expect(recorded).toEqual(migrations.map((m) => ({ id: m.id, name: m.name, checksum: m.checksum })));
    // The reviewed schema: update the snapshot (vitest -u) only together with a new migration.
    expect(schemaDump(all)).toMatchSnapshot();
    all.close();
    stepwise.close();
  });

  it('refuses a database with a migration this code does not know', async () => {
    const path = fresh();
    await (openSqliteStore({ path })).close();
    const db = new Database(path);
    db.prepare('INSERT INTO schema_migrations (id, name, checksum, applied_at) VALUES (?, ?, ?, ?)').run(999, '0999_from_the_future', 'x', '2030-01-01T00:00:00Z');
    db.close();
    expect(() => openSqliteStore({ path })).toThrowError(StoreStartupError);
    expect(() => openSqliteStore({ path })).toThrowError(/migration 0999 \(0999_from_the_future.*does not know: it was written by a newer version/);
  });

  it('refuses a database whose applied migration was edited (checksum mismatch)', async () => {
    const path = fresh();
    await (openSqliteStore({ path })).close();
    const db = new Database(path);
    db.prepare('UPDATE schema_migrations SET checksum = ? WHERE id = 1').run('0'.repeat(64));
    db.close();
    expect(() => openSqliteStore({ path })).toThrowError(/0001_init differs from the one applied .* \(checksum mismatch\)/);
  });

  it('refuses a SQLite file that is not a chargewalk database, and :memory:', () => {
    const path = fresh();
    const db = new Database(path);
    db.exec('CREATE TABLE invoices (id INTEGER PRIMARY KEY)');
    db.close();
    expect(() => openSqliteStore({ path })).toThrowError(/is not a chargewalk database \(it has a table "invoices"/);
    expect(() => openSqliteStore({ path: ':memory:' })).toThrowError(/in-memory database would lose every reading/);
  });

  it('refuses a file that is not SQLite at all, and a damaged database, leaving them untouched', async () => {
    const junk = fresh();
    writeFileSync(junk, 'this is not a database, just text '.repeat(200));
    expect(() => openSqliteStore({ path: junk })).toThrowError(/is damaged or is not a SQLite database/);

    const path = fresh();
    const store = openSqliteStore({ path });
    store.db.exec('CREATE TABLE filler (x TEXT)');
    const ins = store.db.prepare('INSERT INTO filler VALUES (?)');
    for (let i = 0; i < 400; i++) ins.run('x'.repeat(500));
    await store.close();
    // Overwrite the middle of the file (b-tree pages of the filler table) with garbage.
    const fd = openSync(path, 'r+');
    writeSync(fd, Buffer.alloc(4096 * 3, 0xa5), 0, 4096 * 3, 4096 * 20);
    closeSync(fd);
    expect(() => openSqliteStore({ path })).toThrowError(/is damaged/);
  });

  it('the server process refuses to start on a damaged file: clear message, exit code 1', () => {
    const junk = fresh();
    writeFileSync(junk, 'garbage '.repeat(1000));
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
      env: { ...process.env, CHARGEWALK_DB: junk, PORT: '0', HOST: '127.0.0.1', CHARGEWALK_DEMO: '0' }, encoding: 'utf8', timeout: 30_000,
    });
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('is damaged or is not a SQLite database');
    expect(r.stderr).toContain('npm run restore');
  });

  it('readings and tombstones are append-only in the database itself', async () => {
    const path = fresh();
    const store = openSqliteStore({ path });
    expect(() => store.db.exec('UPDATE readings SET value = 1')).not.toThrow(); // no rows: no trigger fires
    store.db.exec("INSERT INTO sites VALUES ('s', 'S', 'UTC', '', 't', 't')");
    store.db.exec("INSERT INTO areas (id, site_id, name, kind, created_at, updated_at) VALUES ('a', 's', 'A', 'epa', 't', 't')");
    store.db.exec(`INSERT INTO spots (id, site_id, area_id, name, code, object_kind, material_class, default_distance_value, default_distance_unit, created_at, updated_at)
                   VALUES ('p', 's', 'a', 'P', 'P', 'tool', 'unknown', 1, 'cm', 't', 't')`);
    store.db.exec("INSERT INTO meters VALUES ('m', 's', 'M', '', '[\"field\"]', NULL, 0.05, 1, '2030-01-01', 'kV/m', 't', 't')");
    store.db.exec("INSERT INTO rounds VALUES ('r', 's', 'A', 't', NULL, NULL, NULL, '', '[]', 'h', 't')");
    store.db.exec(`INSERT INTO readings (id, round_id, spot_id, meter_id, taken_at, received_at, value, unit, polarity, distance_value, distance_unit,
                     zeroed, meter_calibration_due, content_hash, field_v_per_m, derive_version)
                   VALUES ('x', 'r', 'p', 'm', 't', 't', 1, 'V/m', '+', 1, 'cm', 1, '2030-01-01', 'h', 1, 1)`);
    expect(() => store.db.exec("UPDATE readings SET value = 2 WHERE id = 'x'")).toThrowError(/append-only/);
    expect(() => store.db.exec("DELETE FROM readings WHERE id = 'x'")).toThrowError(/append-only/);
    store.db.exec("INSERT INTO reading_tombstones VALUES ('x', 'r', 't')");
    expect(() => store.db.exec("DELETE FROM reading_tombstones WHERE reading_id = 'x'")).toThrowError(/append-only/);
    await store.close();
  });

  it('opens in WAL mode with foreign keys on and synchronous FULL by default (NORMAL on request)', async () => {
    const path = fresh();
    const store = openSqliteStore({ path });
    expect(store.db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(store.db.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(store.db.pragma('synchronous', { simple: true })).toBe(2); // FULL
    await store.close();
    const normal = openSqliteStore({ path, synchronous: 'normal', check: 'full' });
    expect(normal.db.pragma('synchronous', { simple: true })).toBe(1); // NORMAL
    await normal.close();
  });
});
