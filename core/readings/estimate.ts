/**
 * The charge estimate and hazard verdicts of ONE stored reading: builds the
 * EstimateRequest of issue 3 from the reading, the spot's model and geometry and the
 * meter, runs core/physics estimate(), and judges the result with core/hazard
 * hazardVerdicts() for the spot's area. Called by deriveReading (server and tablet
 * alike), so an estimate shown offline is the one the server answers.
 *
 * Rules:
 * - distanceM is the reading's distance (the gap to the surface for sized objects,
 *   to the charge for point, dipole and image-charge models, as the API says);
 * - distance uncertainty: the reading's, else the spot's, else estimate()'s default;
 * - sheet: groundBehindM from the reading's "ground behind", else the spot geometry;
 * - conductor: the potential is the meter's surface-voltage display (a reading in V
 *   or kV); it equals the conductor's potential only for a large flat target with
 *   the meter as the nearest ground, which the estimate says in a warning. A field
 *   reading gives no potential: no estimate, and a note says why.
 * Nothing here throws on bad set-up: the estimate is null and a note explains.
 */
import { z } from 'zod';
import { estimate } from '../physics/estimate';
import { hazardVerdicts, type HazardArea, type ObjectKind, type Verdict } from '../hazard/verdicts';
import type { EstimateGeometry, EstimateModel, EstimateRequest, EstimateResponse } from '../schemas/estimate';

/** A note about a reading's estimate: why there is none, or what was assumed. */
export interface EstimateNote {
  code: string;
  message: string;
}

/** The parts of a spot the estimate needs (a Spot entity fits). */
export interface SpotEstimateContext {
  model: EstimateModel | null;
  geometry?: Partial<Record<keyof EstimateGeometry, number | undefined>> | null;
  materialClass?: string | null;
  /** The spot's default distance standard uncertainty, m. */
  distanceUncertaintyM?: number | null;
}

/** The parts of an area the hazard verdicts need (an Area entity fits). */
export interface AreaHazardContext {
  kind: 'epa' | 'hazardous' | 'general';
  zone?: 0 | 1 | 2 | 20 | 21 | 22 | null;
  gasGroup?: 'IIA' | 'IIB' | 'IIC' | null;
  substanceId?: string | null;
  /** The dust's minimum ignition energy, J, when the site knows it (dust zones). */
  dustMieJ?: number | null;
}

/** What the reading contributes, already in SI. */
export interface ReadingEstimateInput {
  /** Normalized signed field at the meter, V/m. */
  fieldVPerM: number;
  distanceM: number;
  /** The surface-voltage display as a signed potential, V; null for a field reading. */
  potentialV: number | null;
  distanceUncertaintyM: number | null;
  groundBehindM: number | null;
  meterAccuracyRel: number | null;
  geometryFactor: number | null;
  materialClass: string | null;
}

export interface ReadingEstimate {
  estimate: EstimateResponse | null;
  note: EstimateNote | null;
  hazards: Verdict[];
}

const GEOMETRY_KEYS: readonly (keyof EstimateGeometry)[] = [
  'radiusM', 'lengthM', 'separationM', 'heightAboveGroundM', 'widthM', 'heightM', 'thicknessM',
  'relativePermittivity', 'groundBehindM', 'capacitanceF',
];

export const SV_AS_POTENTIAL_WARNING = {
  code: 'surface-voltage-as-potential',
  message: "The meter's surface-voltage display is taken as the conductor's potential. It equals it only for a large flat target with the meter as the nearest ground; a contact voltmeter gives the true potential.",
} as const;

/**
 * The EstimateRequest for a reading on a spot, or a note saying why none can be made.
 * @example estimateRequestFor({ fieldVPerM: -2e4, distanceM: 0.1, potentialV: null, distanceUncertaintyM: null, groundBehindM: null,
 *   meterAccuracyRel: 0.05, geometryFactor: 1, materialClass: 'insulator' }, { model: 'line', geometry: { radiusM: 0.35, lengthM: 1.6 } })
 *   // { request: { model: 'line', fieldVPerM: -2e4, distanceM: 0.1, geometry: { radiusM: 0.35, lengthM: 1.6 }, meterAccuracyRel: 0.05, geometryFactor: 1 } }
 */
