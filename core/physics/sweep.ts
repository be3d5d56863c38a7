/**
 * sweep(): readings of one object at three or more distances (measured from the
 * object's SURFACE) -> fall-off exponent, every candidate model fitted, ranked by
 * AICc, the chosen model with an interval on its charge, residuals and a conclusion
 * in plain words. Contract: issue 3 (POST /api/sweep); fit by least squares on log|E|, ranked by AICc (Hurvich and Tsai, Biometrika 76, 1989).
 *
 * Fitting. Errors of a field meter are multiplicative, so every fit works on ln|E|.
 * Each model is |E| = A g(d + c) with A its amplitude (charge, line density, moment or
 * surface density) and at most one geometric unknown c >= 0 (the depth of the charge
 * centre behind the surface). For fixed c the best ln A is the mean of ln|E| - ln g in
 * closed form, so the residual sum of squares is a function of c alone; it is
 * minimised over a log-spaced grid on [0, 20 x the largest distance] and refined by
 * golden-section search in the best grid cell (Press et al., Numerical Recipes, 3rd
 * ed., 10.2). Models are ranked by AICc = n ln(RSS/n) + 2K + 2K(K+1)/(n-K-1), with K
 * the fitted parameters plus one for the residual variance (Burnham and Anderson,
 * Model Selection and Multimodel Inference, 2nd ed., 2002, eq. 2.14 and 7.xx); when
 * n <= K + 1 for some candidate, AICc is null for it and all models are ranked by AIC.
 * RSS is floored at n x (1e-6)^2 so noise-free data do not give ln 0.
 *
 * Amplitude interval: linearised (Gauss-Newton) standard error of ln A from the
 * Jacobian of the log model in (ln A, c), s^2 (J^T J)^-1 with s^2 = RSS/(n - p), times
 * Student's t_{0.975}(n - p); the interval is A x/÷ exp(t se). It ignores the c >= 0
 * bound and model error.
 */
import { COULOMB_K, EPSILON_0 } from './constants';
import { diskAxisField } from './models/disk';
import { finiteLineField } from './models/line';
import { rectangleAxisField } from './models/rectangle';
import { studentT975 } from './student-t';
import { SWEEP_MODELS, type SweepModel, type SweepModelFit, type SweepRequest, type SweepResponse } from '../schemas/estimate';
import type { PhysicsWarning } from './types';

export interface SweepReading {
  /** Gap from the meter to the object's surface, m. */
  distanceM: number;
  /** Field at the meter, V/m, signed. */
  fieldVPerM: number;
}

export interface SweepGeometry {
  radiusM?: number;
  lengthM?: number;
  widthM?: number;
  heightM?: number;
}

/** Residual RMS in ln|E| above which no model is said to fit (0.3: about 35 % scatter). */
export const NO_FIT_RMS_LOG = 0.3;
/** AICc difference below which two models are said to be indistinguishable (Burnham and Anderson: Delta < 2 "substantial support"). */
export const AMBIGUOUS_DELTA = 2;
/** Upper bound of the fitted depth, as a multiple of the largest distance. */
export const MAX_OFFSET_FACTOR = 20;
const RSS_FLOOR_PER_POINT = 1e-12;

type AmplitudeName = SweepModelFit['amplitudeName'];

interface ModelSpec {
  amplitudeName: AmplitudeName;
  /** Free offset c (true) or fixed (false). */
  offsetFitted: boolean;
  fixedOffset: number | null;
  /** Field per unit amplitude at gap d with offset c, > 0. */
  shape: (d: number, c: number) => number;
}

