// Bad and hostile input over real HTTP: every rejected request answers 4xx with
// the error envelope (and a field path where a field is at fault), never 5xx, and
// leaves the database exactly as it was (fingerprint of every row of every table).
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { call, createRound, createSetup, dbFingerprint, readingInput, type ApiAnswer, type SetupIds } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

let srv: TestServer;
let ids: SetupIds;
let roundId: string;
let readingId: string;

beforeAll(async () => {
  srv = await startTestServer();
  ids = await createSetup(srv.baseUrl);
  roundId = await createRound(srv.baseUrl, ids.siteId);
  const r = readingInput(roundId, ids.spotIds[0]!, ids.meterId);
  readingId = r.id as string;
  await call(srv.baseUrl, 'POST', '/api/readings', r);
});
afterAll(async () => {
  await srv.close();
});

let followUpId: string;
beforeAll(async () => {
  followUpId = (await call(srv.baseUrl, 'POST', '/api/follow-ups', { spotId: ids.spotIds[0], findingClass: 'observation', action: 'Check the mat' })).body.id;
});
const importValid = () => ({
  csv: 'spot,time,value\nW-1,2026-01-01 10:00,5', mapping: { spot: 0, takenAt: 1, value: 2 },
  defaults: { meterId: ids.meterId, unit: 'V/m', distance: { value: 1, unit: 'inch' }, surveyor: 'X' },
});

function expectEnvelope(r: ApiAnswer, status: number, code: string) {
  expect(r.status).toBe(status);
  expect(r.body).toEqual({ error: { code, message: expect.any(String), ...(r.body?.error?.fields ? { fields: expect.any(Array) } : {}) } });
  expect(r.body.error.message.length).toBeGreaterThan(5);
}

/** Sends a request and checks it was refused with `status`, naming `path`, with the database unchanged. */
async function refused(method: string, path: string, body: unknown, status: number, fieldPath?: string | RegExp, opts?: { raw?: string | Buffer; contentType?: string }) {
  const before = dbFingerprint(srv.dbPath);
  const r = await call(srv.baseUrl, method, path, body, opts);
  const code = { 400: 'invalid', 404: 'not-found', 409: 'conflict', 413: 'too-large', 415: 'unsupported-media-type' }[status]!;
  expectEnvelope(r, status, code);
  if (fieldPath !== undefined) {
    const paths = (r.body.error.fields ?? []).map((f: { path: string }) => f.path);
    if (typeof fieldPath === 'string') expect(paths).toContain(fieldPath);
    else expect(paths.some((p: string) => fieldPath.test(p))).toBe(true);
  }
  expect(dbFingerprint(srv.dbPath)).toEqual(before);
  return r;
}

