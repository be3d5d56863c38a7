/**
 * The SQLite store (better-sqlite3): one file, WAL journal, foreign keys on.
 *
 * Durability: synchronous=FULL (the default) syncs the WAL on every commit, so an
 * acknowledged reading survives a process crash AND a power loss or OS crash.
 * synchronous=NORMAL (CHARGEWALK_SYNC=normal) survives process crashes but may
 * lose the last transactions on power loss (the database stays consistent).
 * With batched inserts FULL costs little.
 *
 * Every write runs in one IMMEDIATE transaction (db.transaction(...).immediate()),
 * so a request is stored whole or not at all; the HTTP answer is sent only after
 * the transaction returned, i.e. after COMMIT.
 */
import Database from 'better-sqlite3';
import type {
  Area, AreaInput, CorrectionInput, LimitSet, LimitSetInput, Meter, MeterInput, Reading, ReadingAck, ReadingConflict,
  ReadingInput, Round, RoundInput, RoundSummary, SetupBundle, Site, SiteInput, Skip, SkipInput, Spot, SpotInput,
} from '../../../core/schemas';
import { StoreError, StoreStartupError } from '../errors';
import type { RoundFinishInput, Store, StoreHealth } from '../store';
import { nowIso, type Db } from './db';
import { migrate } from './migrate';
import * as areas from './repos/areas';
import * as limitSets from './repos/limit-sets';
import * as meters from './repos/meters';
import * as readings from './repos/readings';
import * as rounds from './repos/rounds';
import * as sites from './repos/sites';
import * as spots from './repos/spots';

export interface SqliteStoreOptions {
  /** Path of the database file (created when missing; its folder must exist). ':memory:' is refused. */
  path: string;
  /** 'full' (default): durable across power loss; 'normal': across process crashes only. */
  synchronous?: 'full' | 'normal';
  /** 'quick' (default): PRAGMA quick_check at open; 'full': integrity_check and foreign_key_check. */
  check?: 'quick' | 'full';
  busyTimeoutMs?: number;
}

const CHECK_ROWS = 20;

/** Runs the start-up check; answers 'ok' or throws StoreStartupError naming the first problems. */
function checkFile(db: Db, location: string, mode: 'quick' | 'full'): string {
  const pragma = mode === 'full' ? 'integrity_check' : 'quick_check';
  const rows = db.pragma(`${pragma}(${CHECK_ROWS})`, { simple: false }) as Record<string, string>[];
  const problems = rows.map((r) => Object.values(r)[0]).filter((v) => v !== 'ok');
  if (problems.length > 0) {
    throw new StoreStartupError(
      `${location} is damaged (${pragma}: ${problems.slice(0, 5).join('; ')}${problems.length > 5 ? '; ...' : ''}). `
      + 'chargewalk will not run on it. Restore a backup (npm run restore -- <backup file>); the damaged file is left as it is.');
  }
  if (mode === 'full' && db.prepare("SELECT 1 FROM sqlite_master WHERE name = 'schema_migrations'").get()) {
    const fk = db.pragma('foreign_key_check') as { table: string; rowid: number; parent: string }[];
    if (fk.length > 0) {
      const f = fk[0]!;
      throw new StoreStartupError(`${location} has ${fk.length} broken references (first: ${f.table} row ${f.rowid} -> ${f.parent}). Restore a backup.`);
    }
  }
  return 'ok';
}

interface SqliteErrorLike extends Error { code: string }

function isSqliteError(e: unknown): e is SqliteErrorLike {
  return e instanceof Database.SqliteError;
}

/** Opens (creating when missing), checks and migrates the database. Throws StoreStartupError with a plain message. */
export function openSqliteStore(opts: SqliteStoreOptions): SqliteStore {
  const location = opts.path;
  if (!location || location === ':memory:' || location.startsWith('file:')) {
    throw new StoreStartupError('CHARGEWALK_DB must name a database file; an in-memory database would lose every reading');
  }
  let db: Db;
  try {
    db = new Database(location);
  } catch (e) {
    throw new StoreStartupError(`cannot open the database ${location}: ${(e as Error).message}`);
  }
  try {
    db.pragma(`busy_timeout = ${opts.busyTimeoutMs ?? 5000}`);
    const quickCheck = checkFile(db, location, opts.check ?? 'quick');
    const mode = db.pragma('journal_mode = WAL', { simple: true });
    if (mode !== 'wal') throw new StoreStartupError(`${location}: could not switch to WAL journal mode (got ${String(mode)})`);
    db.pragma('foreign_keys = ON');
    db.pragma(`synchronous = ${opts.synchronous === 'normal' ? 'NORMAL' : 'FULL'}`);
    const { schemaVersion } = migrate(db, location);
    db.pragma('optimize = 0x10002');
    return new SqliteStore(db, location, schemaVersion, quickCheck);
  } catch (e) {
    db.close();
    if (e instanceof StoreStartupError) throw e;
    if (isSqliteError(e) && /^SQLITE_(NOTADB|CORRUPT)/.test(e.code)) {
      throw new StoreStartupError(
        `${location} is damaged or is not a SQLite database (${e.message}). chargewalk will not run on it. `
        + 'Restore a backup (npm run restore -- <backup file>); the file is left as it is.');
    }
    if (isSqliteError(e) && /^SQLITE_BUSY/.test(e.code)) {
      throw new StoreStartupError(`${location} is locked by another process (${e.message}); is a restore running?`);
    }
    throw e;
  }
}

