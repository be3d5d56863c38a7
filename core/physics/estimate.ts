/**
 * estimate(): one field reading (or a conductor's potential) interpreted with one
 * idealised model, with an interval on every derived quantity. Implements the
 * POST /api/estimate contract of issue 3 (schemas in core/schemas/estimate.ts).
 *
 * Uncertainty (first-order, in log space). Every derived quantity q is a product of
 * powers of the reading and of distance-dependent factors, so its relative error is
 * what propagates: s_ln(q)^2 = (dln|q|/dln|E| * u_E)^2 + (dln|q|/dd * u_d)^2, where
 * u_E is the meter's relative standard uncertainty (default 0.05: common practice for
 * hand-held field meters, from memory; the request's meterAccuracyRel overrides it)
 * and u_d the distance's standard uncertainty (default: the larger of 5 mm and 10 % of
 * the distance; a hand-held meter held "at 1 inch" is rarely better). The partial
 * derivatives are taken numerically through the model itself (central differences,
 * relative step 1e-6). The 95 % interval is q x/÷ exp(2 s) (coverage factor k = 2, as
 * in the GUM, JCGM 100:2008 section 6.3): it keeps the sign and is never negative for
 * a positive quantity. Model error (the meter's own image, the real shape) is NOT in
 * the interval: it is reported as warnings.
 */
import {
  EstimateRequestSchema, type EstimateRequest, type EstimateRequestParsed, type EstimateResponse,
} from '../schemas/estimate';
import {
  bulkCylinderFromField, conductorFromPotential, diskFromField, dipoleAxisFromField, dipoleBroadsideFromField,
  imageChargeFromField, layerOnGroundFromField, lineFromField, pointChargeFromField, rectangleFromField,
  sheetFromField, sphereFromField,
} from './models';
import { QUANTITY_NAMES, type ModelResult, type QuantityName } from './types';

/** Default relative standard uncertainty of a field meter reading (common practice, from memory). */
export const DEFAULT_METER_ACCURACY_REL = 0.05;
/** Floor of the default distance standard uncertainty, m. */
export const DEFAULT_DISTANCE_UNCERTAINTY_FLOOR_M = 0.005;
/** Relative part of the default distance standard uncertainty. */
export const DEFAULT_DISTANCE_UNCERTAINTY_REL = 0.1;
/** Coverage factor for the reported intervals (k = 2, about 95 %). */
export const COVERAGE_FACTOR = 2;

/**
 * Default standard uncertainty of a hand-held distance: max(5 mm, 10 % of d).
 * @param distanceM d, m
 * @returns standard uncertainty, m
 * @example defaultDistanceUncertaintyM(0.025) // 0.005; defaultDistanceUncertaintyM(0.2) // 0.02
 */
export function defaultDistanceUncertaintyM(distanceM: number): number {
  return Math.max(DEFAULT_DISTANCE_UNCERTAINTY_FLOOR_M, DEFAULT_DISTANCE_UNCERTAINTY_REL * distanceM);
}

/**
 * Runs one model on a reading. `reading` is fieldVPerM, or potentialV for the conductor.
 * Throws RangeError on input outside the model's domain.
 */
export function runModel(req: EstimateRequestParsed, reading: number, distanceM: number): ModelResult {
  const g = req.geometry;
  const f = req.geometryFactor ?? 1;
  const E = reading;
  const need = (v: number | undefined, name: string): number => {
    if (v === undefined) throw new RangeError(`geometry.${name} is required for the ${req.model} model`);
    return v;
  };
  switch (req.model) {
    case 'point': return pointChargeFromField({ fieldVPerM: E, distanceM, geometryFactor: f });
    case 'sphere': return sphereFromField({ fieldVPerM: E, radiusM: need(g.radiusM, 'radiusM'), gapM: distanceM, geometryFactor: f });
    case 'dipole-axis': return dipoleAxisFromField({ fieldVPerM: E, distanceM, separationM: g.separationM ?? null, geometryFactor: f });
    case 'dipole-broadside': return dipoleBroadsideFromField({ fieldVPerM: E, distanceM, separationM: g.separationM ?? null, geometryFactor: f });
    case 'image-charge': return imageChargeFromField({ fieldVPerM: E, distanceM, heightAboveGroundM: need(g.heightAboveGroundM, 'heightAboveGroundM'), geometryFactor: f });
    case 'line': return lineFromField({ fieldVPerM: E, lengthM: need(g.lengthM, 'lengthM'), radiusM: g.radiusM ?? 0, gapM: distanceM });
    case 'disk': return diskFromField({ fieldVPerM: E, radiusM: need(g.radiusM, 'radiusM'), gapM: distanceM });
    case 'rectangle': return rectangleFromField({ fieldVPerM: E, widthM: need(g.widthM, 'widthM'), heightM: need(g.heightM, 'heightM'), gapM: distanceM });
    case 'sheet': return sheetFromField({ fieldVPerM: E, gapM: distanceM, groundBehindM: g.groundBehindM ?? null, widthM: g.widthM ?? null });
    case 'layer-on-ground': return layerOnGroundFromField({ fieldVPerM: E, thicknessM: need(g.thicknessM, 'thicknessM'), relativePermittivity: need(g.relativePermittivity, 'relativePermittivity'), gapM: distanceM });
    case 'conductor': return conductorFromPotential({ potentialV: E, capacitanceF: need(g.capacitanceF, 'capacitanceF') });
    case 'bulk-cylinder': return bulkCylinderFromField({ fieldVPerM: E, radiusM: need(g.radiusM, 'radiusM'), gapM: distanceM, lengthM: g.lengthM ?? null });
  }
}

