// POST /api/estimate, POST /api/sweep and GET /api/substances over real HTTP (issue 3
// API contract), the hazard templates, the OpenAPI entries, and the estimate and
// hazard verdicts carried by stored readings of the demo site.
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COULOMB_K, EPSILON_0 } from '../../core/physics/constants';
import { estimate } from '../../core/physics/estimate';
import { LIMIT_TEMPLATES } from '../../core/hazard/templates';
import { SUBSTANCES } from '../../core/hazard/substances';
import { EstimateResponseSchema, SweepResponseSchema, type EstimateRequest } from '../../core/schemas/estimate';
import { ReadingSchema } from '../../core/schemas/entities';
import { call, type ApiAnswer } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ demo: true });
});
afterAll(async () => {
  await srv.close();
});

const post = (path: string, body: unknown, raw?: string) => call(srv.baseUrl, 'POST', path, body, raw === undefined ? {} : { raw, contentType: 'application/json' });

function expect400(r: ApiAnswer, field: string) {
  expect(r.status).toBe(400);
  expect(r.body.error.code).toBe('invalid');
  expect(r.body.error.message.length).toBeGreaterThan(5);
  const paths = (r.body.error.fields ?? []).map((f: { path: string }) => f.path);
  expect(paths).toContain(field);
}

// One valid request per model (issue 3 contract: distanceM to the charge for point-like
// models, the gap to the surface for sized ones; conductor takes potentialV).
const REQUESTS: Record<string, EstimateRequest> = {
  point: { model: 'point', fieldVPerM: 1e5, distanceM: 0.03 },
  sphere: { model: 'sphere', fieldVPerM: -5e4, distanceM: 0.05, geometry: { radiusM: 0.1 } },
  'dipole-axis': { model: 'dipole-axis', fieldVPerM: 2e4, distanceM: 0.2, geometry: { separationM: 0.05 } },
  'dipole-broadside': { model: 'dipole-broadside', fieldVPerM: 2e4, distanceM: 0.2 },
  'image-charge': { model: 'image-charge', fieldVPerM: 3e4, distanceM: 0.1, geometry: { heightAboveGroundM: 0.02 } },
  line: { model: 'line', fieldVPerM: -2e4, distanceM: 0.1, geometry: { radiusM: 0.35, lengthM: 1.6 } },
  disk: { model: 'disk', fieldVPerM: 1e4, distanceM: 0.05, geometry: { radiusM: 0.3 } },
  rectangle: { model: 'rectangle', fieldVPerM: 1e4, distanceM: 0.1, geometry: { widthM: 1, heightM: 1 } },
  sheet: { model: 'sheet', fieldVPerM: 5e4, distanceM: 0.05, geometry: { groundBehindM: 0.3 } },
  'layer-on-ground': { model: 'layer-on-ground', fieldVPerM: 2e4, distanceM: 0.05, geometry: { thicknessM: 30e-6, relativePermittivity: 2.2 } },
  conductor: { model: 'conductor', potentialV: 5000, geometry: { capacitanceF: 100e-12 } },
  'bulk-cylinder': { model: 'bulk-cylinder', fieldVPerM: 1e5, distanceM: 0.05, geometry: { radiusM: 0.4 } },
};

