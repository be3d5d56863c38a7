// Set-up over real HTTP against a real SQLite file: create, read and update each
// entity; the offline set-up bundle; route order; retiring a spot; templates.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { call, createSetup, type SetupIds } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

let srv: TestServer;
let ids: SetupIds;

beforeAll(async () => {
  srv = await startTestServer();
  ids = await createSetup(srv.baseUrl);
});
afterAll(async () => {
  await srv.close();
});

const iso = expect.stringMatching(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);

describe('sites', () => {
  it('creates, lists, reads and updates a site', async () => {
    const created = await call(srv.baseUrl, 'POST', '/api/sites', { name: '  Second plant ', timeZone: 'America/Chicago' });
    expect(created.status).toBe(201);
    expect(created.body).toEqual({ id: expect.any(String), name: 'Second plant', timeZone: 'America/Chicago', notes: '', createdAt: iso, updatedAt: iso });
    const list = await call(srv.baseUrl, 'GET', '/api/sites');
    expect(list.status).toBe(200);
    expect(list.body.sites.map((s: { name: string }) => s.name)).toEqual(['Second plant', 'Test plant']);
    const put = await call(srv.baseUrl, 'PUT', `/api/sites/${created.body.id}`, { name: 'Second plant, renamed', timeZone: 'Europe/Vienna', notes: 'n' });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ id: created.body.id, name: 'Second plant, renamed', timeZone: 'Europe/Vienna', notes: 'n', createdAt: created.body.createdAt });
    const got = await call(srv.baseUrl, 'GET', `/api/sites/${created.body.id}`);
    expect(got.body).toEqual(put.body);
  });

  it('answers 404 with the envelope for an unknown site, and for an id that is not a UUID', async () => {
    const unknown = newId();
    const r = await call(srv.baseUrl, 'GET', `/api/sites/${unknown}`);
    expect(r.status).toBe(404);
    expect(r.body).toEqual({ error: { code: 'not-found', message: `no site with id ${unknown}`, fields: [{ path: 'id', message: 'no site with this id' }] } });
    const bad = await call(srv.baseUrl, 'GET', '/api/sites/not-a-uuid');
    expect(bad.status).toBe(404);
    expect(bad.body.error.fields).toEqual([{ path: 'id', message: 'must be a UUID' }]);
  });

  it('refuses a time zone that is not an IANA name', async () => {
    const r = await call(srv.baseUrl, 'POST', '/api/sites', { name: 'X', timeZone: 'Mars/Olympus' });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toEqual([{ path: 'timeZone', message: 'time zone must be an IANA name such as Europe/Berlin' }]);
  });
});