/** SQLite errors a request can cause become store errors (409/400/503), never a 500. */
function mapSqliteError(e: unknown): unknown {
  if (!isSqliteError(e)) return e;
  if (e.code === 'SQLITE_CONSTRAINT_UNIQUE' || e.code === 'SQLITE_CONSTRAINT_PRIMARYKEY') {
    return new StoreError('conflict', `this would duplicate a stored record (${e.message})`);
  }
  if (e.code.startsWith('SQLITE_CONSTRAINT')) return new StoreError('invalid', `the database refused this change (${e.message})`);
  if (e.code.startsWith('SQLITE_BUSY') || e.code.startsWith('SQLITE_LOCKED')) {
    return new StoreError('unavailable', 'the database is busy (a backup or another process holds it); try again shortly');
  }
  return e;
}

export class SqliteStore implements Store {
  readonly kind = 'sqlite';
  private closed = false;

  constructor(
    /** The connection; for CLIs and tests only, routes never touch it. */
    readonly db: Db,
    readonly location: string,
    private readonly schemaVersion: number,
    private readonly quickCheck: string,
  ) {}

  /** A write: one IMMEDIATE transaction, committed before this returns. */
  private write<T>(fn: (now: string) => T): Promise<T> {
    try {
      const now = nowIso();
      return Promise.resolve(this.db.transaction(() => fn(now)).immediate());
    } catch (e) {
      return Promise.reject(mapSqliteError(e));
    }
  }

  /** A read of several statements from one snapshot. */
  private read<T>(fn: () => T): Promise<T> {
    try {
      return Promise.resolve(this.db.transaction(fn).deferred());
    } catch (e) {
      return Promise.reject(mapSqliteError(e));
    }
  }

  async health(): Promise<StoreHealth> {
    let ok = !this.closed;
    try {
      if (ok) this.db.prepare('SELECT 1').get();
    } catch {
      ok = false;
    }
    return { kind: this.kind, ok: ok && this.quickCheck === 'ok', schemaVersion: this.schemaVersion, quickCheck: this.quickCheck };
  }

