// Backup while the server is writing, and restore (issue 5): the backup opens,
// passes integrity_check and holds every reading acknowledged before it started;
// restore refuses while a server runs, refuses bad files, keeps the old database.
import Database from 'better-sqlite3';
import { execFile } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backupDatabase, integrityCheck } from '../../server/cli/backup';
import { restoreDatabase } from '../../server/cli/restore';
import { openSqliteStore } from '../../server/store/sqlite';
import { call, createRound, createSetup, readingInput, type SetupIds } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

const run = promisify(execFile);
let srv: TestServer;
let ids: SetupIds;
let roundId: string;

beforeAll(async () => {
  srv = await startTestServer();
  ids = await createSetup(srv.baseUrl);
  roundId = await createRound(srv.baseUrl, ids.siteId);
});
afterAll(async () => {
  await srv.close();
});

/** Posts batches until stopped; every acknowledged id is pushed to `acked`. */
function writer(acked: string[]) {
  let stop = false;
  const done = (async () => {
    let i = 0;
    while (!stop) {
      const batch = Array.from({ length: 25 }, () => readingInput(roundId, ids.spotIds[i++ % 3]!, ids.meterId, { value: i }));
      const r = await call(srv.baseUrl, 'POST', '/api/readings', { readings: batch });
      if (r.status !== 200) throw new Error(`write failed: ${r.status} ${JSON.stringify(r.body)}`);
      for (const a of r.body.acks) acked.push(a.id);
    }
  })();
  return { stop: async () => { stop = true; await done; } };
}

function idsIn(path: string): Set<string> {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    return new Set((db.prepare('SELECT id FROM readings').all() as { id: string }[]).map((r) => r.id));
  } finally {
    db.close();
  }
}

describe('backup while writing', () => {
  it('npm run backup (the CLI, a separate process) during a write load: opens, passes integrity_check, holds every reading acknowledged before it started', async () => {
    const acked: string[] = [];
    const w = writer(acked);
    while (acked.length < 200) await new Promise((r) => setTimeout(r, 10));
    const before = new Set(acked);
    const target = join(srv.dir, 'backups', 'during-writes.db');
    const { stdout } = await run(process.execPath, ['--import', 'tsx', 'server/cli/backup.ts', target], {
      env: { ...process.env, CHARGEWALK_DB: srv.dbPath }, timeout: 60_000,
    });
    const afterBackup = acked.length;
    await w.stop();
    expect(stdout).toMatch(/chargewalk backup: .*during-writes\.db \(\d+ KiB, \d+ readings, integrity_check ok\)/);
    expect(integrityCheck(target)).toBe('ok');
    const inBackup = idsIn(target);
    const missing = [...before].filter((id) => !inBackup.has(id));
    expect(missing).toEqual([]);
    expect(inBackup.size).toBeGreaterThanOrEqual(before.size);
    expect(inBackup.size).toBeLessThanOrEqual(afterBackup + 25);
    expect(acked.length).toBeGreaterThan(before.size); // the server kept accepting writes meanwhile
    // a single self-contained file
    expect(existsSync(`${target}-wal`)).toBe(false);
  });

  it('the in-process backup function also gives a consistent copy, and never overwrites a file', async () => {
    const acked: string[] = [];
    const w = writer(acked);
    while (acked.length < 100) await new Promise((r) => setTimeout(r, 10));
    const before = new Set(acked);
    const target = join(srv.dir, 'backups', 'in-process.db');
    const r = await backupDatabase(srv.dbPath, target);
    await w.stop();
    expect(r.integrity).toBe('ok');
    const inBackup = idsIn(target);
    expect([...before].filter((id) => !inBackup.has(id))).toEqual([]);
    await expect(backupDatabase(srv.dbPath, target)).rejects.toThrow(/exists already/);
  });
});

describe('restore', () => {
  it('refuses while the server is running, then restores after it stopped, keeping the old database', async () => {
    const backup = join(srv.dir, 'backups', 'for-restore.db');
    await backupDatabase(srv.dbPath, backup);
    const inBackup = idsIn(backup).size;
    // more readings after the backup: the restore must bring the database back to the backup's state
    await call(srv.baseUrl, 'POST', '/api/readings', { readings: [readingInput(roundId, ids.spotIds[0]!, ids.meterId)] });

    const refused = await run(process.execPath, ['--import', 'tsx', 'server/cli/restore.ts', backup], {
      env: { ...process.env, CHARGEWALK_DB: srv.dbPath }, timeout: 60_000,
    }).then(() => null, (e: { code: number; stderr: string }) => e);
    expect(refused?.code).toBe(1);
    expect(refused?.stderr).toMatch(/a chargewalk server \(pid \d+\) is using .*: stop it first/);

    await srv.stop();
    const countBefore = idsIn(srv.dbPath).size;
    const r = await restoreDatabase(backup, srv.dbPath);
    expect(r.readings).toBe(inBackup);
    expect(r.keptAs).toBe(`${srv.dbPath}.before-restore`);
    expect(idsIn(r.keptAs!).size).toBe(countBefore);
    expect(existsSync(`${srv.dbPath}-wal`)).toBe(false);
    const store = openSqliteStore({ path: srv.dbPath, check: 'full' });
    expect((store.db.prepare('SELECT count(*) AS n FROM readings').get() as { n: number }).n).toBe(inBackup);
    await store.close();
    // a second restore keeps the first safety copy
    const r2 = await restoreDatabase(backup, srv.dbPath);
    expect(r2.keptAs).toMatch(/\.before-restore-\d{8}-\d{6}$/);
  });

  it('refuses a file that is not a database, and a backup from a newer version', async () => {
    const junk = join(srv.dir, 'junk.db');
    writeFileSync(junk, 'not a database '.repeat(300));
    await expect(restoreDatabase(junk, srv.dbPath)).rejects.toThrow(/not a readable SQLite database|integrity/);
    const newer = join(srv.dir, 'backups', 'newer.db');
    await backupDatabase(srv.dbPath, newer);
    const db = new Database(newer);
    db.prepare('INSERT INTO schema_migrations VALUES (?, ?, ?, ?)').run(999, '0999_future', 'x', '2030-01-01T00:00:00Z');
    db.close();
    await expect(restoreDatabase(newer, srv.dbPath)).rejects.toThrow(/does not know: it was written by a newer version/);
  });
});
