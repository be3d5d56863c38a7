/**
 * Pure round logic the tablet runs offline: the limit rules of a spot, the
 * derived values of a reading (the same core functions the server runs), the
 * spot's worst and typical reading, and the round summary.
 * No DOM and no storage here, so it is unit-tested directly (test/client).
 */
import { deriveReading } from '../../core/readings/derive';
import type { LimitRule, VerdictLevel } from '../../core/limits';
import { median } from '../../core/stats/median';
import type {
  Area, Meter, ReadingInput, Round, SetupBundle, SkipInput, Spot,
} from '../../core/schemas';
import type { LocalReading } from '../offline/types';

export function areaOf(bundle: SetupBundle, spot: Spot): Area | undefined {
  return bundle.areas.find((a) => a.id === spot.areaId);
}

export function rulesForSpot(bundle: SetupBundle, spot: Spot): LimitRule[] {
  const area = areaOf(bundle, spot);
  const set = area?.limitSetId ? bundle.limitSets.find((l) => l.id === area.limitSetId) : undefined;
  return (set?.rules ?? []) as LimitRule[];
}

/** What deriveReading needs besides the reading: the spot's model and its area (the server passes the same). */
export function deriveOpts(bundle: SetupBundle, spot: Spot | undefined) {
  return { materialClass: spot?.materialClass, spot: spot ?? null, area: spot ? areaOf(bundle, spot) ?? null : null };
}

/** Active spots in route order: areas in the bundle's order, spots by route position then name. */
export function routeOf(bundle: SetupBundle): Spot[] {
  const areaIndex = new Map(bundle.areas.map((a, i) => [a.id, i]));
  return bundle.spots
    .filter((s) => !s.retiredAt)
    .slice()
    .sort((a, b) => (areaIndex.get(a.areaId) ?? 1e9) - (areaIndex.get(b.areaId) ?? 1e9)
      || a.routePosition - b.routePosition || a.name.localeCompare(b.name));
}

/**
 * What the tablet shows and keeps for a reading it made: the input plus derived
 * values, computed offline. The server recomputes the same from the stored inputs.
 */
export function deriveLocal(input: ReadingInput, bundle: SetupBundle, opts: { supersedesId?: string | null; correctionReason?: string | null } = {}): LocalReading {
  const spot = bundle.spots.find((s) => s.id === input.spotId);
  const meter = bundle.meters.find((m) => m.id === input.meterId) ?? null;
  const d = deriveReading(input, meter, spot ? rulesForSpot(bundle, spot) : [], deriveOpts(bundle, spot));
  return {
    ...input,
    receivedAt: '',
    fieldVPerM: d.fieldVPerM,
    distanceM: d.distanceM,
    supersedesId: opts.supersedesId ?? null,
    supersededById: null,
    correctionReason: opts.correctionReason ?? null,
    deleted: null,
    flags: [],
    meterCalibrationOverdue: d.meterCalibrationOverdue,
    verdict: d.verdict,
    estimate: d.estimate,
    estimateNote: d.estimateNote,
    hazards: d.hazards,
    origin: 'local',
  };
}

/** Derived values while typing; null when the value cannot be judged yet. */
export function preview(input: Omit<ReadingInput, 'id' | 'roundId'> & { id?: string; roundId?: string }, bundle: SetupBundle) {
  if (!Number.isFinite(input.value)) return null;
  const spot = bundle.spots.find((s) => s.id === input.spotId);
  const meter: Meter | null = bundle.meters.find((m) => m.id === input.meterId) ?? null;
  try {
    return deriveReading(input, meter, spot ? rulesForSpot(bundle, spot) : [], deriveOpts(bundle, spot));
  } catch {
    return null; // surface-voltage unit without calibrated distance: the form says so
  }
}

export function isCurrent(r: LocalReading): boolean {
  return r.supersededById === null && r.deleted === null;
}

const RANK: Record<VerdictLevel, number> = { ok: 0, warn: 1, alarm: 2 };

/** The worse of two readings: higher verdict level, then larger |field|. */
export function worseReading(a: LocalReading, b: LocalReading): LocalReading {
  const ra = RANK[a.verdict.level]; const rb = RANK[b.verdict.level];
  if (ra !== rb) return ra > rb ? a : b;
  return Math.abs(b.fieldVPerM) > Math.abs(a.fieldVPerM) ? b : a;
}

export interface SpotRoundStats {
  count: number;
  worst: LocalReading | null;
  /** Median of |field| over the spot's current readings, V/m. */
  typicalAbsVPerM: number | null;
}

export function spotStats(readings: readonly LocalReading[]): SpotRoundStats {
  const cur = readings.filter(isCurrent);
  if (cur.length === 0) return { count: 0, worst: null, typicalAbsVPerM: null };
  const abs = cur.map((r) => Math.abs(r.fieldVPerM)).filter(Number.isFinite);
  return {
    count: cur.length,
    worst: cur.reduce(worseReading),
    typicalAbsVPerM: abs.length ? median(abs) : null,
  };
}

export interface LocalSummary {
  readings: number;
  spotsMeasured: number;
  planned: number;
  warnings: number;
  alarms: number;
  skipped: SkipInput[];
  /** Planned spots with neither a reading nor a skip, in plan order. */
  notMeasured: string[];
  overdueMeterReadings: number;
}

/** The round summary computed on the tablet from its own records (works offline). */
export function summarizeRound(round: Pick<Round, 'plannedSpotIds'>, readings: readonly LocalReading[], skips: readonly SkipInput[]): LocalSummary {
  const cur = readings.filter(isCurrent);
  const measured = new Set(cur.map((r) => r.spotId));
  const skippedIds = new Set(skips.map((s) => s.spotId));
  return {
    readings: cur.length,
    spotsMeasured: measured.size,
    planned: round.plannedSpotIds.length,
    warnings: cur.filter((r) => r.verdict.level === 'warn').length,
    alarms: cur.filter((r) => r.verdict.level === 'alarm').length,
    skipped: [...skips],
    notMeasured: round.plannedSpotIds.filter((id) => !measured.has(id) && !skippedIds.has(id)),
    overdueMeterReadings: cur.filter((r) => r.meterCalibrationOverdue).length,
  };
}

/** Revision chains for the spot screen: each current (or deleted) head with its older revisions, newest first. */
export function revisionChains(readings: readonly LocalReading[]): { head: LocalReading; older: LocalReading[] }[] {
  const byId = new Map(readings.map((r) => [r.id, r]));
  const heads = readings.filter((r) => r.supersededById === null || !byId.has(r.supersededById));
  const chains = heads.map((head) => {
    const older: LocalReading[] = [];
    let cur = head.supersedesId ? byId.get(head.supersedesId) : undefined;
    const seen = new Set([head.id]);
    while (cur && !seen.has(cur.id)) {
      older.push(cur);
      seen.add(cur.id);
      cur = cur.supersedesId ? byId.get(cur.supersedesId) : undefined;
    }
    return { head, older };
  });
  return chains.sort((a, b) => b.head.takenAt.localeCompare(a.head.takenAt) || b.head.id.localeCompare(a.head.id));
}