describe('POST /api/estimate', () => {
  it.each(Object.keys(REQUESTS))('%s: answers the core estimate with intervals and warnings', async (model) => {
    const r = await post('/api/estimate', REQUESTS[model]);
    expect(r.status).toBe(200);
    expect(EstimateResponseSchema.safeParse(r.body).success).toBe(true);
    expect(r.body).toEqual(JSON.parse(JSON.stringify(estimate(REQUESTS[model]!))));
    expect(r.body.model).toBe(model);
    expect(typeof r.body.intervalMethod).toBe('string');
    expect(Array.isArray(r.body.warnings)).toBe(true);
  });

  it('closed forms over HTTP', async () => {
    // Point: Q = 4 pi eps0 r^2 E; common practice: ~10 nC a few cm away gives ~1e5 V/m.
    const p = await post('/api/estimate', REQUESTS.point);
    expect(p.body.chargeC).toBeCloseTo(4 * Math.PI * EPSILON_0 * 0.03 ** 2 * 1e5, 15);
    expect(p.body.chargeC).toBeGreaterThan(5e-9);
    expect(p.body.chargeC).toBeLessThan(20e-9);
    const [lo, hi] = p.body.interval.chargeC;
    expect(lo).toBeLessThan(p.body.chargeC);
    expect(hi).toBeGreaterThan(p.body.chargeC);
    // Conductor: Q = C V, W = C V^2 / 2 (100 pF at 5 kV -> 0.5 uC, 1.25 mJ by arithmetic)
    const c = await post('/api/estimate', REQUESTS.conductor);
    expect(c.body.chargeC).toBeCloseTo(500e-9, 15);
    expect(c.body.energyJ).toBeCloseTo(1.25e-3, 12);
    expect(c.body.surfaceChargeDensityCPerM2).toBeNull(); // a quantity the model does not define is null
    // Sphere: Q = E (a + g)^2 / k; keeps the sign
    const s = await post('/api/estimate', REQUESTS.sphere);
    expect(s.body.chargeC).toBeCloseTo(-5e4 * 0.15 ** 2 / COULOMB_K, 15);
    // Sheet, three-plane model: sigma = eps0 E (a + b) / b
    const sh = await post('/api/estimate', REQUESTS.sheet);
    expect(sh.body.surfaceChargeDensityCPerM2).toBeCloseTo(EPSILON_0 * 5e4 * 0.35 / 0.3, 18);
    // Dipole far field (no separation): only the moment
    const db = await post('/api/estimate', REQUESTS['dipole-broadside']);
    expect(db.body.chargeC).toBeNull();
    expect(db.body.dipoleMomentCM).toBeCloseTo(2e4 * 0.2 ** 3 / COULOMB_K, 18);
  });

  it('bad inputs answer 400 naming the field', async () => {
    expect400(await post('/api/estimate', { model: 'blob', fieldVPerM: 1, distanceM: 0.1 }), 'model');
    expect400(await post('/api/estimate', { model: 'sphere', fieldVPerM: 1, distanceM: 0.1 }), 'geometry.radiusM');
    expect400(await post('/api/estimate', { model: 'line', fieldVPerM: 1, distanceM: 0.1, geometry: { radiusM: 0.1 } }), 'geometry.lengthM');
    expect400(await post('/api/estimate', { model: 'rectangle', fieldVPerM: 1, distanceM: 0.1, geometry: { widthM: 1 } }), 'geometry.heightM');
    expect400(await post('/api/estimate', { model: 'layer-on-ground', fieldVPerM: 1, distanceM: 0.1, geometry: { thicknessM: 1e-4 } }), 'geometry.relativePermittivity');
    expect400(await post('/api/estimate', { model: 'conductor', fieldVPerM: 1, geometry: { capacitanceF: 1e-10 } }), 'potentialV');
    expect400(await post('/api/estimate', { model: 'point', fieldVPerM: 1, distanceM: 0 }), 'distanceM');
    expect400(await post('/api/estimate', { model: 'point', fieldVPerM: 1, distanceM: -0.1 }), 'distanceM');
    expect400(await post('/api/estimate', { model: 'point', fieldVPerM: 1 }), 'distanceM');
    expect400(await post('/api/estimate', { model: 'point', distanceM: 0.1 }), 'fieldVPerM');
    expect400(await post('/api/estimate', { model: 'point', fieldVPerM: '1', distanceM: 0.1 }), 'fieldVPerM');
    expect400(await post('/api/estimate', { model: 'point', fieldVPerM: 1, distanceM: 0.1, geometry: { sizeM: 1 } }), 'geometry');
    expect400(await post('/api/estimate', { model: 'dipole-axis', fieldVPerM: 1, distanceM: 0.01, geometry: { separationM: 0.05 } }), 'distanceM');
    // Non-finite numbers: JSON has no NaN, but 1e999 parses to Infinity.
    expect400(await post('/api/estimate', null, '{"model":"point","fieldVPerM":1e999,"distanceM":0.1}'), 'fieldVPerM');
    expect400(await post('/api/estimate', null, '{"model":"sphere","fieldVPerM":1,"distanceM":0.1,"geometry":{"radiusM":-1e999}}'), 'geometry.radiusM');
    expect400(await post('/api/estimate', null, '{"model":"point","fieldVPerM":NaN,"distanceM":0.1}'), '(body)');
  });

  it('never answers 5xx for any JSON body', async () => {
    const num = fc.oneof(fc.double(), fc.integer(), fc.constant(0), fc.constant(-1), fc.constant(1e-300), fc.constant(1e300));
    const geom = fc.dictionary(fc.constantFrom('radiusM', 'lengthM', 'separationM', 'heightAboveGroundM', 'widthM', 'heightM', 'thicknessM', 'relativePermittivity', 'groundBehindM', 'capacitanceF'), num);
    const body = fc.record({
      model: fc.constantFrom(...Object.keys(REQUESTS), 'nope'), fieldVPerM: num, potentialV: num, distanceM: num, geometry: geom,
      meterAccuracyRel: num, distanceUncertaintyM: num, geometryFactor: num,
    }, { requiredKeys: ['model'] });
    await fc.assert(fc.asyncProperty(body, async (b) => {
      const r = await post('/api/estimate', b);
      expect([200, 400]).toContain(r.status);
    }), { numRuns: 60, seed: 7 });
  });
});