function modelSpec(model: SweepModel, g: SweepGeometry): ModelSpec {
  const need = (v: number | undefined, name: string): number => {
    if (v === undefined) throw new RangeError(`geometry.${name} is required for the ${model} model`);
    return v;
  };
  switch (model) {
    case 'point':
      return { amplitudeName: 'chargeC', offsetFitted: true, fixedOffset: null, shape: (d, c) => COULOMB_K / ((d + c) * (d + c)) };
    case 'sphere': {
      const a = need(g.radiusM, 'radiusM');
      return { amplitudeName: 'chargeC', offsetFitted: false, fixedOffset: a, shape: (d) => COULOMB_K / ((d + a) * (d + a)) };
    }
    case 'line': {
      const L = g.lengthM;
      return {
        amplitudeName: 'lineChargeDensityCPerM', offsetFitted: true, fixedOffset: null,
        shape: L === undefined ? (d, c) => 1 / (2 * Math.PI * EPSILON_0 * (d + c)) : (d, c) => finiteLineField(1, L, d + c),
      };
    }
    case 'dipole':
      return { amplitudeName: 'dipoleMomentCM', offsetFitted: true, fixedOffset: null, shape: (d, c) => (2 * COULOMB_K) / (d + c) ** 3 };
    case 'sheet':
      return { amplitudeName: 'surfaceChargeDensityCPerM2', offsetFitted: false, fixedOffset: null, shape: () => 1 / (2 * EPSILON_0) };
    case 'disk': {
      const R = need(g.radiusM, 'radiusM');
      return { amplitudeName: 'surfaceChargeDensityCPerM2', offsetFitted: false, fixedOffset: null, shape: (d) => diskAxisField(1, R, d) };
    }
    case 'rectangle': {
      const W = need(g.widthM, 'widthM');
      const H = need(g.heightM, 'heightM');
      return { amplitudeName: 'surfaceChargeDensityCPerM2', offsetFitted: false, fixedOffset: null, shape: (d) => rectangleAxisField(1, W, H, d) };
    }
  }
}

function checkReadings(readings: readonly SweepReading[]): number {
  if (readings.length < 3) throw new RangeError('sweep fit requires at least three readings');
  let sign = 0;
  for (const r of readings) {
    if (!Number.isFinite(r.distanceM) || r.distanceM <= 0) throw new RangeError('every sweep distanceM must be a finite number greater than zero');
    if (!Number.isFinite(r.fieldVPerM) || r.fieldVPerM === 0) throw new RangeError('every sweep fieldVPerM must be a finite number other than zero');
    const s = Math.sign(r.fieldVPerM);
    if (sign !== 0 && s !== sign) throw new RangeError('all readings of a sweep must have the same polarity');
    sign = s;
  }
  if (new Set(readings.map((r) => r.distanceM)).size < 2) throw new RangeError('sweep fit requires readings at two or more different distances');
  return sign;
}

/**
 * Fall-off exponent by least squares on ln|E| = ln A - m ln d (distances as given).
 * @param readings at least 3, same sign, two or more distinct distances
 * @returns exponent m (dimensionless), its standard error (n - 2 degrees of freedom) and the intercept ln A
 * @example logLogExponent([{ distanceM: 0.1, fieldVPerM: 100 }, { distanceM: 0.2, fieldVPerM: 25 }, { distanceM: 0.4, fieldVPerM: 6.25 }])
 *   // { exponent: 2, exponentStdErr: 0, ... }
 */
export function logLogExponent(readings: readonly SweepReading[]): { exponent: number; exponentStdErr: number; interceptLog: number } {
  checkReadings(readings);
  const x = readings.map((r) => Math.log(r.distanceM));
  const y = readings.map((r) => Math.log(Math.abs(r.fieldVPerM)));
  const n = x.length;
  const mx = mean(x);
  const my = mean(y);
  let sxx = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += ((x[i] as number) - mx) ** 2;
    sxy += ((x[i] as number) - mx) * ((y[i] as number) - my);
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let rss = 0;
  for (let i = 0; i < n; i++) rss += ((y[i] as number) - intercept - slope * (x[i] as number)) ** 2;
  const se = Math.sqrt(rss / (n - 2) / sxx);
  return { exponent: -slope, exponentStdErr: se, interceptLog: intercept };
}

/**
 * The cheap linearisation for a fixed exponent m: |E|^(-1/m) is linear in
 * the gap d, |E|^(-1/m) = s d + b. Point (m = 2): Q = 1 / (k s^2); line (m = 1):
 * lambda = 2 pi eps0 / s; dipole on axis (m = 3): p = 1 / (2 k s^3); in each case the
 * depth of the charge centre is c = b / s. Signs follow the readings.
 * @param readings at least 3, same sign
 * @param exponent 1 (line), 2 (point) or 3 (dipole)
 * @returns slope (SI per m), intercept, offsetM (m), amplitude (C, C/m or C m) and its name
 * @example linearisedOffsetFit([0.01, 0.015, 0.02].map((d) => ({ distanceM: d, fieldVPerM: pointChargeField(1e-8, d + 0.05) })), 2)
 *   // 10 nC with its centre 50 mm behind the surface: amplitude 1e-8 C, offsetM 0.05, slope 0.105482
 */
