/** Accept / reject tables for the estimate and sweep request schemas (core/schemas/estimate.ts). */
import { describe, expect, it } from 'vitest';
import { EstimateRequestSchema, SweepRequestSchema } from '../../../core/schemas/estimate';

function firstPaths(r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  return (r.error?.issues ?? []).map((i) => i.path.map(String).join('.'));
}

describe('EstimateRequestSchema', () => {
  it.each([
    ['point', { model: 'point', fieldVPerM: 1e5, distanceM: 0.03 }],
    ['point with options', { model: 'point', fieldVPerM: -1e5, distanceM: 0.03, meterAccuracyRel: 0.1, distanceUncertaintyM: 0.002, geometryFactor: 2 }],
    ['sphere', { model: 'sphere', fieldVPerM: 1e4, distanceM: 0.03, geometry: { radiusM: 0.1 } }],
    ['dipole-axis far field', { model: 'dipole-axis', fieldVPerM: 1e4, distanceM: 0.03 }],
    ['dipole-broadside', { model: 'dipole-broadside', fieldVPerM: 1e4, distanceM: 0.03, geometry: { separationM: 0.01 } }],
    ['image-charge', { model: 'image-charge', fieldVPerM: 1e4, distanceM: 0.03, geometry: { heightAboveGroundM: 0.01 } }],
    ['thin line', { model: 'line', fieldVPerM: 1e4, distanceM: 0.03, geometry: { lengthM: 1, radiusM: 0 } }],
    ['disk', { model: 'disk', fieldVPerM: 1e4, distanceM: 0.03, geometry: { radiusM: 0.1 } }],
    ['rectangle', { model: 'rectangle', fieldVPerM: 1e4, distanceM: 0.03, geometry: { widthM: 0.1, heightM: 0.2 } }],
    ['sheet', { model: 'sheet', fieldVPerM: 1e4, distanceM: 0.03 }],
    ['layer-on-ground', { model: 'layer-on-ground', fieldVPerM: 1e4, distanceM: 0.03, geometry: { thicknessM: 1e-4, relativePermittivity: 2.5 } }],
    ['conductor', { model: 'conductor', potentialV: -300, geometry: { capacitanceF: 1e-10 } }],
    ['bulk-cylinder', { model: 'bulk-cylinder', fieldVPerM: 1e4, distanceM: 0.03, geometry: { radiusM: 0.5 } }],
  ])('accepts %s', (_n, body) => {
    const r = EstimateRequestSchema.safeParse(body);
    expect(r.error?.issues ?? []).toEqual([]);
    expect(r.success).toBe(true);
  });

  it.each([
    ['unknown model', { model: 'cube', fieldVPerM: 1, distanceM: 0.1 }, 'model', /model must be one of/],
    ['missing radius for sphere', { model: 'sphere', fieldVPerM: 1, distanceM: 0.1 }, 'geometry.radiusM', /geometry\.radiusM is required for the sphere model/],
    ['zero radius for disk', { model: 'disk', fieldVPerM: 1, distanceM: 0.1, geometry: { radiusM: 0 } }, 'geometry.radiusM', /greater than zero/],
    ['missing length for line', { model: 'line', fieldVPerM: 1, distanceM: 0.1 }, 'geometry.lengthM', /geometry\.lengthM is required for the line model/],
    ['missing height for rectangle', { model: 'rectangle', fieldVPerM: 1, distanceM: 0.1, geometry: { widthM: 1 } }, 'geometry.heightM', /required/],
    ['missing height above ground', { model: 'image-charge', fieldVPerM: 1, distanceM: 0.1 }, 'geometry.heightAboveGroundM', /required/],
    ['missing layer permittivity', { model: 'layer-on-ground', fieldVPerM: 1, distanceM: 0.1, geometry: { thicknessM: 1e-4 } }, 'geometry.relativePermittivity', /required/],
    ['missing capacitance', { model: 'conductor', potentialV: 100 }, 'geometry.capacitanceF', /required/],
    ['zero distance', { model: 'point', fieldVPerM: 1, distanceM: 0 }, 'distanceM', /greater than zero/],
    ['negative distance', { model: 'point', fieldVPerM: 1, distanceM: -0.1 }, 'distanceM', /greater than zero/],
    ['missing distance', { model: 'sheet', fieldVPerM: 1 }, 'distanceM', /distanceM is required/],
    ['infinite field', { model: 'point', fieldVPerM: Infinity, distanceM: 0.1 }, 'fieldVPerM', /number/],
    ['NaN field', { model: 'point', fieldVPerM: Number.NaN, distanceM: 0.1 }, 'fieldVPerM', /number/],
    ['string field', { model: 'point', fieldVPerM: '5', distanceM: 0.1 }, 'fieldVPerM', /must be a number/],
    ['missing field', { model: 'point', distanceM: 0.1 }, 'fieldVPerM', /fieldVPerM is required for the point model/],
    ['missing potential for conductor', { model: 'conductor', geometry: { capacitanceF: 1e-10 } }, 'potentialV', /potentialV is required for the conductor model/],
    ['unknown geometry field', { model: 'sphere', fieldVPerM: 1, distanceM: 0.1, geometry: { radiusM: 1, radius: 1 } }, 'geometry', /unknown field\(s\): radius/],
    ['meter between dipole poles', { model: 'dipole-axis', fieldVPerM: 1, distanceM: 0.004, geometry: { separationM: 0.01 } }, 'distanceM', /half of geometry\.separationM/],
    ['geometry factor above 2', { model: 'point', fieldVPerM: 1, distanceM: 0.1, geometryFactor: 3 }, 'geometryFactor', /between 1 and 2/],
    ['permittivity below 1', { model: 'layer-on-ground', fieldVPerM: 1, distanceM: 0.1, geometry: { thicknessM: 1e-4, relativePermittivity: 0.5 } }, 'geometry.relativePermittivity', /1 or more/],
  ])('rejects %s at %s', (_n, body, path, message) => {
    const r = EstimateRequestSchema.safeParse(body);
    expect(r.success).toBe(false);
    expect(firstPaths(r)).toContain(path);
    const issue = r.error?.issues.find((i) => i.path.map(String).join('.') === path);
    expect(issue?.message).toMatch(message);
  });
});