describe('POST /api/sweep', () => {
  // Synthetic point charge 10 nC, 2 cm behind the surface, read at 2, 4, 6, 10 cm (E = k Q / (d + c)^2).
  const Q = 10e-9; const c = 0.02;
  const readings = [0.02, 0.04, 0.06, 0.1].map((d) => ({ distanceM: d, fieldVPerM: (COULOMB_K * Q) / (d + c) ** 2 }));

  it('fits, ranks and concludes', async () => {
    const r = await post('/api/sweep', { readings });
    expect(r.status).toBe(200);
    expect(SweepResponseSchema.safeParse(r.body).success).toBe(true);
    expect(r.body.best.model).toBe('point');
    expect(r.body.best.chargeC).toBeCloseTo(Q, 12);
    expect(r.body.best.depthM).toBeCloseTo(c, 6);
    const [lo, hi] = r.body.best.chargeInterval;
    expect(lo).toBeLessThanOrEqual(Q * 1.000001);
    expect(hi).toBeGreaterThanOrEqual(Q * 0.999999);
    // Measured from the surface the apparent exponent is below 2 (a point charge behind the surface).
    expect(r.body.exponent).toBeGreaterThan(0.8);
    expect(r.body.exponent).toBeLessThan(2);
    expect(r.body.ranking.length).toBeGreaterThan(2);
    expect(r.body.ranking[0].model).toBe('point');
    expect(r.body.residuals).toHaveLength(4);
    expect(r.body.conclusion.length).toBeGreaterThan(20);
  });

  it('a dipole sweep reads an exponent near 3 (no offset)', async () => {
    const p = 1e-10;
    const r = await post('/api/sweep', { readings: [0.1, 0.2, 0.3, 0.5].map((d) => ({ distanceM: d, fieldVPerM: (2 * COULOMB_K * p) / d ** 3 })), models: ['point', 'dipole', 'sheet'] });
    expect(r.status).toBe(200);
    expect(r.body.exponent).toBeCloseTo(3, 6);
    expect(r.body.best.model).toBe('dipole');
  });

  it('bad inputs answer 400 naming the field', async () => {
    expect400(await post('/api/sweep', { readings: readings.slice(0, 2) }), 'readings');
    expect400(await post('/api/sweep', { readings: [] }), 'readings');
    expect400(await post('/api/sweep', {}), 'readings');
    expect400(await post('/api/sweep', { readings: [...readings.slice(0, 2), { distanceM: 0, fieldVPerM: 1 }] }), 'readings.2.distanceM');
    expect400(await post('/api/sweep', { readings: [...readings.slice(0, 2), { distanceM: -1, fieldVPerM: 1 }] }), 'readings.2.distanceM');
    expect400(await post('/api/sweep', { readings: [...readings.slice(0, 2), { distanceM: 0.3, fieldVPerM: -1 }] }), 'readings.2.fieldVPerM');
    expect400(await post('/api/sweep', { readings, models: ['point', 'blob'] }), 'models.1');
    expect400(await post('/api/sweep', { readings, models: ['sphere'] }), 'geometry.radiusM');
    expect400(await post('/api/sweep', null, `{"readings":[{"distanceM":0.1,"fieldVPerM":1e999},{"distanceM":0.2,"fieldVPerM":1},{"distanceM":0.3,"fieldVPerM":1}]}`), 'readings.0.fieldVPerM');
  });
});