export function linearisedOffsetFit(readings: readonly SweepReading[], exponent: 1 | 2 | 3): { slope: number; intercept: number; offsetM: number; amplitude: number; amplitudeName: AmplitudeName } {
  const sign = checkReadings(readings);
  const x = readings.map((r) => r.distanceM);
  const y = readings.map((r) => Math.abs(r.fieldVPerM) ** (-1 / exponent));
  const mx = mean(x);
  const my = mean(y);
  let sxx = 0, sxy = 0;
  for (let i = 0; i < x.length; i++) {
    sxx += ((x[i] as number) - mx) ** 2;
    sxy += ((x[i] as number) - mx) * ((y[i] as number) - my);
  }
  const s = sxy / sxx;
  const b = my - s * mx;
  if (!(s > 0)) throw new RangeError(`the readings do not fall off with distance: no 1/r^${exponent} fit`);
  const amplitude = exponent === 2 ? 1 / (COULOMB_K * s * s) : exponent === 1 ? (2 * Math.PI * EPSILON_0) / s : 1 / (2 * COULOMB_K * s ** 3);
  const amplitudeName: AmplitudeName = exponent === 2 ? 'chargeC' : exponent === 1 ? 'lineChargeDensityCPerM' : 'dipoleMomentCM';
  return { slope: s, intercept: b, offsetM: b / s, amplitude: sign * amplitude, amplitudeName };
}

function mean(v: readonly number[]): number {
  let s = 0;
  for (const x of v) s += x;
  return s / v.length;
}

interface CoreFit { lnA: number; c: number | null; rss: number; se: number | null }

function fitForOffset(spec: ModelSpec, d: readonly number[], y: readonly number[], c: number): { lnA: number; rss: number } {
  const u = d.map((di) => Math.log(spec.shape(di, c)));
  let s = 0;
  for (let i = 0; i < d.length; i++) s += (y[i] as number) - (u[i] as number);
  const lnA = s / d.length;
  let rss = 0;
  for (let i = 0; i < d.length; i++) rss += ((y[i] as number) - lnA - (u[i] as number)) ** 2;
  return { lnA, rss };
}

function fitModel(spec: ModelSpec, d: readonly number[], y: readonly number[]): CoreFit & { p: number; atBound: boolean } {
  const n = d.length;
  if (!spec.offsetFitted) {
    const c = spec.fixedOffset ?? 0;
    const { lnA, rss } = fitForOffset(spec, d, y, c);
    const s2 = Math.max(rss, n * RSS_FLOOR_PER_POINT) / (n - 1);
    return { lnA, c: spec.fixedOffset, rss, se: Math.sqrt(s2 / n), p: 1, atBound: false };
  }
  const dMax = Math.max(...d);
  const dMin = Math.min(...d);
  const cMax = MAX_OFFSET_FACTOR * dMax;
  // Grid: 0, then log-spaced from dMin/1000 to cMax.
  const grid = [0];
  const N = 160;
  const lo = Math.log(dMin / 1000), hi = Math.log(cMax);
  for (let i = 0; i <= N; i++) grid.push(Math.exp(lo + ((hi - lo) * i) / N));
  let bi = 0;
  let best = Infinity;
  grid.forEach((c, i) => {
    const r = fitForOffset(spec, d, y, c).rss;
    if (r < best) { best = r; bi = i; }
  });
  let a = grid[Math.max(0, bi - 1)] as number;
  let b = grid[Math.min(grid.length - 1, bi + 1)] as number;
  // Golden-section search on [a, b].
  const gr = (Math.sqrt(5) - 1) / 2;
  let x1 = b - gr * (b - a), x2 = a + gr * (b - a);
  let f1 = fitForOffset(spec, d, y, x1).rss, f2 = fitForOffset(spec, d, y, x2).rss;
  for (let it = 0; it < 200 && b - a > 1e-13 * (1 + b); it++) {
    if (f1 < f2) { b = x2; x2 = x1; f2 = f1; x1 = b - gr * (b - a); f1 = fitForOffset(spec, d, y, x1).rss; }
    else { a = x1; x1 = x2; f1 = f2; x2 = a + gr * (b - a); f2 = fitForOffset(spec, d, y, x2).rss; }
  }
  let c = (a + b) / 2;
  let fit = fitForOffset(spec, d, y, c);
  const atGrid = fitForOffset(spec, d, y, grid[bi] as number);
  if (atGrid.rss < fit.rss) { c = grid[bi] as number; fit = atGrid; }
  // Linearised standard error of ln A with c free: J = [1, du/dc].
  const h = Math.max(c * 1e-6, dMin * 1e-7);
  const du = d.map((di) => (Math.log(spec.shape(di, c + h)) - Math.log(spec.shape(di, Math.max(0, c - h)))) / (c + h - Math.max(0, c - h)));
  let s11 = 0, s12 = 0, s22 = 0;
  for (const g of du) { s11 += 1; s12 += g; s22 += g * g; }
  const det = s11 * s22 - s12 * s12;
  const s2 = Math.max(fit.rss, n * RSS_FLOOR_PER_POINT) / (n - 2);
  const se = det > 0 ? Math.sqrt((s2 * s22) / det) : null;
  return { lnA: fit.lnA, c, rss: fit.rss, se, p: 2, atBound: c >= cMax * 0.999 };
}