describe('SweepRequestSchema', () => {
  const three = [{ distanceM: 0.01, fieldVPerM: 100 }, { distanceM: 0.02, fieldVPerM: 30 }, { distanceM: 0.04, fieldVPerM: 8 }];
  it.each([
    ['three readings', { readings: three }],
    ['negative polarity', { readings: three.map((r) => ({ ...r, fieldVPerM: -r.fieldVPerM })) }],
    ['models and geometry', { readings: three, models: ['point', 'disk'], geometry: { radiusM: 0.1 } }],
    ['rectangle geometry', { readings: three, geometry: { widthM: 0.1, heightM: 0.2 } }],
  ])('accepts %s', (_n, body) => {
    expect(SweepRequestSchema.safeParse(body).success).toBe(true);
  });

  it.each([
    ['two readings', { readings: three.slice(0, 2) }, 'readings', /at least 3 readings/],
    ['no readings', {}, 'readings', /list/],
    ['mixed polarity', { readings: [three[0], { distanceM: 0.02, fieldVPerM: -30 }, three[2]] }, 'readings.1.fieldVPerM', /same polarity/],
    ['zero field', { readings: [three[0], three[1], { distanceM: 0.04, fieldVPerM: 0 }] }, 'readings.2.fieldVPerM', /not be zero/],
    ['zero distance', { readings: [{ distanceM: 0, fieldVPerM: 100 }, three[1], three[2]] }, 'readings.0.distanceM', /greater than zero/],
    ['infinite field', { readings: [{ distanceM: 0.01, fieldVPerM: Infinity }, three[1], three[2]] }, 'readings.0.fieldVPerM', /number/],
    ['one distance only', { readings: three.map((r) => ({ ...r, distanceM: 0.01 })) }, 'readings', /two or more different distances/],
    ['unknown model', { readings: three, models: ['cube'] }, 'models.0', /models must be among/],
    ['disk without radius', { readings: three, models: ['disk'] }, 'geometry.radiusM', /geometry\.radiusM is required for the disk model/],
    ['rectangle half given', { readings: three, geometry: { widthM: 0.1 } }, 'geometry.heightM', /both/],
  ])('rejects %s at %s', (_n, body, path, message) => {
    const r = SweepRequestSchema.safeParse(body);
    expect(r.success).toBe(false);
    expect(firstPaths(r)).toContain(path);
    const issue = r.error?.issues.find((i) => i.path.map(String).join('.') === path);
    expect(issue?.message).toMatch(message);
  });
});
