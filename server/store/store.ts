/**
 * The one storage interface. Routes call only this; SQL lives only in the
 * implementations (sqlite/ today; a PostgreSQL one can follow behind the same
 * methods, which is why every method is async although better-sqlite3 is not).
 *
 * Conventions
 * - Inputs arrive already checked by the zod schemas of core/schemas; the store
 *   checks what only it can see: that referenced ids exist and belong together,
 *   uniqueness, and the state of a reading's history.
 * - `get*` answers null for an unknown id; every other method throws StoreError
 *   ('not-found', 'conflict', 'invalid') with field paths relative to its input.
 * - Times are stored and answered as UTC ISO 8601 with milliseconds.
 * - Readings are append-only: a correction is a new revision, a delete a tombstone.
 *   Every answered Reading carries derived values recomputed from its stored
 *   inputs by core/readings/derive.ts.
 */
import type {
  Area, AreaInput, CorrectionInput, FollowUp, FollowUpClose, FollowUpEdit, FollowUpInput, FollowUpReopen, FollowUpWithEvents,
  LimitSet, LimitSetInput, Meter, MeterInput, PlanInfo, Reading, ReadingAck, ReadingConflict, ReadingInput, Round, RoundInput,
  RoundSummary, SetupBundle, Site, SiteExport, SiteInput, Skip, SkipInput, Spot, SpotInput, SpotPosition,
} from '../../core/schemas';
import type { DistanceUnit } from '../../core/units/distance';
import type { Polarity, ReadingUnit } from '../../core/units/field';

export interface StoreHealth {
  kind: string;
  ok: boolean;
  schemaVersion: number;
  quickCheck: string;
}

export interface RoundFinishInput {
  endedAt: string;
  notes?: string | undefined;
}

/**
 * A current, not deleted reading revision as the review, the trend and the CSV
 * export read it: the stored inputs its verdict and estimate need, nothing derived.
 */
export interface LeanReading {
  id: string;
  spotId: string;
  roundId: string;
  meterId: string;
  takenAt: string;
  value: number;
  unit: ReadingUnit;
  polarity: Polarity;
  distanceValue: number;
  distanceUnit: DistanceUnit;
  distanceUncertaintyM: number | null;
  groundBehindValue: number | null;
  groundBehindUnit: DistanceUnit | null;
  meterCalibratedDistanceM: number | null;
  meterCalibrationDue: string;
  /** The reading's relative humidity, else its round's, else null. */
  rhPercent: number | null;
}

/** A span of time [startMs, endMs), ms since the epoch: a site week. */
export interface TimeWindow {
  startMs: number;
  endMs: number;
}

/** One week summarised (kept as a cache for past weeks): per spot and for the whole site. */
export interface WeekAggregate extends TimeWindow {
  readings: number;
  /** Median RH of the week's readings (the reading's, else its round's). */
  medianRhPercent: number | null;
  spots: Map<string, { readings: number; medianAbsFieldVPerM: number; maxAbsFieldVPerM: number; medianRhPercent: number | null }>;
}

/** What the weekly review reads, from one snapshot. */
export interface ReviewData {
  setup: SetupBundle;
  /** The week's current readings, all spots. */
  readings: LeanReading[];
  /** Aggregates of the given history weeks, oldest first. */
  history: WeekAggregate[];
  /** Rounds started in the week, and their skips. */
  rounds: Round[];
  skips: Skip[];
  /** Open follow-ups of the site. */
  openFollowUps: FollowUp[];
}

export interface TrendData {
  setup: SetupBundle;
  spot: Spot;
  area: Area;
  /** The spot's current readings in the range, oldest first. */
  readings: LeanReading[];
}

/** One stored revision with everything the readings CSV shows beside it. */
export interface ExportedReading extends LeanReading {
  temperatureC: number | null;
  readingRhPercent: number | null;
  roundRhPercent: number | null;
  zeroed: boolean;
  note: string;
  surveyor: string;
  meterSerial: string;
  supersedesId: string | null;
  supersededById: string | null;
  correctionReason: string | null;
  deleted: { reason: string; at: string } | null;
}

/** An import of readings made elsewhere: rounds (identical retries are harmless), then readings, in ONE transaction. */
export interface ReadingImportBatch {
  rounds: { input: RoundInput; endedAt: string }[];
  readings: ReadingInput[];
}

export interface Store {
  /** 'sqlite' or 'postgres'. */
  readonly kind: string;
  /** Where the data lives, for messages (a file path, a database name). */
  readonly location: string;

  health(): Promise<StoreHealth>;
  /** True when the database holds no site (the demo loads only into an empty database). */
  isEmpty(): Promise<boolean>;
  /** Flushes and closes (SQLite: checkpoints the WAL into the main file). */
  close(): Promise<void>;

  listSites(): Promise<Site[]>;
  getSite(id: string): Promise<Site | null>;
  createSite(input: SiteInput): Promise<Site>;
  updateSite(id: string, input: SiteInput): Promise<Site>;
  /** Everything a tablet needs to walk the site offline; retired spots included (with retiredAt). */
  getSetup(siteId: string): Promise<SetupBundle | null>;

  getLimitSet(id: string): Promise<LimitSet | null>;
  createLimitSet(input: LimitSetInput): Promise<LimitSet>;
  updateLimitSet(id: string, input: LimitSetInput): Promise<LimitSet>;

  getArea(id: string): Promise<Area | null>;
  createArea(input: AreaInput): Promise<Area>;
  updateArea(id: string, input: AreaInput): Promise<Area>;
  /** Puts the given spots first, in this order; the area's other spots follow in their old order. Answers the active spots in route order. */
  setRouteOrder(areaId: string, spotIds: string[]): Promise<Spot[]>;