/** The models fitted when the request does not name them: those the geometry allows. */
export function defaultSweepModels(g: SweepGeometry): SweepModel[] {
  return SWEEP_MODELS.filter((m) => (m === 'sphere' || m === 'disk' ? g.radiusM !== undefined : m === 'rectangle' ? g.widthM !== undefined && g.heightM !== undefined : true));
}

/**
 * Samples a fitted model at given gaps (for plotting the fitted curves).
 * @param fit one entry of the sweep's ranking (or best.fit)
 * @param distancesM gaps from the surface, m (> 0)
 * @returns fields, V/m, signed like the readings
 * @example fittedCurve({ model: 'point', amplitude: 1e-8, offsetM: 0, ... }, [0.03]) // [99861.7]
 */
export function fittedCurve(fit: Pick<SweepModelFit, 'model' | 'amplitude' | 'offsetM' | 'geometry'>, distancesM: readonly number[]): number[] {
  const spec = modelSpec(fit.model, fit.geometry);
  const c = fit.offsetM ?? 0;
  return distancesM.map((d) => fit.amplitude * spec.shape(d, c));
}

const DESCRIBE: Record<SweepModel, string> = {
  point: 'a compact charged object (point-like charge)',
  sphere: 'a charged sphere of the given radius',
  line: 'a long charged line or cylinder (roll, pipe, hose)',
  dipole: 'a dipole, e.g. a charged item close to a grounded surface',
  sheet: 'a large charged sheet (the field hardly changes with distance)',
  disk: 'a charged disk of the given radius',
  rectangle: 'a charged flat panel of the given size',
};

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
}

/**
 * Fits a sweep: see the module comment for the method.
 * @param req { readings: [{ distanceM (gap from the surface, m), fieldVPerM (V/m, signed) }] (>= 3, one polarity), models?, geometry? }
 * @returns SweepResponse (exponent, exponentStdErr, best, ranking, residuals, conclusion, warnings)
 * @example sweep({ readings: [0.02, 0.04, 0.08].map((d) => ({ distanceM: d, fieldVPerM: 8.98755e9 * 1e-8 / d ** 2 })) }).best
 *   // model 'point', chargeC 1e-8 C, depthM about 0
 */