function tryModel(req: EstimateRequestParsed, reading: number, d: number): ModelResult | null {
  try {
    return runModel(req, reading, d);
  } catch {
    return null;
  }
}

/** d ln|q| / dx by central (or one-sided near a domain edge) differences; 0 when q does not depend on x. */
function logSlope(f: (x: number) => ModelResult | null, x: number, name: QuantityName, q0: number): number {
  const h = Math.max(Math.abs(x) * 1e-6, 1e-12);
  const lq = (r: ModelResult | null): number | null => {
    const v = r?.[name];
    return v === null || v === undefined || v === 0 ? null : Math.log(Math.abs(v));
  };
  const up = lq(f(x + h));
  const down = lq(f(x - h));
  const mid = Math.log(Math.abs(q0));
  if (up !== null && down !== null) return (up - down) / (2 * h);
  if (up !== null) return (up - mid) / h;
  if (down !== null) return (mid - down) / h;
  return 0;
}

/**
 * Interprets one reading with one model: every quantity the geometry defines, a 95 %
 * interval on each, the interval method and the validity warnings.
 *
 * Formulas: see each model in core/physics/models. Units: fieldVPerM V/m,
 * potentialV V, distanceM m, geometry SI; the response is SI with units in the names.
 * Reference: the model references; uncertainty after the GUM (JCGM 100:2008), first order.
 *
 * @param req request as in issue 3 (validated here with EstimateRequestSchema; a ZodError is thrown on bad input)
 * @returns EstimateResponse
 * @example estimate({ model: 'point', fieldVPerM: 1e5, distanceM: 0.03 }).chargeC
 *   // 1.00138e-8 C; interval.chargeC about [5.10e-9, 1.97e-8] (5 mm distance and 5 % meter uncertainty)
 */
export function estimate(req: EstimateRequest): EstimateResponse {
  const p = EstimateRequestSchema.parse(req);
  const isConductor = p.model === 'conductor';
  const reading = isConductor ? (p.potentialV as number) : (p.fieldVPerM as number);
  const d = isConductor ? (p.distanceM ?? 1) : (p.distanceM as number);
  const central = runModel(p, reading, d);

  const uRel = p.meterAccuracyRel ?? DEFAULT_METER_ACCURACY_REL;
  const uD = isConductor ? 0 : (p.distanceUncertaintyM ?? defaultDistanceUncertaintyM(d));

  const interval = {} as EstimateResponse['interval'];
  for (const name of QUANTITY_NAMES) {
    const q = central[name];
    if (q === null) {
      interval[name] = null;
      continue;
    }
    if (q === 0) {
      interval[name] = [0, 0];
      continue;
    }
    // Relative change of the reading: d ln|q| / d ln|E| = E * d ln|q| / dE.
    const sE = reading === 0 ? 0 : reading * logSlope((x) => tryModel(p, x, d), reading, name, q);
    const sD = uD === 0 ? 0 : logSlope((x) => tryModel(p, reading, x), d, name, q);
    const s = Math.hypot(sE * uRel, sD * uD);
    const a = q * Math.exp(-COVERAGE_FACTOR * s);
    const b = q * Math.exp(COVERAGE_FACTOR * s);
    interval[name] = a <= b ? [a, b] : [b, a];
  }

  const distPart = isConductor
    ? 'the potential reading only (the capacitance is taken as exact)'
    : `meter accuracy ${fmtPct(uRel)} and distance ${fmtM(uD)}${p.distanceUncertaintyM === undefined ? ' (default: larger of 5 mm and 10 % of the distance)' : ''}`;
  const intervalMethod = `first-order propagation in log space (numerical derivatives of the model), ${isConductor ? `meter accuracy ${fmtPct(uRel)} on ` : ''}${distPart} as standard uncertainties combined in quadrature; 95 %: value x/÷ exp(2 sigma) (k = 2). Model error is not included: see the warnings.`;

  const { warnings, ...quantities } = central;
  return { model: p.model, ...quantities, interval, intervalMethod, warnings };
}

function fmtPct(x: number): string {
  return `${+(x * 100).toPrecision(3)} %`;
}
function fmtM(x: number): string {
  return x < 1 ? `${+(x * 1000).toPrecision(3)} mm` : `${+x.toPrecision(3)} m`;
}