describe('hazard tables', () => {
  it('GET /api/substances serves the substance table with sources', async () => {
    const r = await call(srv.baseUrl, 'GET', '/api/substances');
    expect(r.status).toBe(200);
    expect(r.body.substances).toEqual(JSON.parse(JSON.stringify(SUBSTANCES)));
    const propane = r.body.substances.find((s: { id: string }) => s.id === 'propane');
    // MIE propane 0.25 mJ, NFPA 77 (2000) Table B.1; minimum ignition charge 70 nC, BGR 132 Annex G Table 14
    expect(propane.mieJ).toBeCloseTo(0.25e-3, 12);
    expect(propane.mieSource).toMatch(/NFPA 77/);
    expect(propane.minIgnitionChargeC).toBeCloseTo(70e-9, 15);
    expect(propane.minIgnitionChargeSource).toMatch(/BGR 132/);
  });

  it('GET /api/limit-templates serves the hazard templates, every rule with a source', async () => {
    const r = await call(srv.baseUrl, 'GET', '/api/limit-templates');
    expect(r.status).toBe(200);
    expect(r.body.templates.map((t: { id: string }) => t.id)).toEqual(LIMIT_TEMPLATES.map((t) => t.id));
    for (const t of r.body.templates) for (const rule of t.rules) expect(rule.source.length).toBeGreaterThan(5);
  });

  it('the OpenAPI document lists the three operations', async () => {
    const r = await call(srv.baseUrl, 'GET', '/api/openapi.json');
    expect(r.body.paths['/api/estimate'].post.requestBody).toBeDefined();
    expect(r.body.paths['/api/sweep'].post.responses['400']).toBeDefined();
    expect(r.body.paths['/api/substances'].get.responses['200']).toBeDefined();
    expect(r.body.components.schemas.EstimateResponse).toBeDefined();
    expect(r.body.components.schemas.HazardVerdict).toBeDefined();
  });
});

describe('stored readings carry the estimate and the hazard verdicts', () => {
  it('a demo roll (line model) reading has a charge estimate with its interval and verdicts', async () => {
    const sites = await call(srv.baseUrl, 'GET', '/api/sites');
    const setup = await call(srv.baseUrl, 'GET', `/api/sites/${sites.body.sites[0].id}/setup`);
    const roll = setup.body.spots.find((s: { model: string | null; objectKind: string }) => s.model === 'line' && s.objectKind === 'roll');
    expect(roll).toBeDefined();
    const r = await call(srv.baseUrl, 'GET', `/api/spots/${roll.id}/readings?limit=5`);
    expect(r.status).toBe(200);
    expect(r.body.readings.length).toBeGreaterThan(0);
    const reading = r.body.readings[0];
    expect(ReadingSchema.safeParse(reading).success).toBe(true);
    expect(reading.estimate.model).toBe('line');
    expect(Math.sign(reading.estimate.chargeC)).toBe(Math.sign(reading.fieldVPerM));
    expect(reading.estimate.interval.chargeC).toHaveLength(2);
    expect(reading.hazards.length).toBeGreaterThan(0);
    for (const v of reading.hazards) expect(v.caution).toMatch(/qualified people/);
  });

  it('a person spot read in field units gets no estimate and a note (conductor needs a potential)', async () => {
    const sites = await call(srv.baseUrl, 'GET', '/api/sites');
    const setup = await call(srv.baseUrl, 'GET', `/api/sites/${sites.body.sites[0].id}/setup`);
    const person = setup.body.spots.find((s: { model: string | null; materialClass: string }) => s.model === 'conductor' && s.materialClass === 'person');
    const r = await call(srv.baseUrl, 'GET', `/api/spots/${person.id}/readings?limit=20`);
    for (const reading of r.body.readings) {
      if (reading.unit === 'V' || reading.unit === 'kV') expect(reading.estimate.chargeC).not.toBeNull();
      else {
        expect(reading.estimate).toBeNull();
        expect(reading.estimateNote.code).toBe('conductor-needs-potential');
      }
    }
  });
});