describe('readings: bad input names the field and stores nothing', () => {
  const good = () => readingInput(roundId, ids.spotIds[0]!, ids.meterId);

  it('wrong types', async () => {
    await refused('POST', '/api/readings', { ...good(), value: '12' }, 400, 'value');
    await refused('POST', '/api/readings', { ...good(), zeroed: 'yes' }, 400, 'zeroed');
    await refused('POST', '/api/readings', { readings: [good(), good(), good(), { ...good(), distance: { value: '5', unit: 'cm' } }] }, 400, 'readings.3.distance.value');
  });

  it('unknown units', async () => {
    const r = await refused('POST', '/api/readings', { ...good(), unit: 'kV/ft' }, 400, 'unit');
    expect(r.body.error.fields[0].message).toBe('unit must be one of V/m, kV/m, V/cm, kV/cm, V/inch, kV/inch, V, kV');
    await refused('POST', '/api/readings', { ...good(), distance: { value: 5, unit: 'furlong' } }, 400, 'distance.unit');
  });

  it('negative or zero distance, negative value, out-of-range humidity', async () => {
    const r = await refused('POST', '/api/readings', { readings: [{ ...good(), distance: { value: -5, unit: 'cm' } }] }, 400, 'readings.0.distance.value');
    expect(r.body.error.fields[0].message).toBe('distance must be greater than zero');
    await refused('POST', '/api/readings', { ...good(), distance: { value: 0, unit: 'cm' } }, 400, 'distance.value');
    await refused('POST', '/api/readings', { ...good(), value: -3 }, 400, 'value');
    await refused('POST', '/api/readings', { ...good(), rhPercent: 120 }, 400, 'rhPercent');
  });

  it('missing fields', async () => {
    const { distance: _d, ...noDistance } = good();
    const r = await refused('POST', '/api/readings', noDistance, 400, 'distance');
    expect(r.body.error.message).toContain('distance');
    const { takenAt: _t, ...noTime } = good();
    await refused('POST', '/api/readings', { readings: [good(), noTime] }, 400, 'readings.1.takenAt');
    await refused('POST', '/api/readings', { readings: [] }, 400, 'readings');
  });

  it('ids: not a UUIDv7, unknown round, spot or meter', async () => {
    await refused('POST', '/api/readings', { ...good(), id: '0b8e4b4e-6d2c-4f43-9a51-1c6a8f0e7a11' }, 400, 'id'); // a v4 id
    await refused('POST', '/api/readings', { readings: [good(), { ...good(), meterId: newId() }] }, 404, 'readings.1.meterId');
    await refused('POST', '/api/readings', { readings: [{ ...good(), roundId: newId() }] }, 404, 'readings.0.roundId');
  });

  it('more than 500 readings in a batch', async () => {
    const many = Array.from({ length: 501 }, () => good());
    await refused('POST', '/api/readings', { readings: many }, 400, 'readings');
  });

  it('a body over the size limit answers 413 too-large', async () => {
    const huge = { ...good(), note: 'x'.repeat(1_100_000) };
    await refused('POST', '/api/readings', huge, 413);
  });

  it('a body that is not JSON answers 415; malformed JSON 400; no body 400', async () => {
    await refused('POST', '/api/readings', undefined, 415, '(body)', { raw: 'value=12&unit=V', contentType: 'application/x-www-form-urlencoded' });
    await refused('POST', '/api/readings', undefined, 415, undefined, { raw: JSON.stringify(good()), contentType: 'text/plain' });
    await refused('POST', '/api/readings', undefined, 415, undefined, { raw: JSON.stringify(good()) }); // no content type at all
    const bad = await refused('POST', '/api/readings', undefined, 400, '(body)', { raw: '{"readings": [', contentType: 'application/json' });
    expect(bad.body.error.message).toContain('not valid JSON');
    await refused('POST', '/api/readings', undefined, 400, '(body)', { raw: '"just a string"', contentType: 'application/json' });
    await refused('POST', '/api/readings', undefined, 400, '(body)');
    await refused('POST', '/api/readings', undefined, 415, undefined, { raw: JSON.stringify(good()), contentType: 'application/json; charset=latin1' });
  });

  it('a bad UUID in a path answers 404 naming the field id', async () => {
    await refused('POST', '/api/readings/12345/tombstone', { reason: 'x' }, 404, 'id');
    await refused('GET', "/api/spots/'%20OR%201=1--/readings", undefined, 404, 'id');
    await refused('GET', '/api/rounds/%E0%A4%A', undefined, 400);
  });

  it('bad query values name the parameter', async () => {
    await refused('GET', `/api/spots/${ids.spotIds[0]}/readings?limit=abc`, undefined, 400, 'limit');
    await refused('GET', `/api/spots/${ids.spotIds[0]}/readings?limit=5000`, undefined, 400, 'limit');
    await refused('GET', `/api/spots/${ids.spotIds[0]}/readings?history=maybe`, undefined, 400, 'history');
  });

  it('unknown API routes answer a JSON 404', async () => {
    await refused('GET', '/api/nothing-here', undefined, 404);
    await refused('DELETE', `/api/readings/${readingId}`, undefined, 404);
  });
});

