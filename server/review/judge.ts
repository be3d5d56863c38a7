/**
 * The verdict and charge estimate of many readings at once, for the trend, the
 * weekly review and the readings CSV: the same numbers as the Reading entity
 * (core/readings/derive.ts via server/store/reading-entity.ts), without paying
 * for a full estimate on every reading.
 *
 * Why: a full estimate (with its interval and hazard verdicts) costs 10 to 180 µs;
 * a week of 500 spots is ~19k readings and one spot's year ~2k (bench/run.ts).
 * Electrostatics is linear: for a fixed model, geometry, distance and meter, the
 * charge and surface charge density are proportional to the field (or, for the
 * conductor model, to the potential) and the energy to its square. So the judge
 * makes the full estimate once per distinct set of those inputs, checks that a
 * second estimate at twice the driving value scales exactly so (to 1e-9), and then
 * scales; where the check fails, every reading gets its own full estimate. The
 * verdict itself is always core's deriveReading with those estimate metrics, so
 * levels, ratios and reasons are the entity's own (test/server/review.test.ts
 * compares them on every demo reading).
 */
import { ruleApplies, type LimitRule, type LimitVerdict, type VerdictLevel } from '../../core/limits/evaluate';
import { estimate } from '../../core/physics/estimate';
import { deriveReading } from '../../core/readings/derive';
import { estimateRequestFor, type ReadingEstimateInput } from '../../core/readings/estimate';
import type { Meter, SetupBundle, Spot } from '../../core/schemas';
import type { EstimateRequest, EstimateResponse } from '../../core/schemas/estimate';
import { distanceToMetres } from '../../core/units/distance';
import { isSurfaceVoltageUnit, normalizeReading, VOLTS_PER_SURFACE_VOLTAGE_UNIT } from '../../core/units/field';
import type { LeanReading } from '../store/store';

export interface Judged {
  /** Normalized signed field at the meter, V/m. */
  fieldVPerM: number;
  /** Estimated charge with the spot's model, C (signed); null without a model or estimate. */
  chargeC: number | null;
  /** Estimated surface charge density, C/m^2 (signed); null where the model does not define one. */
  surfaceChargeDensityCPerM2: number | null;
  verdict: LimitVerdict;
}

/** The level and severity of a reading without the verdict's sentences (the review's and trend's bulk path). */
export interface LeanJudged {
  fieldVPerM: number;
  chargeC: number | null;
  surfaceChargeDensityCPerM2: number | null;
  level: VerdictLevel;
  /** The highest ratio of any checked metric to its alarm level; null when no applicable rule has one. */
  ratioToAlarm: number | null;
}

interface EstimateMetrics {
  chargeC: number | null;
  surfaceChargeDensityCPerM2: number | null;
  energyJ: number | null;
}

/** Metrics for one reading; scaled: taken from another reading's estimate by linearity (not computed for this one). */
type ReadingMetrics = EstimateMetrics & { scaled?: boolean };

type Scaling =
  | { kind: 'none' }
  | { kind: 'full' }
  | { kind: 'linear'; driver: number; metrics: EstimateMetrics };

const POWERS: Record<keyof EstimateMetrics, number> = { chargeC: 1, surfaceChargeDensityCPerM2: 1, energyJ: 2 };
const RANK: Record<VerdictLevel, number> = { ok: 0, warn: 1, alarm: 2 };

/** x rounded to 13 significant digits (far below any reported precision, far above floating-point noise). */
function snap(x: number | null): number | null {
  return x !== null && Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(13)) : x;
}

function metricsOf(e: EstimateResponse): EstimateMetrics {
  const f = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  return { chargeC: f(e.chargeC), surfaceChargeDensityCPerM2: f(e.surfaceChargeDensityCPerM2), energyJ: f(e.energyJ) };
}

/** True when `b` (at twice the driving value) is `a` scaled by 2 (charge, density) and 4 (energy). */
function scalesLinearly(a: EstimateMetrics, b: EstimateMetrics): boolean {
  for (const k of Object.keys(POWERS) as (keyof EstimateMetrics)[]) {
    const x = a[k];
    const y = b[k];
    if (x === null || y === null) {
      if (x !== y) return false;
      continue;
    }
    const want = x * 2 ** POWERS[k];
    if (Math.abs(y - want) > 1e-9 * Math.abs(want) + 1e-300) return false;
  }
  return true;
}