  isEmpty(): Promise<boolean> {
    return this.read(() => this.db.prepare('SELECT 1 FROM sites LIMIT 1').get() === undefined);
  }

  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    try {
      this.db.pragma('wal_checkpoint(TRUNCATE)');
      this.db.pragma('optimize');
    } finally {
      this.db.close();
    }
  }

  // ---------- sites ----------
  listSites(): Promise<Site[]> { return this.read(() => sites.listSites(this.db)); }
  getSite(id: string): Promise<Site | null> { return this.read(() => sites.getSite(this.db, id)); }
  createSite(input: SiteInput): Promise<Site> { return this.write((now) => sites.insertSite(this.db, input, now)); }
  updateSite(id: string, input: SiteInput): Promise<Site> { return this.write((now) => sites.updateSite(this.db, id, input, now)); }

  getSetup(siteId: string): Promise<SetupBundle | null> {
    return this.read(() => {
      const site = sites.getSite(this.db, siteId);
      if (!site) return null;
      return {
        site,
        areas: areas.listAreas(this.db, siteId),
        spots: spots.listSiteSpots(this.db, siteId),
        meters: meters.listMeters(this.db, siteId),
        limitSets: limitSets.listLimitSets(this.db, siteId),
      };
    });
  }

  // ---------- limit sets ----------
  getLimitSet(id: string): Promise<LimitSet | null> { return this.read(() => limitSets.getLimitSet(this.db, id)); }
  createLimitSet(input: LimitSetInput): Promise<LimitSet> { return this.write((now) => limitSets.insertLimitSet(this.db, input, now)); }
  updateLimitSet(id: string, input: LimitSetInput): Promise<LimitSet> { return this.write((now) => limitSets.updateLimitSet(this.db, id, input, now)); }

  // ---------- areas ----------
  getArea(id: string): Promise<Area | null> { return this.read(() => areas.getArea(this.db, id)); }
  createArea(input: AreaInput): Promise<Area> { return this.write((now) => areas.insertArea(this.db, input, now)); }
  updateArea(id: string, input: AreaInput): Promise<Area> { return this.write((now) => areas.updateArea(this.db, id, input, now)); }
  setRouteOrder(areaId: string, spotIds: string[]): Promise<Spot[]> { return this.write((now) => spots.setRouteOrder(this.db, areaId, spotIds, now)); }

  // ---------- spots ----------
  getSpot(id: string): Promise<Spot | null> { return this.read(() => spots.getSpot(this.db, id)); }
  createSpot(input: SpotInput): Promise<Spot> { return this.write((now) => spots.insertSpot(this.db, input, now)); }
  updateSpot(id: string, input: SpotInput): Promise<Spot> { return this.write((now) => spots.updateSpot(this.db, id, input, now)); }
  retireSpot(id: string, reason: string): Promise<Spot> { return this.write((now) => spots.retireSpot(this.db, id, reason, now)); }

  // ---------- meters ----------
  getMeter(id: string): Promise<Meter | null> { return this.read(() => meters.getMeter(this.db, id)); }
  createMeter(input: MeterInput): Promise<Meter> { return this.write((now) => meters.insertMeter(this.db, input, now)); }
  updateMeter(id: string, input: MeterInput): Promise<Meter> { return this.write((now) => meters.updateMeter(this.db, id, input, now)); }

  // ---------- rounds ----------
  listRounds(siteId: string): Promise<Round[] | null> {
    return this.read(() => (sites.siteExists(this.db, siteId) ? rounds.listRounds(this.db, siteId) : null));
  }
  createRound(input: RoundInput): Promise<{ round: Round; created: boolean }> { return this.write((now) => rounds.insertRound(this.db, input, now)); }
  getRoundSummary(id: string): Promise<RoundSummary | null> { return this.read(() => rounds.roundSummary(this.db, id)); }
  finishRound(id: string, input: RoundFinishInput): Promise<RoundSummary> {
    return this.write(() => {
      rounds.finishRound(this.db, id, input);
      return rounds.roundSummary(this.db, id)!;
    });
  }
  addSkip(roundId: string, input: SkipInput): Promise<{ skip: Skip; created: boolean }> {
    return this.write((now) => rounds.insertSkip(this.db, roundId, input, now));
  }

  // ---------- readings ----------
  async ingestReadings(inputs: ReadingInput[], opts: { receivedAt?: string } = {}): Promise<ReadingAck[]> {
    const acks = await this.write((now) => readings.ingestReadings(this.db, inputs, opts.receivedAt ?? now));
    // Committed. Answer each with the stored revision (for a conflict: the one that stays).
    const stored = await this.read(() => readings.getReadingsByIds(this.db, acks.map((a) => a.id)));
    return acks.map((a) => {
      const reading = stored.get(a.id);
      return reading ? { ...a, reading } : a;
    });
  }

  getReading(id: string): Promise<{ reading: Reading; history: Reading[] } | null> {
    return this.read(() => {
      const reading = readings.getReadingEntity(this.db, id);
      return reading ? { reading, history: readings.readingHistory(this.db, id) } : null;
    });
  }

  listSpotReadings(spotId: string, opts: { history: boolean; limit: number }): Promise<Reading[] | null> {
    return this.read(() => (spots.spotSite(this.db, spotId) === null ? null : readings.listSpotReadings(this.db, spotId, opts)));
  }

  listRoundReadings(roundId: string): Promise<Reading[] | null> {
    return this.read(() => (rounds.getRound(this.db, roundId) === null ? null : readings.listRoundReadings(this.db, roundId)));
  }

  async correctReading(id: string, input: CorrectionInput, opts: { receivedAt?: string } = {}): Promise<{ reading: Reading; created: boolean }> {
    const { created } = await this.write((now) => readings.correctReading(this.db, id, input, opts.receivedAt ?? now));
    const reading = await this.read(() => readings.getReadingEntity(this.db, input.id));
    return { reading: reading!, created };
  }

  async tombstoneReading(id: string, reason: string, opts: { at?: string } = {}): Promise<Reading> {
    await this.write((now) => readings.tombstoneReading(this.db, id, reason, opts.at ?? now));
    return (await this.read(() => readings.getReadingEntity(this.db, id)))!;
  }

  listConflicts(): Promise<ReadingConflict[]> { return this.read(() => readings.listConflicts(this.db)); }
}