describe('set-up: bad input names the field and changes nothing', () => {
  it('sites, areas, spots, meters, limit sets', async () => {
    await refused('POST', '/api/sites', { name: '', timeZone: 'UTC' }, 400, 'name');
    await refused('POST', '/api/areas', { siteId: ids.siteId, name: 'A', kind: 'hazardous' }, 400, 'zone');
    await refused('POST', '/api/areas', { siteId: newId(), name: 'A', kind: 'epa' }, 404, 'siteId');
    await refused('POST', '/api/spots', { areaId: ids.areaId, name: 'S', code: 'has space', objectKind: 'roll', defaultDistance: { value: 1, unit: 'cm' } }, 400, 'code');
    await refused('POST', '/api/spots', { areaId: newId(), name: 'S', code: 'S-9', objectKind: 'roll', defaultDistance: { value: 1, unit: 'cm' } }, 404, 'areaId');
    await refused('POST', '/api/spots', { areaId: ids.areaId, name: 'S', code: 'W-1', objectKind: 'roll', defaultDistance: { value: 1, unit: 'cm' } }, 409, 'code');
    await refused('POST', '/api/spots', { areaId: ids.areaId, name: 'S', code: 'S-9', objectKind: 'roll', geometry: { radiusM: 1, colour: 'red' }, defaultDistance: { value: 1, unit: 'cm' } }, 400, 'geometry');
    await refused('POST', '/api/meters', { siteId: ids.siteId, serial: 'X', modes: [], calibrationDue: '2030-01-01' }, 400, 'modes');
    await refused('POST', '/api/meters', { siteId: ids.siteId, serial: 'X', modes: ['field'], calibrationDue: '2030-02-30' }, 400, 'calibrationDue');
    await refused('POST', '/api/limit-sets', { siteId: ids.siteId, name: 'L', rules: [{ metric: 'fieldVPerM', warn: 5000, alarm: 100, source: 's' }] }, 400, 'rules.0.warn');
    await refused('PUT', `/api/sites/${newId()}`, { name: 'x', timeZone: 'UTC' }, 404, 'id');
    await refused('PUT', `/api/spots/${ids.spotIds[0]}`, { id: newId(), areaId: ids.areaId, name: 'S', code: 'W-1', objectKind: 'roll', defaultDistance: { value: 1, unit: 'cm' } }, 400, 'id');
    await refused('POST', '/api/sites', { id: ids.siteId, name: 'again', timeZone: 'UTC' }, 409, 'id');
  });
});

// ---------- property-based: random and malicious bodies on every write endpoint ----------

const hostileString = fc.oneof(
  fc.string(),
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.constantFrom(
    "'; DROP TABLE readings; --", 'Robert"); DELETE FROM spots; --', '<script>alert(1)</script>', '<img src=x onerror=alert(1)>',
    'NaN', 'Infinity', '-Infinity', '1e999', '0x1F', '', ' ', '\u0000', '\uFEFF', '𝔘𝔫𝔦𝔠𝔬𝔡𝔢', '\u202Eevil', '__proto__', 'constructor',
    '../../etc/passwd', '%00', '${7*7}', '{{7*7}}', 'null', 'true',
  ),
  fc.constant('x'.repeat(5000)),
);
const hostileNumber = fc.oneof(
  fc.double(), fc.integer(), fc.constantFrom(1e308, -1e308, 5e-324, -0, 2 ** 53 + 1, Number.MAX_SAFE_INTEGER, 1e9 + 1),
);
/** Deeply nested arrays/objects. */
const deep = fc.integer({ min: 50, max: 3000 }).map((n) => {
  let v: unknown = 1;
  for (let i = 0; i < n; i++) v = i % 2 ? [v] : { a: v };
  return v;
});
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  hostileString, hostileNumber, fc.boolean(), fc.constant(null), deep,
  fc.array(hostileString, { maxLength: 5 }), fc.dictionary(hostileString, hostileString, { maxKeys: 4 }),
  fc.constant({ __proto__: { polluted: true } }), fc.jsonValue({ maxDepth: 4 }),
);

