/**
 * Starts chargewalk from a checked Config: opens, checks and migrates the
 * database, loads the demo site into an empty database when asked, builds the app
 * and listens. main.ts and the test helper both start the server through here.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname } from 'node:path';
import { buildApp } from './app';
import type { Config } from './config';
import { loadDemo } from './demo';
import { clientIsBuilt } from './http/static-client';
import { removePidFile, writePidFile } from './pidfile';
import { openPgStore } from './store/postgres';
import { openSqliteStore } from './store/sqlite';
import type { Store } from './store/store';

export interface Running {
  server: Server;
  /** SqliteStore by default; PgStore when config.databaseUrl is set. */
  store: Store;
  port: number;
  /** http://localhost:PORT */
  url: string;
  demoLoaded: boolean;
  clientBuilt: boolean;
  /** Stops accepting, lets requests in flight finish, checkpoints and closes the database. */
  close(): Promise<void>;
}

function packageVersion(): string {
  try {
    return (JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version?: string }).version ?? '0.0.0';
  } catch {
    return '0.0.0';
  }
}

export async function startChargewalk(config: Config, opts: { log?: (m: string) => void } = {}): Promise<Running> {
  const log = opts.log ?? ((m: string) => console.log(m));
  const pg = config.databaseUrl !== undefined;
  if (!pg) mkdirSync(dirname(config.dbPath), { recursive: true });
  const store: Store = pg
    ? await openPgStore({ url: config.databaseUrl! })
    : openSqliteStore({ path: config.dbPath, synchronous: config.synchronous, check: config.check });
  let demoLoaded = false;
  try {
    if (config.demo && await store.isEmpty()) {
      const counts = await loadDemo(store);
      demoLoaded = true;
      log(`chargewalk: loaded the invented demo site (${counts.spots} spots, ${counts.rounds} rounds, ${counts.readings} readings)`);
    }
  } catch (e) {
    await store.close();
    throw e;
  }
  const app = buildApp({ store, clientDir: config.clientDir, bodyLimit: config.bodyLimit, version: packageVersion(), log: (m) => console.error(m) });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host);
    s.once('listening', () => resolve(s));
    s.once('error', reject);
  }).catch(async (e: NodeJS.ErrnoException) => {
    await store.close();
    if (e.code === 'EADDRINUSE') throw new Error(`chargewalk: port ${config.port} is in use; set PORT to another port`);
    throw e;
  });
  // Slow or idle clients must not hold a shutdown forever.
  server.requestTimeout = 60_000;
  server.headersTimeout = 20_000;
  if (!pg) writePidFile(config.dbPath);
  const port = (server.address() as AddressInfo).port;
  let closing: Promise<void> | null = null;
  return {
    server, store, port, url: `http://localhost:${port}`, demoLoaded, clientBuilt: clientIsBuilt(config.clientDir),
    close() {
      closing ??= (async () => {
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeIdleConnections();
          setTimeout(() => server.closeAllConnections(), 5_000).unref();
        });
        await store.close();
        if (!pg) removePidFile(config.dbPath);
      })();
      return closing;
    },
  };
}
