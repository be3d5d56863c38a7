/**
 * estimate(): the issue-3 contract (names, nulls, intervals), values against the
 * forward models, and the interval method (first order in log space, k = 2).
 */
import { describe, expect, it } from 'vitest';
import { estimate, defaultDistanceUncertaintyM } from '../../../core/physics/estimate';
import { EstimateResponseSchema, type EstimateRequest } from '../../../core/schemas/estimate';
import { QUANTITY_NAMES } from '../../../core/physics/types';
import { EPS0_REF, K_REF, rel } from './helpers';

const ALL: EstimateRequest[] = [
  { model: 'point', fieldVPerM: 1e5, distanceM: 0.03 },
  { model: 'sphere', fieldVPerM: -2e4, distanceM: 0.05, geometry: { radiusM: 0.1 } },
  { model: 'dipole-axis', fieldVPerM: 1e4, distanceM: 0.05, geometry: { separationM: 0.01 } },
  { model: 'dipole-axis', fieldVPerM: 1e4, distanceM: 0.05 },
  { model: 'dipole-broadside', fieldVPerM: 1e4, distanceM: 0.05, geometry: { separationM: 0.01 } },
  { model: 'image-charge', fieldVPerM: 1e4, distanceM: 0.05, geometry: { heightAboveGroundM: 0.01 } },
  { model: 'line', fieldVPerM: 3e4, distanceM: 0.025, geometry: { lengthM: 1.5, radiusM: 0.1 } },
  { model: 'line', fieldVPerM: 3e4, distanceM: 0.025, geometry: { lengthM: 1.5 } },
  { model: 'disk', fieldVPerM: 3e4, distanceM: 0.025, geometry: { radiusM: 0.2 } },
  { model: 'rectangle', fieldVPerM: 3e4, distanceM: 0.025, geometry: { widthM: 0.4, heightM: 0.3 } },
  { model: 'sheet', fieldVPerM: -3e4, distanceM: 0.025 },
  { model: 'sheet', fieldVPerM: 3e4, distanceM: 0.025, geometry: { groundBehindM: 0.1 } },
  { model: 'layer-on-ground', fieldVPerM: 1.5e4, distanceM: 0.025, geometry: { thicknessM: 100e-6, relativePermittivity: 3 } },
  { model: 'conductor', potentialV: 5000, geometry: { capacitanceF: 200e-12 } },
  { model: 'bulk-cylinder', fieldVPerM: 1e5, distanceM: 0.05, geometry: { radiusM: 0.5 } },
];

describe('estimate: the response contract of issue 3', () => {
  it.each(ALL.map((r) => [`${r.model} ${JSON.stringify(r.geometry ?? {})}`, r] as const))('%s: valid response, intervals ordered and around the value, null where undefined', (_n, req) => {
    const res = estimate(req);
    expect(EstimateResponseSchema.safeParse(res).success).toBe(true);
    expect(res.model).toBe(req.model);
    for (const name of QUANTITY_NAMES) {
      const v = res[name];
      const iv = res.interval[name];
      if (v === null) {
        expect(iv).toBeNull();
      } else {
        expect(iv).not.toBeNull();
        const [lo, hi] = iv as [number, number];
        expect(lo).toBeLessThanOrEqual(hi);
        expect(lo).toBeLessThanOrEqual(v);
        expect(hi).toBeGreaterThanOrEqual(v);
        if (v !== 0) expect(Math.sign(lo)).toBe(Math.sign(v));
      }
    }
    expect(res.intervalMethod).toMatch(/first-order/);
  });

  it('point: Q = 4 pi eps0 r^2 E, only chargeC defined', () => {
    const res = estimate({ model: 'point', fieldVPerM: -1e5, distanceM: 0.03 });
    expect(rel(res.chargeC as number, -4 * Math.PI * EPS0_REF * 0.03 ** 2 * 1e5)).toBeLessThan(1e-12);
    expect(res.surfaceChargeDensityCPerM2).toBeNull();
    expect(res.energyJ).toBeNull();
    expect(res.warnings.map((w) => w.code)).toContain('meter-image');
  });

  it('dipoles: chargeC is the pole charge and dipoleMomentCM = chargeC x separationM; without separation only the moment', () => {
    const a = estimate({ model: 'dipole-axis', fieldVPerM: 1e4, distanceM: 0.05, geometry: { separationM: 0.01 } });
    expect(rel(a.dipoleMomentCM as number, (a.chargeC as number) * 0.01)).toBeLessThan(1e-15);
    const far = estimate({ model: 'dipole-broadside', fieldVPerM: 1e4, distanceM: 0.05 });
    expect(far.chargeC).toBeNull();
    expect(rel(far.dipoleMomentCM as number, (1e4 * 0.05 ** 3) / K_REF)).toBeLessThan(1e-12);
  });

  it('image-charge: chargeC is the real charge', () => {
    const r = estimate({ model: 'image-charge', fieldVPerM: 1e4, distanceM: 0.05, geometry: { heightAboveGroundM: 0.01 } });
    const expected = 1e4 / (K_REF * (1 / 0.05 ** 2 - 1 / 0.07 ** 2));
    expect(rel(r.chargeC as number, expected)).toBeLessThan(1e-12);
  });

  it('geometryFactor divides point-like estimates and is reported', () => {
    const a = estimate({ model: 'sphere', fieldVPerM: 1e4, distanceM: 0.05, geometry: { radiusM: 0.1 } });
    const b = estimate({ model: 'sphere', fieldVPerM: 1e4, distanceM: 0.05, geometry: { radiusM: 0.1 }, geometryFactor: 1.5 });
    expect(rel(b.chargeC as number, (a.chargeC as number) / 1.5)).toBeLessThan(1e-15);
    expect(b.warnings.map((w) => w.code)).toContain('geometry-factor-applied');
  });

  it('conductor: Q = C V, W = C V^2 / 2 (200 pF at 5 kV: 1 uC, 2.5 mJ)', () => {
    const r = estimate({ model: 'conductor', potentialV: 5000, geometry: { capacitanceF: 200e-12 } });
    expect(r.chargeC).toBeCloseTo(1e-6, 15);
    expect(r.energyJ).toBeCloseTo(2.5e-3, 12);
    expect(r.potentialV).toBe(5000);
  });
});

