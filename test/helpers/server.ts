/**
 * Starts the real chargewalk server in this process on a fresh SQLite file in a
 * temporary folder and a free port (tests never share data). Used by the API
 * tests and the browser tests:
 *
 *   const srv = await startTestServer({ demo: true, clientDir: inject('clientDir') });
 *   await fetch(`${srv.baseUrl}/api/health`);
 *   await srv.close(); // closes the server and deletes the folder
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Config } from '../../server/config';
import { startChargewalk } from '../../server/start';
import type { SqliteStore } from '../../server/store/sqlite';

export interface TestServer {
  /** e.g. http://127.0.0.1:40123 (no trailing slash) */
  baseUrl: string;
  port: number;
  /** The temporary folder and the database file in it. */
  dir: string;
  dbPath: string;
  /** The server's own store (for checks a test cannot make over HTTP). */
  store: SqliteStore;
  /** Stops the server and closes the database, keeping the folder (for restore tests). */
  stop(): Promise<void>;
  /** Stops (if running) and deletes the folder. */
  close(): Promise<void>;
}

export interface TestServerOptions {
  /** Load the invented demo site (default false: an empty database). */
  demo?: boolean;
  /** Folder of a built client (default: a folder that does not exist, API only). */
  clientDir?: string;
  bodyLimit?: string;
}

export async function startTestServer(opts: TestServerOptions = {}): Promise<TestServer> {
  const dir = mkdtempSync(join(tmpdir(), 'chargewalk-test-'));
  const dbPath = join(dir, 'chargewalk.db');
  const config: Config = {
    port: 0,
    host: '127.0.0.1',
    dbPathGiven: dbPath,
    dbPath,
    demo: opts.demo ?? false,
    clientDir: opts.clientDir ?? join(dir, 'no-client'),
    synchronous: 'full',
    bodyLimit: opts.bodyLimit ?? '1mb',
    check: 'quick',
  };
  const running = await startChargewalk(config, { log: () => {} });
  return {
    baseUrl: `http://127.0.0.1:${running.port}`,
    port: running.port,
    dir,
    dbPath,
    store: running.store,
    stop: () => running.close(),
    async close() {
      await running.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