  getSpot(id: string): Promise<Spot | null>;
  createSpot(input: SpotInput): Promise<Spot>;
  updateSpot(id: string, input: SpotInput): Promise<Spot>;
  /** Idempotent: retiring a retired spot answers it unchanged. */
  retireSpot(id: string, reason: string): Promise<Spot>;

  getMeter(id: string): Promise<Meter | null>;
  createMeter(input: MeterInput): Promise<Meter>;
  updateMeter(id: string, input: MeterInput): Promise<Meter>;

  /** Newest first; null for an unknown site. */
  listRounds(siteId: string): Promise<Round[] | null>;
  /** created false: an identical retry of a round already stored. Same id with other content: conflict. */
  createRound(input: RoundInput): Promise<{ round: Round; created: boolean }>;
  getRoundSummary(id: string): Promise<RoundSummary | null>;
  finishRound(id: string, input: RoundFinishInput): Promise<RoundSummary>;
  /** created false: an identical retry. */
  addSkip(roundId: string, input: SkipInput): Promise<{ skip: Skip; created: boolean }>;

  /**
   * Stores a batch of readings in ONE transaction and answers only after it
   * committed. Per reading: a new id is stored; an id already stored with the
   * same content is a duplicate; with other content it is kept in the conflicts
   * table and reported as a conflict. An unknown round, spot or meter (or a
   * surface-voltage reading from a meter without a calibrated distance) fails the
   * whole batch and nothing is stored.
   */
  ingestReadings(inputs: ReadingInput[], opts?: { receivedAt?: string }): Promise<ReadingAck[]>;
  /** The revision with this id and the whole history of its reading (oldest first). */
  getReading(id: string): Promise<{ reading: Reading; history: Reading[] } | null>;
  /** Newest first. Without history: current revisions that are not deleted. Null for an unknown spot. */
  listSpotReadings(spotId: string, opts: { history: boolean; limit: number }): Promise<Reading[] | null>;
  /** Current, not deleted revisions taken in the round, in time order. Null for an unknown round. */
  listRoundReadings(roundId: string): Promise<Reading[] | null>;
  /** created false: an identical retry of this very correction. Conflict when the revision is already superseded or deleted. */
  correctReading(id: string, input: CorrectionInput, opts?: { receivedAt?: string }): Promise<{ reading: Reading; created: boolean }>;
  /** Conflict when the reading is already deleted or superseded. */
  tombstoneReading(id: string, reason: string, opts?: { at?: string }): Promise<Reading>;
  /** Newest first. */
  listConflicts(): Promise<ReadingConflict[]>;

  // ---------- follow-ups (issue 4) ----------
  /** opts.at: the time to record (the demo loader writes history); default now. */
  createFollowUp(input: FollowUpInput, opts?: { at?: string }): Promise<FollowUpWithEvents>;
  getFollowUp(id: string): Promise<FollowUpWithEvents | null>;
  editFollowUp(id: string, edit: FollowUpEdit): Promise<FollowUpWithEvents>;
  /** Conflict when already closed, or when the verifying reading is not a current reading of the spot, taken after opening, within limits. */
  closeFollowUp(id: string, close: FollowUpClose, opts?: { at?: string }): Promise<FollowUpWithEvents>;
  reopenFollowUp(id: string, reopen: FollowUpReopen): Promise<FollowUpWithEvents>;
  /** Null for an unknown spot / site. */
  listSpotFollowUps(spotId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[] | null>;
  listSiteFollowUps(siteId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[] | null>;

  // ---------- review and trend (issue 4) ----------
  /** Null for an unknown site. Past history weeks are summarised once and kept (see migration 0004). */
  reviewData(siteId: string, q: { week: TimeWindow; history: TimeWindow[]; timeZone: string; nowMs: number }): Promise<ReviewData | null>;
  /** Null for an unknown spot. fromMs null: from the first reading. */
  trendData(spotId: string, fromMs: number | null, toMs: number): Promise<TrendData | null>;

  // ---------- floor plans, positions, labels (issue 4) ----------
  /** Not-found for an unknown area. */
  putAreaPlan(areaId: string, plan: { contentType: PlanInfo['contentType']; bytes: Buffer; width: number | null; height: number | null; sha256: string }): Promise<PlanInfo>;
  /** Null when the area is unknown; plan null when it has none. */
  getAreaPlan(areaId: string): Promise<{ plan: { info: PlanInfo; bytes: Buffer } | null } | null>;
  deleteAreaPlan(areaId: string): Promise<boolean>;
  setSpotPosition(spotId: string, position: { x: number; y: number } | null): Promise<SpotPosition>;
  /** Null for an unknown area. */
  areaPins(areaId: string): Promise<{ plan: PlanInfo | null; pins: { spotId: string; code: string; name: string; position: { x: number; y: number } | null; latest: Reading | null }[] } | null>;
  /** Case-insensitive; null when the site has no such code. */
  getSpotByCode(siteId: string, code: string): Promise<Spot | null>;

  // ---------- data in and out (issue 4) ----------
  /** Every revision taken in [fromMs, toMs) (superseded and deleted ones too), oldest first; null for an unknown site. */
  exportReadings(siteId: string, fromMs: number | null, toMs: number | null): Promise<{ setup: SetupBundle; readings: ExportedReading[] } | null>;
  /** Which of these reading ids are stored. */
  existingReadingIds(ids: string[]): Promise<Set<string>>;
  /** Rounds and readings in ONE transaction: all or nothing. */
  importReadings(batch: ReadingImportBatch): Promise<{ acks: ReadingAck[]; roundsCreated: number }>;
  exportSite(siteId: string): Promise<SiteExport | null>;
  /** Conflict when any id exists already; one transaction. Answers row counts. */
  importSite(data: SiteExport): Promise<Record<string, number>>;
}