/** A valid body with one field (or a nested field) replaced by a hostile value, a key removed, or an extra key. */
function mutated(valid: () => Record<string, unknown>): fc.Arbitrary<unknown> {
  return fc.oneof(
    fc.tuple(fc.nat(), hostileValue).map(([i, v]) => {
      const b = valid();
      const keys = Object.keys(b);
      b[keys[i % keys.length]!] = v;
      return b;
    }),
    fc.nat().map((i) => {
      const b = valid();
      const keys = Object.keys(b);
      delete b[keys[i % keys.length]!];
      return b;
    }),
    fc.tuple(hostileString, hostileValue).map(([k, v]) => ({ ...valid(), [k]: v })),
    hostileValue,
    fc.anything({ maxDepth: 3 }),
  );
}

interface Endpoint { method: string; label: string; path: () => string; valid: () => Record<string, unknown> }

const endpoints: Endpoint[] = [
  { method: 'POST', label: '/api/sites', path: () => '/api/sites', valid: () => ({ name: 'P', timeZone: 'UTC' }) },
  { method: 'PUT', label: '/api/sites/:id', path: () => `/api/sites/${ids.siteId}`, valid: () => ({ name: 'Test plant', timeZone: 'Europe/Berlin' }) },
  { method: 'POST', label: '/api/limit-sets', path: () => '/api/limit-sets', valid: () => ({ siteId: ids.siteId, name: 'L', rules: [{ metric: 'fieldVPerM', warn: 1, alarm: 2, source: 's' }] }) },
  { method: 'PUT', label: '/api/limit-sets/:id', path: () => `/api/limit-sets/${ids.limitSetId}`, valid: () => ({ siteId: ids.siteId, name: 'EPA', rules: [{ metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'ANSI/ESD S20.20-2021 8.3.1 (125 V/inch)' }] }) },
  { method: 'POST', label: '/api/areas', path: () => '/api/areas', valid: () => ({ siteId: ids.siteId, name: 'A', kind: 'epa' }) },
  { method: 'PUT', label: '/api/areas/:id', path: () => `/api/areas/${ids.areaId}`, valid: () => ({ siteId: ids.siteId, name: 'EPA 1', kind: 'epa', limitSetId: ids.limitSetId }) },
  { method: 'PUT', label: '/api/areas/:id/route', path: () => `/api/areas/${ids.areaId}/route`, valid: () => ({ spotIds: [...ids.spotIds] }) },
  { method: 'POST', label: '/api/spots', path: () => '/api/spots', valid: () => ({ areaId: ids.areaId, name: 'S', code: `P-${Math.floor(Math.random() * 1e9)}`, objectKind: 'roll', defaultDistance: { value: 1, unit: 'cm' } }) },
  { method: 'PUT', label: '/api/spots/:id', path: () => `/api/spots/${ids.spotIds[0]}`, valid: () => ({ areaId: ids.areaId, name: 'Workstation 1', code: 'W-1', objectKind: 'workstation', defaultDistance: { value: 1, unit: 'inch' } }) },
  { method: 'POST', label: '/api/spots/:id/retire', path: () => `/api/spots/${newId()}/retire`, valid: () => ({ reason: 'gone' }) },
  { method: 'POST', label: '/api/meters', path: () => '/api/meters', valid: () => ({ siteId: ids.siteId, serial: `S-${Math.random()}`, modes: ['field'], calibrationDue: '2030-01-01' }) },
  { method: 'PUT', label: '/api/meters/:id', path: () => `/api/meters/${ids.fieldOnlyMeterId}`, valid: () => ({ siteId: ids.siteId, serial: 'M-2', modes: ['field'], calibrationDue: '2099-12-31' }) },
  { method: 'POST', label: '/api/rounds', path: () => '/api/rounds', valid: () => ({ id: newId(), siteId: ids.siteId, surveyor: 'A', startedAt: '2026-03-02T08:00:00Z' }) },
  { method: 'POST', label: '/api/rounds/:id/skips', path: () => `/api/rounds/${roundId}/skips`, valid: () => ({ id: newId(), roundId, spotId: ids.spotIds[1], reason: 'r', at: '2026-03-02T08:00:00Z' }) },
  { method: 'POST', label: '/api/rounds/:id/finish', path: () => `/api/rounds/${newId()}/finish`, valid: () => ({ endedAt: '2026-03-02T09:00:00Z' }) },
  { method: 'POST', label: '/api/readings', path: () => '/api/readings', valid: () => readingInput(roundId, ids.spotIds[1]!, ids.meterId) },
  { method: 'POST', label: '/api/readings', path: () => '/api/readings', valid: () => ({ readings: [readingInput(roundId, ids.spotIds[1]!, ids.meterId), readingInput(roundId, ids.spotIds[2]!, ids.meterId)] }) },
  { method: 'POST', label: '/api/readings/:id/corrections', path: () => `/api/readings/${newId()}/corrections`, valid: () => ({ ...readingInput(roundId, ids.spotIds[1]!, ids.meterId), reason: 'r' }) },
  { method: 'POST', label: '/api/readings/:id/tombstone', path: () => `/api/readings/${newId()}/tombstone`, valid: () => ({ reason: 'r' }) },
  // issue 4
  { method: 'POST', label: '/api/follow-ups', path: () => '/api/follow-ups', valid: () => ({ spotId: ids.spotIds[0], findingClass: 'observation', action: 'a', dueDate: '2030-01-01' }) },
  { method: 'PUT', label: '/api/follow-ups/:id', path: () => `/api/follow-ups/${followUpId}`, valid: () => ({ action: 'b', assignee: 'c' }) },
  { method: 'POST', label: '/api/follow-ups/:id/close', path: () => `/api/follow-ups/${followUpId}/close`, valid: () => ({ reason: 'done' }) },
  { method: 'POST', label: '/api/follow-ups/:id/reopen', path: () => `/api/follow-ups/${followUpId}/reopen`, valid: () => ({ reason: 'again' }) },
  { method: 'PUT', label: '/api/spots/:id/position', path: () => `/api/spots/${ids.spotIds[1]}/position`, valid: () => ({ x: 0.5, y: 0.25 }) },
  { method: 'POST', label: '/api/sites/:id/import/readings/preview', path: () => `/api/sites/${ids.siteId}/import/readings/preview`, valid: importValid },
  { method: 'POST', label: '/api/sites/:id/import/readings/commit', path: () => `/api/sites/${ids.siteId}/import/readings/commit`, valid: importValid },
  { method: 'POST', label: '/api/import/site.json', path: () => '/api/import/site.json', valid: () => ({ format: 'chargewalk-site-export', version: 1, exportedAt: 'x', site: { id: newId(), name: 'S', timeZone: 'UTC', notes: '', createdAt: 'x', updatedAt: 'x' }, limitSets: [], areas: [], spots: [], meters: [], rounds: [], skips: [], readings: [], tombstones: [], conflicts: [], followUps: [], followUpEvents: [], plans: [], positions: [] }) },
];