function tryEstimate(request: EstimateRequest): EstimateMetrics | null {
  try {
    return metricsOf(estimate(request));
  } catch {
    return null; // the entity path gives estimate null and a note; no metrics either way
  }
}

interface SpotContext {
  spot: Spot;
  rules: LimitRule[];
}

interface Prepared {
  ctx: SpotContext | undefined;
  fieldVPerM: number;
  meter: { calibratedDistanceM: number | null; calibrationDue: string; accuracyRel: number | null; geometryFactor: number | null };
  materialClass: string;
  est: ReadingMetrics | null;
}

export class ReadingJudge {
  private readonly spots = new Map<string, SpotContext>();
  private readonly meters: Map<string, Meter>;
  private readonly scalings = new Map<string, Scaling>();
  /** Full estimates made (for the benchmark's notes). */
  fullEstimates = 0;

  constructor(setup: Pick<SetupBundle, 'spots' | 'areas' | 'limitSets' | 'meters'>) {
    const rulesBySet = new Map(setup.limitSets.map((ls) => [ls.id, ls.rules as LimitRule[]]));
    const areaRules = new Map(setup.areas.map((a) => [a.id, a.limitSetId ? rulesBySet.get(a.limitSetId) ?? [] : []]));
    for (const spot of setup.spots) this.spots.set(spot.id, { spot, rules: areaRules.get(spot.areaId) ?? [] });
    this.meters = new Map(setup.meters.map((m) => [m.id, m]));
  }

  /** The limit rules of the spot's area. */
  rulesOf(spotId: string): LimitRule[] {
    return this.spots.get(spotId)?.rules ?? [];
  }

  /** The verdict with its reasons: core's deriveReading given the estimate's metrics. */
  judge(r: LeanReading): Judged {
    const p = this.prepare(r);
    const core = {
      value: r.value, unit: r.unit, polarity: r.polarity, distance: { value: r.distanceValue, unit: r.distanceUnit }, takenAt: r.takenAt,
      distanceUncertaintyM: r.distanceUncertaintyM,
      groundBehind: r.groundBehindValue === null || r.groundBehindUnit === null ? null : { value: r.groundBehindValue, unit: r.groundBehindUnit },
    };
    const est = p.est;
    const fix = est?.scaled ? snap : (x: number | null) => x;
    const d = deriveReading(core, p.meter, p.ctx?.rules ?? [], {
      materialClass: p.materialClass,
      // Scaled values are snapped for the sentences: scaling leaves last-bit noise (8.404999999999998e-6 for C V^2/2 = 8.405e-6 J)
      // that would flip a reason's rounding at a decimal boundary ("8.40 µJ" against the entity's "8.41 µJ").
      extraMetrics: est ? { chargeC: fix(est.chargeC), surfaceChargeDensityCPerM2: fix(est.surfaceChargeDensityCPerM2), energyJ: fix(est.energyJ) } : {},
    });
    return { fieldVPerM: d.fieldVPerM, chargeC: est?.chargeC ?? null, surfaceChargeDensityCPerM2: est?.surfaceChargeDensityCPerM2 ?? null, verdict: d.verdict };
  }

  /**
   * Level and severity only: the metrics deriveReading builds (|field|, the surface
   * voltage at the meter's calibrated distance, a person's body voltage, the
   * estimate's charge, density and energy) judged by the rules that apply to the
   * spot's material, as core/limits evaluateLimits judges them (at or above a level
   * reaches it), without writing the sentences.
   */
  judgeLean(r: LeanReading): LeanJudged {
    const p = this.prepare(r);
    const abs = Math.abs(p.fieldVPerM);
    const sv = p.meter.calibratedDistanceM ? abs * p.meter.calibratedDistanceM : undefined;
    let level: VerdictLevel = 'ok';
    let ratio: number | null = null;
    for (const rule of p.ctx?.rules ?? []) {
      if (!ruleApplies(rule, p.materialClass)) continue;
      let value: number | null | undefined;
      switch (rule.metric) {
        case 'fieldVPerM': value = abs; break;
        case 'surfaceVoltageV': value = sv; break;
        case 'bodyVoltageV': value = p.materialClass === 'person' ? sv : undefined; break;
        default: value = p.est?.[rule.metric]; break;
      }
      if (value === null || value === undefined || !Number.isFinite(value)) continue;
      const v = Math.abs(value);
      const here: VerdictLevel = rule.alarm !== null && v >= rule.alarm ? 'alarm' : rule.warn !== null && v >= rule.warn ? 'warn' : 'ok';
      if (RANK[here] > RANK[level]) level = here;
      if (rule.alarm !== null && rule.alarm > 0 && (ratio === null || v / rule.alarm > ratio)) ratio = v / rule.alarm;
    }
    return { fieldVPerM: p.fieldVPerM, chargeC: p.est?.chargeC ?? null, surfaceChargeDensityCPerM2: p.est?.surfaceChargeDensityCPerM2 ?? null, level, ratioToAlarm: ratio };
  }