describe('estimate: intervals', () => {
  it('default distance uncertainty is the larger of 5 mm and 10 % of the distance', () => {
    expect(defaultDistanceUncertaintyM(0.025)).toBe(0.005);
    expect(defaultDistanceUncertaintyM(0.2)).toBeCloseTo(0.02, 15);
  });

  it('point: ln-interval half-width is 2 sqrt(u_E^2 + (2 u_d / r)^2) (Q ~ E r^2, first order)', () => {
    const r = estimate({ model: 'point', fieldVPerM: 1e5, distanceM: 0.03, meterAccuracyRel: 0.05, distanceUncertaintyM: 0.003 });
    const s = Math.hypot(0.05, (2 * 0.003) / 0.03);
    const [lo, hi] = r.interval.chargeC as [number, number];
    expect(Math.log(hi / (r.chargeC as number))).toBeCloseTo(2 * s, 6);
    expect(Math.log((r.chargeC as number) / lo)).toBeCloseTo(2 * s, 6);
  });

  it('dipole far field: Q ~ r^3, so distance error weighs 3x; energy of a conductor ~ V^2 weighs the meter 2x', () => {
    const r = estimate({ model: 'dipole-axis', fieldVPerM: 1e4, distanceM: 0.1, meterAccuracyRel: 0, distanceUncertaintyM: 0.001 });
    const [, hi] = r.interval.dipoleMomentCM as [number, number];
    expect(Math.log(hi / (r.dipoleMomentCM as number))).toBeCloseTo(2 * 3 * 0.01, 6);
    const c = estimate({ model: 'conductor', potentialV: 1000, geometry: { capacitanceF: 1e-10 }, meterAccuracyRel: 0.1 });
    const [, eh] = c.interval.energyJ as [number, number];
    expect(Math.log(eh / (c.energyJ as number))).toBeCloseTo(2 * 2 * 0.1, 6);
    expect(c.interval.capacitanceF).toEqual([1e-10, 1e-10]);
  });

  it('negative charge: the interval is [low, high] with low the more negative', () => {
    const r = estimate({ model: 'point', fieldVPerM: -1e5, distanceM: 0.03 });
    const [lo, hi] = r.interval.chargeC as [number, number];
    expect(lo).toBeLessThan(hi);
    expect(hi).toBeLessThan(0);
  });

  it('zero field gives zero quantities with a zero-width interval', () => {
    const r = estimate({ model: 'point', fieldVPerM: 0, distanceM: 0.03 });
    expect(r.chargeC).toBe(0);
    expect(r.interval.chargeC).toEqual([0, 0]);
  });

  it('invalid input throws a ZodError naming the field', () => {
    expect(() => estimate({ model: 'sphere', fieldVPerM: 1, distanceM: 0.1 })).toThrow(/geometry\.radiusM is required for the sphere model/);
  });
});
