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
  Area, AreaInput, CorrectionInput, LimitSet, LimitSetInput, Meter, MeterInput, Reading, ReadingAck,
  ReadingConflict, ReadingInput, Round, RoundInput, RoundSummary, SetupBundle, Site, SiteInput, Skip,
  SkipInput, Spot, SpotInput,
} from '../../core/schemas';

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
}