describe('property: random and malicious bodies on every write endpoint', () => {
  for (const ep of endpoints) {
    it(`${ep.method} ${ep.label}: never 5xx; a refusal is 4xx with the envelope and changes nothing`, async () => {
      await fc.assert(fc.asyncProperty(mutated(ep.valid), async (body) => {
        const before = dbFingerprint(srv.dbPath);
        const r = await call(srv.baseUrl, ep.method, ep.path(), body);
        expect(r.status, JSON.stringify(r.body)).toBeLessThan(500);
        if (r.status >= 400) {
          expect(typeof r.body.error.code).toBe('string');
          expect(typeof r.body.error.message).toBe('string');
          if (r.status === 400) expect(r.body.error.fields.length).toBeGreaterThan(0);
          expect(dbFingerprint(srv.dbPath)).toEqual(before);
        }
      }), { numRuns: 25, seed: 20260302 });
    });
  }

  it('text with markup and SQL is stored and answered exactly as typed', async () => {
    const note = `<script>alert("x")</script> '; DROP TABLE readings; -- 𝔘𝔫𝔦 \u202E`;
    const r = await call(srv.baseUrl, 'POST', '/api/readings', readingInput(roundId, ids.spotIds[1]!, ids.meterId, { note }));
    expect(r.body.acks[0].reading.note).toBe(note.trim());
    expect(r.headers.get('content-type')).toContain('application/json');
    expect(r.headers.get('x-content-type-options')).toBe('nosniff');
  });
});