describe('limit sets, areas, spots, meters', () => {
  it('reads and updates a limit set; rules keep their sources', async () => {
    const got = await call(srv.baseUrl, 'GET', `/api/limit-sets/${ids.limitSetId}`);
    expect(got.status).toBe(200);
    expect(got.body.rules).toEqual([{ metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'ANSI/ESD S20.20-2021 8.3.1 (125 V/inch)' }]);
    const put = await call(srv.baseUrl, 'PUT', `/api/limit-sets/${ids.limitSetId}`, {
      siteId: ids.siteId, name: 'EPA strict',
      rules: [
        { metric: 'fieldVPerM', warn: 2000, alarm: 4921, source: 'site practice' },
        { metric: 'surfaceVoltageV', warn: null, alarm: 35, source: 'ANSI/ESD S20.20-2021 scope' },
      ],
    });
    expect(put.status).toBe(200);
    expect(put.body.name).toBe('EPA strict');
    expect(put.body.rules).toHaveLength(2);
    // back to the rules the reading tests expect
    await call(srv.baseUrl, 'PUT', `/api/limit-sets/${ids.limitSetId}`, { ...got.body, id: undefined, createdAt: undefined, updatedAt: undefined });
  });

  it('refuses a limit set that names the same metric twice (path rules.1.metric)', async () => {
    const r = await call(srv.baseUrl, 'POST', '/api/limit-sets', {
      siteId: ids.siteId, name: 'twice',
      rules: [{ metric: 'fieldVPerM', warn: 1, alarm: 2, source: 's' }, { metric: 'fieldVPerM', warn: 1, alarm: 2, source: 's' }],
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toEqual([{ path: 'rules.1.metric', message: 'metric fieldVPerM appears twice' }]);
  });

  it('creates a hazardous area and updates it; refuses a limit set of another site', async () => {
    const other = await call(srv.baseUrl, 'POST', '/api/sites', { name: 'Other', timeZone: 'UTC' });
    const foreignLs = await call(srv.baseUrl, 'POST', '/api/limit-sets', { siteId: other.body.id, name: 'f', rules: [] });
    const area = await call(srv.baseUrl, 'POST', '/api/areas', { siteId: ids.siteId, name: 'Hall', kind: 'hazardous', zone: 1, gasGroup: 'IIA', substanceId: 'toluene' });
    expect(area.status).toBe(201);
    expect(area.body).toMatchObject({ kind: 'hazardous', zone: 1, gasGroup: 'IIA', substanceId: 'toluene', dustMieJ: null, limitSetId: null });
    const bad = await call(srv.baseUrl, 'PUT', `/api/areas/${area.body.id}`, { siteId: ids.siteId, name: 'Hall', kind: 'hazardous', zone: 1, limitSetId: foreignLs.body.id });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual([{ path: 'limitSetId', message: 'the limit set belongs to another site' }]);
    const put = await call(srv.baseUrl, 'PUT', `/api/areas/${area.body.id}`, { siteId: ids.siteId, name: 'Hall C', kind: 'hazardous', zone: 2, gasGroup: 'IIB' });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ name: 'Hall C', zone: 2, gasGroup: 'IIB' });
    const got = await call(srv.baseUrl, 'GET', `/api/areas/${area.body.id}`);
    expect(got.body).toEqual(put.body);
  });

  it('creates, reads and updates a spot; a code is unique per site whatever its case (409 naming code)', async () => {
    const spot = await call(srv.baseUrl, 'POST', '/api/spots', {
      areaId: ids.areaId, name: 'Roll', code: 'R-1', objectKind: 'roll', materialClass: 'insulator', model: 'line',
      geometry: { radiusM: 0.3, lengthM: 1.5 }, defaultDistance: { value: 10, unit: 'cm' },
    });
    expect(spot.status).toBe(201);
    expect(spot.body).toMatchObject({ code: 'R-1', geometry: { radiusM: 0.3, lengthM: 1.5 }, defaultDistance: { value: 10, unit: 'cm' }, retiredAt: null, retiredReason: null });
    const dup = await call(srv.baseUrl, 'POST', '/api/spots', {
      areaId: ids.areaId, name: 'Other roll', code: 'r-1', objectKind: 'roll', defaultDistance: { value: 10, unit: 'cm' },
    });
    expect(dup.status).toBe(409);
    expect(dup.body.error).toMatchObject({ code: 'conflict', fields: [{ path: 'code', message: 'another spot of this site already has the code r-1' }] });
    const put = await call(srv.baseUrl, 'PUT', `/api/spots/${spot.body.id}`, {
      areaId: ids.areaId, name: 'Rewind roll', code: 'R-1', objectKind: 'roll', materialClass: 'insulator', model: 'line',
      geometry: { radiusM: 0.35, lengthM: 1.5 }, defaultDistance: { value: 5, unit: 'cm' },
    });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ name: 'Rewind roll', geometry: { radiusM: 0.35 }, defaultDistance: { value: 5, unit: 'cm' } });
    expect((await call(srv.baseUrl, 'GET', `/api/spots/${spot.body.id}`)).body).toEqual(put.body);
  });

  it('creates, reads and updates a meter; serials are unique per site', async () => {
    const got = await call(srv.baseUrl, 'GET', `/api/meters/${ids.meterId}`);
    expect(got.body).toMatchObject({ serial: 'M-1', modes: ['field', 'surface-voltage'], calibratedDistanceM: 0.0254, accuracyRel: 0.05, geometryFactor: 1, defaultUnit: 'kV/m' });
    const dup = await call(srv.baseUrl, 'POST', '/api/meters', { siteId: ids.siteId, serial: 'M-1', modes: ['field'], calibrationDue: '2030-01-01' });
    expect(dup.status).toBe(409);
    const noDistance = await call(srv.baseUrl, 'POST', '/api/meters', { siteId: ids.siteId, serial: 'M-9', modes: ['surface-voltage'], calibrationDue: '2030-01-01' });
    expect(noDistance.status).toBe(400);
    expect(noDistance.body.error.fields).toEqual([{ path: 'calibratedDistanceM', message: 'surface-voltage mode needs the calibrated distance' }]);
    const m = await call(srv.baseUrl, 'POST', '/api/meters', { siteId: ids.siteId, serial: 'M-3', modes: ['field'], calibrationDue: '2030-01-01' });
    const put = await call(srv.baseUrl, 'PUT', `/api/meters/${m.body.id}`, { siteId: ids.siteId, serial: 'M-3', label: 'spare', modes: ['field'], calibrationDue: '2031-06-30' });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ label: 'spare', calibrationDue: '2031-06-30' });
  });
});

