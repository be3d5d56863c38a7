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
import type {
  FollowUp, FollowUpClose, FollowUpEdit, FollowUpInput, FollowUpReopen, FollowUpWithEvents, PlanInfo, SiteExport, SpotPosition,
} from '../../../core/schemas';
import { StoreError, StoreStartupError } from '../errors';
import type {
  ExportedReading, ReadingImportBatch, ReviewData, RoundFinishInput, Store, StoreHealth, TimeWindow, TrendData, WeekAggregate,
} from '../store';
import { nowIso, type Db } from './db';
import { migrate } from './migrate';
import * as areas from './repos/areas';
import * as exchange from './repos/exchange';
import * as followUps from './repos/follow-ups';
import * as plans from './repos/plans';
import * as review from './repos/review';
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
  updateSite(id: string, input: SiteInput): Promise<Site> {
    return this.write((now) => {
      const site = sites.updateSite(this.db, id, input, now);
      review.invalidateSite(this.db, id); // weeks are the site's local weeks: a new time zone, new weeks
      return site;
    });
  }

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
        followUps: followUps.listSiteFollowUps(this.db, siteId, 'open'),
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
    const acks = await this.write((now) => {
      const a = readings.ingestReadings(this.db, inputs, opts.receivedAt ?? now);
      this.invalidateStored(inputs, a);
      return a;
    });
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
    const { created } = await this.write((now) => {
      const old = this.db.prepare('SELECT spot_id, taken_at FROM readings WHERE id = ?').get(id) as { spot_id: string; taken_at: string } | undefined;
      const r = readings.correctReading(this.db, id, input, opts.receivedAt ?? now);
      if (old) review.invalidateWeeks(this.db, old.spot_id, old.taken_at);
      review.invalidateWeeks(this.db, input.spotId, input.takenAt);
      return r;
    });
    const reading = await this.read(() => readings.getReadingEntity(this.db, input.id));
    return { reading: reading!, created };
  }

  async tombstoneReading(id: string, reason: string, opts: { at?: string } = {}): Promise<Reading> {
    await this.write((now) => {
      readings.tombstoneReading(this.db, id, reason, opts.at ?? now);
      const r = this.db.prepare('SELECT spot_id, taken_at FROM readings WHERE id = ?').get(id) as { spot_id: string; taken_at: string };
      review.invalidateWeeks(this.db, r.spot_id, r.taken_at);
    });
    return (await this.read(() => readings.getReadingEntity(this.db, id)))!;
  }

  listConflicts(): Promise<ReadingConflict[]> { return this.read(() => readings.listConflicts(this.db)); }

  /** Drops the kept weekly aggregates of the weeks newly stored readings were taken in (in the caller's transaction). */
  private invalidateStored(inputs: ReadingInput[], acks: { id: string; status: ReadingAck['status'] }[]): void {
    const seen = new Set<string>();
    acks.forEach((a, i) => {
      const input = inputs[i];
      if (a.status !== 'stored' || !input) return;
      const key = `${input.spotId} ${input.takenAt.slice(0, 10)}`;
      if (seen.has(key)) return;
      seen.add(key);
      review.invalidateWeeks(this.db, input.spotId, input.takenAt);
    });
  }

  // ---------- follow-ups ----------
  createFollowUp(input: FollowUpInput, opts: { at?: string } = {}): Promise<FollowUpWithEvents> {
    return this.write((now) => followUps.insertFollowUp(this.db, input, opts.at ?? now));
  }
  getFollowUp(id: string): Promise<FollowUpWithEvents | null> { return this.read(() => followUps.getFollowUp(this.db, id)); }
  editFollowUp(id: string, edit: FollowUpEdit): Promise<FollowUpWithEvents> { return this.write((now) => followUps.editFollowUp(this.db, id, edit, now)); }
  closeFollowUp(id: string, close: FollowUpClose, opts: { at?: string } = {}): Promise<FollowUpWithEvents> {
    return this.write((now) => followUps.closeFollowUp(this.db, id, close, opts.at ?? now));
  }
  reopenFollowUp(id: string, reopen: FollowUpReopen): Promise<FollowUpWithEvents> { return this.write((now) => followUps.reopenFollowUp(this.db, id, reopen, now)); }
  listSpotFollowUps(spotId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[] | null> {
    return this.read(() => (spots.spotSite(this.db, spotId) === null ? null : followUps.listSpotFollowUps(this.db, spotId, status)));
  }
  listSiteFollowUps(siteId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[] | null> {
    return this.read(() => (sites.getSite(this.db, siteId) === null ? null : followUps.listSiteFollowUps(this.db, siteId, status)));
  }

  // ---------- review and trend ----------
  async reviewData(siteId: string, q: { week: TimeWindow; history: TimeWindow[]; timeZone: string; nowMs: number }): Promise<ReviewData | null> {
    const complete = q.history.filter((w) => w.endMs <= q.nowMs);
    const missing = await this.read(() => {
      if (sites.getSite(this.db, siteId) === null) return null;
      const cached = review.cachedWeeks(this.db, siteId, q.timeZone, complete, false);
      return complete.filter((w) => !cached.has(w.startMs));
    });
    if (missing === null) return null;
    // Past weeks are summarised once (a write), then read from the cache.
    if (missing.length > 0) await this.write((now) => review.fillWeekCache(this.db, siteId, q.timeZone, missing, now));
    return this.read(() => {
      const setup = this.readSetup(siteId);
      if (!setup) return null;
      const cached = review.cachedWeeks(this.db, siteId, q.timeZone, complete);
      const history: WeekAggregate[] = q.history.map((w) => cached.get(w.startMs) ?? review.aggregateWeek(w, review.siteWeekReadings(this.db, siteId, w)));
      const { rounds: weekRounds, skips } = review.roundsInWindow(this.db, siteId, q.week);
      return {
        setup, readings: review.siteWeekReadings(this.db, siteId, q.week), history, rounds: weekRounds, skips,
        openFollowUps: setup.followUps ?? [],
      };
    });
  }

  trendData(spotId: string, fromMs: number | null, toMs: number): Promise<TrendData | null> {
    return this.read(() => {
      const spot = spots.getSpot(this.db, spotId);
      if (!spot) return null;
      const area = areas.getArea(this.db, spot.areaId)!;
      const limitSet = area.limitSetId ? limitSets.getLimitSet(this.db, area.limitSetId) : null;
      // Only what the spot's verdicts need: its area, that area's limit set, the site's meters.
      const setup: SetupBundle = {
        site: sites.getSite(this.db, area.siteId)!, areas: [area], spots: [spot], meters: meters.listMeters(this.db, area.siteId),
        limitSets: limitSet ? [limitSet] : [],
      };
      return { setup, spot, area, readings: review.spotRangeReadings(this.db, spotId, fromMs, toMs) };
    });
  }

  /** The set-up bundle inside the caller's read. */
  private readSetup(siteId: string): SetupBundle | null {
    const site = sites.getSite(this.db, siteId);
    if (!site) return null;
    return {
      site, areas: areas.listAreas(this.db, siteId), spots: spots.listSiteSpots(this.db, siteId), meters: meters.listMeters(this.db, siteId),
      limitSets: limitSets.listLimitSets(this.db, siteId), followUps: followUps.listSiteFollowUps(this.db, siteId, 'open'),
    };
  }

  // ---------- floor plans, positions, labels ----------
  putAreaPlan(areaId: string, plan: plans.PlanToStore): Promise<PlanInfo> { return this.write((now) => plans.putPlan(this.db, areaId, plan, now)); }
  getAreaPlan(areaId: string): Promise<{ plan: { info: PlanInfo; bytes: Buffer } | null } | null> {
    return this.read(() => (areas.areaSite(this.db, areaId) === null ? null : { plan: plans.getPlanBytes(this.db, areaId) }));
  }
  deleteAreaPlan(areaId: string): Promise<boolean> { return this.write(() => plans.deletePlan(this.db, areaId)); }
  setSpotPosition(spotId: string, position: { x: number; y: number } | null): Promise<SpotPosition> {
    return this.write((now) => plans.setSpotPosition(this.db, spotId, position, now));
  }
  areaPins(areaId: string): Promise<{ plan: PlanInfo | null; pins: plans.PinData[] } | null> {
    return this.read(() => (areas.areaSite(this.db, areaId) === null ? null : { plan: plans.getPlanInfo(this.db, areaId), pins: plans.areaPins(this.db, areaId) }));
  }
  getSpotByCode(siteId: string, code: string): Promise<Spot | null> {
    return this.read(() => {
      const r = this.db.prepare('SELECT id FROM spots WHERE site_id = ? AND code = ?').get(siteId, code) as { id: string } | undefined;
      return r ? spots.getSpot(this.db, r.id) : null;
    });
  }

  // ---------- data in and out ----------
  exportReadings(siteId: string, fromMs: number | null, toMs: number | null): Promise<{ setup: SetupBundle; readings: ExportedReading[] } | null> {
    return this.read(() => {
      const setup = this.readSetup(siteId);
      return setup ? { setup, readings: exchange.exportReadingRows(this.db, siteId, fromMs, toMs) } : null;
    });
  }
  existingReadingIds(ids: string[]): Promise<Set<string>> { return this.read(() => exchange.existingReadingIds(this.db, ids)); }
  async importReadings(batch: ReadingImportBatch): Promise<{ acks: ReadingAck[]; roundsCreated: number }> {
    return this.write((now) => {
      let roundsCreated = 0;
      batch.rounds.forEach((r, i) => {
        try {
          if (rounds.insertRound(this.db, r.input, now).created) roundsCreated++;
          rounds.finishRound(this.db, r.input.id, { endedAt: r.endedAt });
        } catch (e) {
          if (e instanceof StoreError) throw new StoreError(e.code, `import round ${i + 1} (${r.input.surveyor}, ${r.input.startedAt.slice(0, 10)}): ${e.message}`);
          throw e;
        }
      });
      const acks = readings.ingestReadings(this.db, batch.readings, now);
      this.invalidateStored(batch.readings, acks);
      return { acks, roundsCreated };
    });
  }
  exportSite(siteId: string): Promise<SiteExport | null> { return this.read(() => exchange.exportSite(this.db, siteId, nowIso())); }
  importSite(data: SiteExport): Promise<Record<string, number>> { return this.write(() => exchange.importSite(this.db, data)); }
}
