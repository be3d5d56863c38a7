/**
 * The server process: `npm start` (after building the client) or `npm run serve`.
 * Reads the configuration (server/config.ts), checks and opens the database,
 * serves app and API on one port, and shuts down cleanly on SIGTERM/SIGINT.
 * Options: --check runs a full integrity check of the database at start.
 */
import { networkInterfaces } from 'node:os';
import { ConfigError, loadConfig, type Config } from './config';
import { startChargewalk, type Running } from './start';
import { StoreStartupError } from './store/errors';

function lanAddresses(port: number): string[] {
  return Object.values(networkInterfaces()).flat()
    .filter((a): a is NonNullable<typeof a> => !!a && a.family === 'IPv4' && !a.internal)
    .map((a) => `http://${a.address}:${port}`);
}

async function main(): Promise<void> {
  let config: Config;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      console.error(e.message);
      process.exit(1);
    }
    throw e;
  }
  let running: Running;
  try {
    running = await startChargewalk(config);
  } catch (e) {
    if (e instanceof StoreStartupError) console.error(`chargewalk: ${e.message}`);
    else console.error(e instanceof Error ? e.message : String(e));
    process.exit(1);
  }
  // Signal handlers before the 'serving' line: whoever waits for that line may stop us at once.
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`chargewalk: ${signal}: finishing requests, closing the database`);
    running.close().then(() => process.exit(0), (e: unknown) => {
      console.error(`chargewalk: error while closing: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    });
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  console.log(`chargewalk serving ${running.url} (database ${config.databaseUrl !== undefined ? `PostgreSQL ${running.store.location}` : config.dbPathGiven})`);
  if (config.host === '0.0.0.0' || config.host === '::') {
    const lan = lanAddresses(running.port);
    if (lan.length) console.log(`  on a tablet in the same network: ${lan.join('  ')}`);
  }
  if (!running.clientBuilt) {
    console.log(`  the tablet client is not built (${config.clientDir}/index.html is missing): the API works; run npm run build, or npm start which builds it`);
  }
}

await main();