export function sweep(req: SweepRequest): SweepResponse {
  const readings = req.readings;
  const sign = checkReadings(readings);
  const g: SweepGeometry = req.geometry ?? {};
  const models = req.models ?? defaultSweepModels(g);
  if (models.length === 0) throw new RangeError('sweep needs at least one candidate model');
  const n = readings.length;
  const d = readings.map((r) => r.distanceM);
  const y = readings.map((r) => Math.log(Math.abs(r.fieldVPerM)));
  const ll = logLogExponent(readings);
  const warnings: PhysicsWarning[] = [];

  const raw = models.map((model) => {
    const spec = modelSpec(model, g);
    const fit = fitModel(spec, d, y);
    const K = fit.p + 1;
    const rssEff = Math.max(fit.rss, n * RSS_FLOOR_PER_POINT);
    const aic = n * Math.log(rssEff / n) + 2 * K;
    const aicc = n - K - 1 > 0 ? aic + (2 * K * (K + 1)) / (n - K - 1) : null;
    return { model, spec, fit, aic, aicc };
  });
  const allAicc = raw.every((r) => r.aicc !== null);
  const rankedBy: 'aicc' | 'aic' = allAicc ? 'aicc' : 'aic';
  if (!allAicc) {
    warnings.push({
      code: 'aicc-undefined',
      message: `With ${n} readings AICc is not defined for models with ${raw.filter((r) => r.aicc === null).map((r) => r.fit.p).filter((v, i, a) => a.indexOf(v) === i).join(' or ')} fitted parameter(s) (it needs n > K + 1): the models are ranked by AIC, which favours extra parameters. Take five or more readings.`,
    });
  }
  const crit = (r: (typeof raw)[number]): number => (allAicc ? (r.aicc as number) : r.aic);
  raw.sort((a, b) => crit(a) - crit(b));
  const bestCrit = crit(raw[0] as (typeof raw)[number]);

  const ranking: SweepModelFit[] = raw.map((r) => ({
    model: r.model,
    amplitude: sign * Math.exp(r.fit.lnA),
    amplitudeName: r.spec.amplitudeName,
    offsetM: r.fit.c,
    parameterCount: r.fit.p,
    offsetFitted: r.spec.offsetFitted,
    geometry: { ...g },
    rss: r.fit.rss,
    rmsLog: Math.sqrt(r.fit.rss / n),
    aic: r.aic,
    aicc: r.aicc,
    deltaAicc: crit(r) - bestCrit,
  }));
  const top = raw[0] as (typeof raw)[number];
  const bestFit = ranking[0] as SweepModelFit;

  // Amplitude interval.
  const df = n - top.fit.p;
  const t = studentT975(df);
  const se = top.fit.se ?? Infinity;
  const A = bestFit.amplitude;
  const ampInterval: [number, number] = sortPair(A * Math.exp(-t * se), A * Math.exp(t * se));
  const intervalMethod = `95 % confidence interval from the fit: linearised standard error of ln(amplitude)${top.spec.offsetFitted ? ' with the depth free' : ''}, residual variance with ${df} degree(s) of freedom, Student t = ${fmt(t, 4)}; excludes model error and the depth bound.`;

  const best: SweepResponse['best'] = {
    model: bestFit.model,
    chargeC: null, chargeInterval: null,
    depthM: top.spec.offsetFitted ? top.fit.c : null,
    lineChargeDensityCPerM: null, lineChargeDensityInterval: null,
    dipoleMomentCM: null, dipoleMomentInterval: null,
    surfaceChargeDensityCPerM2: null, surfaceChargeDensityInterval: null,
    intervalMethod,
    fit: bestFit,
  };
  const scale = (k: number): [number, number] => sortPair(ampInterval[0] * k, ampInterval[1] * k);
  switch (bestFit.model) {
    case 'point': case 'sphere':
      best.chargeC = A; best.chargeInterval = ampInterval; break;
    case 'line':
      best.lineChargeDensityCPerM = A; best.lineChargeDensityInterval = ampInterval;
      if (g.lengthM !== undefined) { best.chargeC = A * g.lengthM; best.chargeInterval = scale(g.lengthM); }
      break;
    case 'dipole':
      best.dipoleMomentCM = A; best.dipoleMomentInterval = ampInterval; break;
    case 'sheet':
      best.surfaceChargeDensityCPerM2 = A; best.surfaceChargeDensityInterval = ampInterval; break;
    case 'disk': {
      const area = Math.PI * (g.radiusM as number) ** 2;
      best.surfaceChargeDensityCPerM2 = A; best.surfaceChargeDensityInterval = ampInterval;
      best.chargeC = A * area; best.chargeInterval = scale(area); break;
    }
    case 'rectangle': {
      const area = (g.widthM as number) * (g.heightM as number);
      best.surfaceChargeDensityCPerM2 = A; best.surfaceChargeDensityInterval = ampInterval;
      best.chargeC = A * area; best.chargeInterval = scale(area); break;
    }
  }

  const fitted = fittedCurve(bestFit, d);
  const residuals = readings.map((r, i) => ({
    distanceM: r.distanceM,
    fieldVPerM: r.fieldVPerM,
    fittedVPerM: fitted[i] as number,
    residualLog: (y[i] as number) - Math.log(Math.abs(fitted[i] as number)),
  }));

  if (top.fit.atBound) {
    warnings.push({ code: 'depth-at-bound', message: `The fitted depth of the ${bestFit.model} model ran to its bound (${MAX_OFFSET_FACTOR}x the largest distance): the readings are flatter than the model; the object may be larger than the distances.` });
  }
  if (n > 2 && n < 5) {
    warnings.push({ code: 'few-readings', message: `Only ${n} readings: the intervals are wide and the ranking is weak; five or more readings over at least a factor of 3 in distance tell the models apart.` });
  }
  if (Math.max(...d) / Math.min(...d) < 2) {
    warnings.push({ code: 'narrow-distance-range', message: 'The distances span less than a factor of 2: the fall-off is poorly defined.' });
  }

  // Conclusion.
  const m = ll.exponent;
  const parts: string[] = [];
  const mShow = Math.abs(m) < 0.05 ? '0' : m.toFixed(1);
  parts.push(`Falls off like 1/r^${mShow} (exponent ${(Math.abs(m) < 0.005 ? 0 : m).toFixed(2)} ± ${ll.exponentStdErr.toFixed(2)} over ${fmt(Math.min(...d) * 1000)}-${fmt(Math.max(...d) * 1000)} mm from the surface).`);
  const noFit = bestFit.rmsLog > NO_FIT_RMS_LOG;
  if (noFit) {
    warnings.push({ code: 'no-model-fits', message: `No model fits well: the best (${bestFit.model}) leaves ${fmt(bestFit.rmsLog, 2)} RMS in ln|E| (about ${fmt((Math.exp(bestFit.rmsLog) - 1) * 100, 2)} % scatter).` });
    parts.push(`No model fits these readings well (best: ${bestFit.model}, residual ${fmt((Math.exp(bestFit.rmsLog) - 1) * 100, 2)} % RMS): check the readings, the zero of the meter and the distances, or the object is not one of the idealised shapes.`);
  } else {
    let s = `The charge looks like ${DESCRIBE[bestFit.model]}`;
    if (best.depthM !== null && best.depthM > 0) s += `, its centre about ${fmt(best.depthM * 1000)} mm behind the surface`;
    s += '.';
    if (best.depthM !== null && best.depthM > 0.2 * Math.min(...d) && (bestFit.model === 'point' || bestFit.model === 'dipole')) {
      s += ` The apparent exponent is lower than the model's because distances are measured from the surface, not from the charge centre.`;
    }
    parts.push(s);
    // Small n: AICc's penalty can favour a flat model that misses the measured fall-off. Say so.
    const modelExponent = logLogExponent(readings.map((r, i) => ({ distanceM: r.distanceM, fieldVPerM: fitted[i] as number }))).exponent;
    if (Math.abs(modelExponent - m) > Math.max(3 * ll.exponentStdErr, 0.3)) {
      parts.push(`But the measured fall-off (exponent ${m.toFixed(2)}) disagrees with the ${bestFit.model} model's over these distances (${modelExponent.toFixed(2)}): too few readings for the ranking to be trusted; take more readings over a wider range.`);
      warnings.push({ code: 'exponent-disagrees', message: `The measured exponent ${m.toFixed(2)} ± ${ll.exponentStdErr.toFixed(2)} disagrees with the best model's ${modelExponent.toFixed(2)}.` });
    }
    const second = ranking[1];
    if (second !== undefined && second.deltaAicc !== null && second.deltaAicc < AMBIGUOUS_DELTA) {
      parts.push(`The data cannot tell ${bestFit.model} from ${second.model} (Δ${rankedBy === 'aicc' ? 'AICc' : 'AIC'} = ${fmt(second.deltaAicc, 2)}): take readings over a wider range of distances.`);
      warnings.push({ code: 'models-indistinguishable', message: `The data cannot tell ${bestFit.model} from ${second.model} (Δ${rankedBy === 'aicc' ? 'AICc' : 'AIC'} < ${AMBIGUOUS_DELTA}).` });
    }
  }
  parts.push('This is an equivalent charge for an idealised shape, not a measured charge.');

  return {
    exponent: m,
    exponentStdErr: ll.exponentStdErr,
    rankedBy,
    best,
    ranking,
    residuals,
    conclusion: parts.join(' '),
    warnings,
  };
}

function sortPair(a: number, b: number): [number, number] {
  return a <= b ? [a, b] : [b, a];
}