describe('route order, retire, set-up bundle, templates', () => {
  it('puts the listed spots first in the given order', async () => {
    const [a, b, c] = ids.spotIds as [string, string, string];
    const r = await call(srv.baseUrl, 'PUT', `/api/areas/${ids.areaId}/route`, { spotIds: [c, a] });
    expect(r.status).toBe(200);
    const order = r.body.spots.map((s: { id: string }) => s.id);
    // c and a first; the area's other spots (b, and R-1 from an earlier test) follow in their old order
    expect(order.slice(0, 2)).toEqual([c, a]);
    expect(order).toContain(b);
    expect(r.body.spots.map((s: { routePosition: number }) => s.routePosition)).toEqual(order.map((_: string, i: number) => i));
    const twice = await call(srv.baseUrl, 'PUT', `/api/areas/${ids.areaId}/route`, { spotIds: [a, a] });
    expect(twice.status).toBe(400);
    expect(twice.body.error.fields).toEqual([{ path: 'spotIds.1', message: `spot ${a} appears twice` }]);
    const unknown = newId();
    const missing = await call(srv.baseUrl, 'PUT', `/api/areas/${ids.areaId}/route`, { spotIds: [unknown] });
    expect(missing.status).toBe(404);
    expect(missing.body.error.fields).toEqual([{ path: 'spotIds.0', message: `no spot with id ${unknown}` }]);
    const back = await call(srv.baseUrl, 'PUT', `/api/areas/${ids.areaId}/route`, { spotIds: [a, b, c] });
    expect(back.body.spots.slice(0, 3).map((s: { id: string }) => s.id)).toEqual([a, b, c]);
  });

  it('retires a spot (idempotent) and the set-up bundle still carries it, marked', async () => {
    const spot = await call(srv.baseUrl, 'POST', '/api/spots', { areaId: ids.areaId, name: 'Old bench', code: 'OLD-1', objectKind: 'workstation', defaultDistance: { value: 1, unit: 'inch' } });
    const r = await call(srv.baseUrl, 'POST', `/api/spots/${spot.body.id}/retire`, { reason: 'bench removed' });
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ retiredAt: iso, retiredReason: 'bench removed' });
    const again = await call(srv.baseUrl, 'POST', `/api/spots/${spot.body.id}/retire`, { reason: 'other words' });
    expect(again.body).toEqual(r.body);
    const setup = await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/setup`);
    expect(setup.status).toBe(200);
    expect(Object.keys(setup.body).sort()).toEqual(['areas', 'followUps', 'limitSets', 'meters', 'site', 'spots']);
    expect(setup.body.spots.find((s: { id: string }) => s.id === spot.body.id).retiredAt).not.toBeNull();
    expect(setup.body.meters.length).toBeGreaterThanOrEqual(2);
    // a new round does not plan a retired spot
    const roundId = newId();
    const round = await call(srv.baseUrl, 'POST', '/api/rounds', { id: roundId, siteId: ids.siteId, surveyor: 'A', startedAt: '2026-03-02T08:00:00Z' });
    expect(round.body.plannedSpotIds).not.toContain(spot.body.id);
    expect(round.body.plannedSpotIds.slice(0, 3)).toEqual(ids.spotIds);
  });

  it('lists starter limit templates, every rule with a source', async () => {
    const r = await call(srv.baseUrl, 'GET', '/api/limit-templates');
    expect(r.status).toBe(200);
    expect(r.body.templates.length).toBeGreaterThan(3);
    for (const t of r.body.templates) for (const rule of t.rules) expect(rule.source.length).toBeGreaterThan(3);
  });
});