export function estimateRequestFor(input: ReadingEstimateInput, spot: SpotEstimateContext): { request: EstimateRequest } | { note: EstimateNote } {
  const model = spot.model;
  if (model === null) return { note: { code: 'no-model', message: 'The spot has no estimation model: set one under Set-up → Spots to get a charge estimate.' } };
  const geometry: EstimateGeometry = {};
  for (const k of GEOMETRY_KEYS) {
    const v = spot.geometry?.[k];
    if (typeof v === 'number' && Number.isFinite(v)) geometry[k] = v;
  }
  if (model === 'sheet' && input.groundBehindM !== null && input.groundBehindM > 0) geometry.groundBehindM = input.groundBehindM;
  const request: EstimateRequest = { model, geometry };
  if (model === 'conductor') {
    if (input.potentialV === null) {
      return { note: { code: 'conductor-needs-potential', message: "No estimate: the conductor model needs the conductor's potential. Read the meter in surface-voltage mode (V or kV), or measure it with a contact voltmeter." } };
    }
    request.potentialV = input.potentialV;
  } else {
    request.fieldVPerM = input.fieldVPerM;
  }
  request.distanceM = input.distanceM;
  const du = input.distanceUncertaintyM ?? spot.distanceUncertaintyM ?? null;
  if (du !== null && Number.isFinite(du) && du >= 0) request.distanceUncertaintyM = du;
  if (input.meterAccuracyRel !== null && input.meterAccuracyRel >= 0 && input.meterAccuracyRel < 1) request.meterAccuracyRel = input.meterAccuracyRel;
  if (input.geometryFactor !== null && input.geometryFactor >= 1 && input.geometryFactor <= 2) request.geometryFactor = input.geometryFactor;
  return { request };
}

/**
 * The area as core/hazard sees it: dust from the zone (20, 21, 22); the site's dust MIE
 * (area.dustMieJ) when it gave one, else core/hazard uses the fine-dust lower bound of
 * 1 mJ (Wikipedia "Static electricity", energies involved), the cautious choice.
 */
export function hazardAreaOf(area: AreaHazardContext): HazardArea {
  const dust = area.zone === 20 || area.zone === 21 || area.zone === 22;
  return {
    kind: area.kind,
    zone: area.zone ?? null,
    gasGroup: area.gasGroup ?? null,
    dust,
    substanceId: area.substanceId ?? null,
    mieJ: null,
    dustMieJ: area.dustMieJ ?? null,
  };
}

function objectKindOf(materialClass: string | null): ObjectKind {
  return materialClass === 'conductor' || materialClass === 'insulator' || materialClass === 'person' ? materialClass : 'unknown';
}

function firstMessage(e: unknown): string {
  if (e instanceof z.ZodError) return e.issues.map((i) => i.message).join('; ');
  return e instanceof Error ? e.message : String(e);
}

/**
 * Estimate and hazard verdicts of one reading. Never throws.
 * @param input the reading in SI (see ReadingEstimateInput)
 * @param spot the spot's model and geometry, or null (no estimate)
 * @param area the spot's area, or null (no hazard verdicts)
 * @returns { estimate (EstimateResponse or null), note (why none, or null), hazards (Verdict[]) }
 * @example readingEstimate({ fieldVPerM: -2e4, distanceM: 0.1, ... }, { model: 'line', geometry: { radiusM: 0.35, lengthM: 1.6 } }, null).estimate?.chargeC
 *   // about -5.4e-8 C (lambda = 2 pi eps0 rho E sqrt(rho^2 + (L/2)^2) / (L/2), rho = 0.45 m; Q = lambda L)
 */
export function readingEstimate(input: ReadingEstimateInput, spot: SpotEstimateContext | null, area: AreaHazardContext | null): ReadingEstimate {
  let est: EstimateResponse | null = null;
  let note: EstimateNote | null = null;
  if (spot && spot.model !== null) {
    const r = estimateRequestFor(input, spot);
    if ('note' in r) note = r.note;
    else {
      try {
        est = estimate(r.request);
        if (spot.model === 'conductor') est = { ...est, warnings: [...est.warnings, { ...SV_AS_POTENTIAL_WARNING }] };
      } catch (e) {
        note = { code: 'estimate-not-possible', message: `No estimate with the ${spot.model} model: ${firstMessage(e)}. Check the spot's geometry under Set-up → Spots.` };
      }
    }
  }
  let hazards: Verdict[] = [];
  if (area) {
    const objectKind = objectKindOf(input.materialClass ?? spot?.materialClass ?? null);
    const hArea = hazardAreaOf(area);
    try {
      hazards = hazardVerdicts({ area: hArea, objectKind, estimate: est, fieldVPerM: input.fieldVPerM });
    } catch (e) {
      // An unknown substance id: judge by the gas group (or the most sensitive group) and say so.
      hazards = hazardVerdicts({ area: { ...hArea, substanceId: null }, objectKind, estimate: est, fieldVPerM: input.fieldVPerM });
      note ??= { code: 'unknown-substance', message: `${firstMessage(e)}: the hazard checks use the area's gas group instead (or group IIC when none is set).` };
    }
  }
  return { estimate: est, note, hazards };
}