  private prepare(r: LeanReading): Prepared {
    const ctx = this.spots.get(r.spotId);
    const m = this.meters.get(r.meterId);
    const meter = {
      calibratedDistanceM: r.meterCalibratedDistanceM, calibrationDue: r.meterCalibrationDue,
      accuracyRel: m?.accuracyRel ?? null, geometryFactor: m?.geometryFactor ?? null,
    };
    const fieldVPerM = normalizeReading({ value: r.value, unit: r.unit, polarity: r.polarity, calibratedDistanceM: r.meterCalibratedDistanceM });
    const materialClass = ctx?.spot.materialClass ?? 'unknown';
    const est = ctx && ctx.spot.model !== null && Number.isFinite(fieldVPerM) ? this.estimateMetrics(r, ctx.spot, fieldVPerM, meter) : null;
    return { ctx, fieldVPerM, meter, materialClass, est };
  }

  private estimateMetrics(r: LeanReading, spot: Spot, fieldVPerM: number, meter: { accuracyRel: number | null; geometryFactor: number | null }): ReadingMetrics | null {
    const surfaceVoltage = isSurfaceVoltageUnit(r.unit);
    const potentialV = surfaceVoltage ? (r.polarity === '-' ? -1 : 1) * r.value * VOLTS_PER_SURFACE_VOLTAGE_UNIT[r.unit as 'V' | 'kV'] : null;
    // Everything the request is made of, except the driving field or potential (the spot and meter are fixed for this judge).
    const key = `${r.spotId}|${r.meterId}|${r.distanceValue} ${r.distanceUnit}|${r.distanceUncertaintyM}|${r.groundBehindValue} ${r.groundBehindUnit}|${surfaceVoltage}`;
    const driver = spot.model === 'conductor' ? potentialV : fieldVPerM;
    const known = this.scalings.get(key);
    if (known?.kind === 'none') return null;
    if (known?.kind === 'linear' && driver !== null && driver !== 0) {
      const k = driver / known.driver;
      const m = known.metrics;
      return {
        chargeC: m.chargeC === null ? null : m.chargeC * k,
        surfaceChargeDensityCPerM2: m.surfaceChargeDensityCPerM2 === null ? null : m.surfaceChargeDensityCPerM2 * k,
        energyJ: m.energyJ === null ? null : m.energyJ * k * k,
        scaled: true,
      };
    }
    // The same input deriveReading gives core/readings/estimate.ts.
    const input: ReadingEstimateInput = {
      fieldVPerM,
      distanceM: distanceToMetres(r.distanceValue, r.distanceUnit),
      potentialV,
      distanceUncertaintyM: r.distanceUncertaintyM,
      groundBehindM: r.groundBehindValue !== null && r.groundBehindUnit !== null ? distanceToMetres(r.groundBehindValue, r.groundBehindUnit) : null,
      meterAccuracyRel: meter.accuracyRel,
      geometryFactor: meter.geometryFactor,
      materialClass: spot.materialClass,
    };
    const made = estimateRequestFor(input, { model: spot.model, geometry: spot.geometry, materialClass: spot.materialClass, distanceUncertaintyM: spot.distanceUncertaintyM });
    if ('note' in made) {
      this.scalings.set(key, { kind: 'none' });
      return null;
    }
    const request = made.request;
    const driverKey = request.potentialV !== undefined ? 'potentialV' : 'fieldVPerM';
    const d = request[driverKey] ?? 0;
    this.fullEstimates++;
    const here = tryEstimate(request);
    if (known || here === null || d === 0 || !Number.isFinite(d)) return here;
    this.fullEstimates++;
    const twice = tryEstimate({ ...request, [driverKey]: 2 * d });
    this.scalings.set(key, twice !== null && scalesLinearly(here, twice) ? { kind: 'linear', driver: d, metrics: here } : { kind: 'full' });
    return here;
  }
}
