// Data in and out over real HTTP: readings as CSV (corrections and deletions marked),
// CSV import (preview lists every invalid row by its line and reason; commit is all
// or nothing; re-importing the same file adds nothing), and a whole site as JSON
// imported into an empty instance with the same counts and the same export.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../../core/csv';
import { newId } from '../../core/ids/uuidv7';
import { READINGS_CSV_HEADER } from '../../server/exchange/readings-csv';
import { call, createRound, createSetup, dbFingerprint, readingInput, type SetupIds } from '../helpers/api';
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

describe('readings CSV export', () => {
  it('has every revision with value as entered, field, verdict, meter and surveyor; corrections and deletions marked', async () => {
    const roundId = await createRound(srv.baseUrl, ids.siteId, { rhPercent: 41 });
    const a = readingInput(roundId, ids.spotIds[0]!, ids.meterId, { value: 125, unit: 'V/inch', takenAt: '2026-03-02T08:05:00Z', rhPercent: 38.5, note: '=SUM(A1)' });
    const b = readingInput(roundId, ids.spotIds[1]!, ids.meterId, { value: 300, takenAt: '2026-03-02T08:06:00Z' });
    const c = readingInput(roundId, ids.spotIds[2]!, ids.meterId, { value: 20, unit: 'V', takenAt: '2026-03-02T08:07:00Z' });
    expect((await call(srv.baseUrl, 'POST', '/api/readings', { readings: [a, b, c] })).status).toBe(200);
    const fix = { ...b, id: newId(), value: 3000, reason: 'missed a digit' };
    expect((await call(srv.baseUrl, 'POST', `/api/readings/${b.id}/corrections`, fix)).status).toBe(201);
    expect((await call(srv.baseUrl, 'POST', `/api/readings/${c.id}/tombstone`, { reason: 'wrong spot' })).status).toBe(200);

    const res = await fetch(`${srv.baseUrl}/api/sites/${ids.siteId}/readings.csv?from=2026-03-02&to=2026-03-02`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="readings-test-plant-from-2026-03-02-to-2026-03-02.csv"');
    const { rows } = parseCsv(await res.text());
    expect(rows[0]).toEqual([...READINGS_CSV_HEADER]);
    const byId = new Map(rows.slice(1).map((r) => [r[0], Object.fromEntries(rows[0]!.map((h, i) => [h, r[i]]))]));
    expect(byId.size).toBe(4);
    expect(byId.get(a.id as string)).toMatchObject({
      revision: 'current', 'taken at (UTC)': '2026-03-02T08:05:00.000Z', 'taken at (site time)': '2026-03-02 09:05:00', 'spot code': 'W-1',
      spot: 'Workstation 1', area: 'EPA 1', value: '125', unit: 'V/inch', polarity: 'positive', 'distance': '1', 'distance unit': 'inch', 'distance (m)': '0.0254',
      verdict: 'alarm', 'RH (%)': '38.5', 'RH of the round (%)': '41', 'meter serial': 'M-1', surveyor: 'Test Surveyor', 'round id': roundId,
      zeroed: 'true', note: "'=SUM(A1)",
    });
    expect(Number(byId.get(a.id as string)!['field (V/m)'])).toBeCloseTo(125 / 0.0254, 6);
    expect(byId.get(a.id as string)!['verdict reason']).toMatch(/at or above the alarm level/);
    expect(byId.get(b.id as string)).toMatchObject({ revision: 'superseded', 'superseded by id': fix.id, value: '300', verdict: 'ok' });
    expect(byId.get(fix.id)).toMatchObject({ revision: 'current', 'supersedes id': b.id, 'correction reason': 'missed a digit', value: '3000', verdict: 'warn' });
    expect(byId.get(c.id as string)).toMatchObject({ revision: 'deleted', 'deleted reason': 'wrong spot', unit: 'V', 'field (V/m)': String(20 / 0.0254) });

    const none = await fetch(`${srv.baseUrl}/api/sites/${ids.siteId}/readings.csv?from=2026-03-03`);
    expect(parseCsv(await none.text()).rows).toHaveLength(1);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/readings.csv?from=yesterday`)).status).toBe(400);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/readings.csv?from=2026-03-03&to=2026-03-01`)).body.error.fields).toEqual([{ path: 'to', message: 'must be after from' }]);
  });
});

const FILE = [
  'Spot;Time;Reading;Unit;RH;Who;Note',
  'W-1;2026-02-03 07:45;1200;V/m;35,5;Ana;ok',
  'w-2;2026-02-03 07:47;-3000;V/m;36;Ana;"two',
  'lines"',
  'Workstation 3;2026-02-03T06:50:00Z;4,9;kV/m;;Ben;',
  'W-9;2026-02-03 07:52;100;V/m;;Ana;unknown spot',
  'W-1;2026-02-31 07:55;100;V/m;;Ana;no such day',
  'W-2;2026-02-04 08:00;abc;V/m;;Ana;not a number',
  'W-3;2026-02-04 08:05;20;V;;Ana;surface voltage, meter M-1 has a calibrated distance',
  'W-3;2026-02-04 08:06;20;furlongs;;Ana;not a unit',
].join('\r\n');

function importBody(extra: Record<string, unknown> = {}) {
  return {
    csv: FILE,
    mapping: { spot: 'Spot', takenAt: 'Time', value: 'Reading', unit: 'unit', rhPercent: 4, surveyor: 'Who', note: 'Note' },
    defaults: { meterId: ids.meterId, distance: { value: 1, unit: 'inch' } },
    ...extra,
  };
}

describe('readings CSV import', () => {
  it('previews: every invalid row by its line in the file, field and reason; a sample of the valid ones', async () => {
    const r = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody());
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ rows: 8, valid: 4, alreadyImported: 0, rounds: 3, columns: ['Spot', 'Time', 'Reading', 'Unit', 'RH', 'Who', 'Note'] });
    expect(r.body.invalid).toEqual([
      { row: 6, field: 'spot', reason: "no spot of this site has the code or name 'W-9'" },
      { row: 7, field: 'takenAt', reason: "'2026-02-31 07:55' is not a time like 2026-02-03 07:45 (site time) or 2026-02-03T06:45:00Z" },
      { row: 8, field: 'value', reason: "'abc' is not a number" },
      { row: 10, field: 'unit', reason: "'furlongs' is not a unit (V/m, kV/m, V/cm, kV/cm, V/inch, kV/inch, V, kV)" },
    ]);
    expect(r.body.sample.map((s: { row: number; spotCode: string }) => [s.row, s.spotCode])).toEqual([[2, 'W-1'], [3, 'W-2'], [5, 'W-3'], [9, 'W-3']]);
    expect(r.body.sample[0]).toMatchObject({ takenAt: '2026-02-03T06:45:00.000Z', value: 1200, unit: 'V/m', polarity: '+', fieldVPerM: 1200, rhPercent: 35.5, surveyor: 'Ana', distance: { value: 1, unit: 'inch' } });
    expect(r.body.sample[1]).toMatchObject({ value: 3000, polarity: '-', fieldVPerM: -3000 });
    expect(r.body.sample[2]).toMatchObject({ takenAt: '2026-02-03T06:50:00.000Z', value: 4.9, unit: 'kV/m', surveyor: 'Ben' });
  });

  it('commits all valid rows in one transaction or nothing; re-importing the same file adds nothing', async () => {
    const before = dbFingerprint(srv.dbPath);
    const refused = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/commit`, importBody());
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toBe('4 rows are not valid, so nothing was imported: fix them, or send skipInvalid: true to import the 4 valid rows');
    expect(refused.body.error.fields[0]).toEqual({ path: 'rows.6.spot', message: "line 6: no spot of this site has the code or name 'W-9'" });
    expect(dbFingerprint(srv.dbPath)).toEqual(before);

    const done = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/commit`, importBody({ skipInvalid: true }));
    expect(done.status).toBe(200);
    expect(done.body).toMatchObject({ rows: 8, valid: 4, stored: 4, duplicates: 0, conflicts: 0, rounds: 3 });
    const rounds = (await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/rounds`)).body.rounds as { id: string; surveyor: string; startedAt: string; endedAt: string; notes: string; plannedSpotIds: string[] }[];
    const imported = rounds.filter((x) => x.notes === 'Imported from a CSV file');
    expect(imported.map((x) => [x.surveyor, x.startedAt, x.endedAt]).sort()).toEqual([
      ['Ana', '2026-02-02T23:00:00.000Z', '2026-02-03T22:59:59.999Z'],
      ['Ana', '2026-02-03T23:00:00.000Z', '2026-02-04T22:59:59.999Z'],
      ['Ben', '2026-02-02T23:00:00.000Z', '2026-02-03T22:59:59.999Z'],
    ]);
    expect(imported.every((x) => x.plannedSpotIds.length === 0)).toBe(true);
    const w2 = (await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[1]}/readings`)).body.readings.find((x: { takenAt: string }) => x.takenAt === '2026-02-03T06:47:00.000Z');
    expect(w2).toMatchObject({ value: 3000, polarity: '-', fieldVPerM: -3000, rhPercent: 36, note: 'two\r\nlines', distance: { value: 1, unit: 'inch' }, zeroed: true });

    const afterFirst = dbFingerprint(srv.dbPath);
    const again = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/commit`, importBody({ skipInvalid: true }));
    expect(again.body).toMatchObject({ stored: 0, duplicates: 4, rounds: 0 });
    expect(dbFingerprint(srv.dbPath)).toEqual(afterFirst);
    expect((await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody())).body.alreadyImported).toBe(4);
  });

  it('answers 400 for a mapping the file does not have, and for files with nothing to import', async () => {
    const r = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody({ mapping: { spot: 'Spot', takenAt: 'When', value: 'Reading' } }));
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toEqual([{ path: 'mapping.takenAt', message: "no column named 'When' in the first line (columns: Spot, Time, Reading, Unit, RH, Who, Note)" }]);
    const noValue = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody({ mapping: { spot: 0, takenAt: 1 } }));
    expect(noValue.body.error.fields).toEqual([{ path: 'mapping.value', message: 'map the column with the value' }]);
    const unclosed = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody({ csv: 'Spot;Time;Reading\n"W-1;x;1' }));
    expect(unclosed.body.error.fields).toEqual([{ path: 'csv', message: 'CSV: a quoted field opened on line 2 is never closed' }]);
    const meter = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody({ defaults: { meterId: newId() } }));
    expect(meter.body.error.fields).toEqual([{ path: 'defaults.meterId', message: 'no meter with this id at this site' }]);
    const allBad = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/commit`, importBody({ csv: 'Spot;Time;Reading\nW-9;2026-01-01 10:00;1', mapping: { spot: 0, takenAt: 1, value: 2 }, defaults: { meterId: ids.meterId, unit: 'V/m', distance: { value: 1, unit: 'inch' }, surveyor: 'X' }, skipInvalid: true }));
    expect(allBad.status).toBe(400);
    expect(allBad.body.error.message).toBe('no row of the file is valid: nothing to import');
    expect((await call(srv.baseUrl, 'POST', `/api/sites/${newId()}/import/readings/preview`, importBody())).status).toBe(404);
    // the field-only meter cannot take a surface-voltage reading: the row says so (it would fail the whole batch in the store)
    const sv = await call(srv.baseUrl, 'POST', `/api/sites/${ids.siteId}/import/readings/preview`, importBody({ csv: 'Spot;Time;Reading;Unit\nW-1;2026-01-01 10:00;5;V', mapping: { spot: 0, takenAt: 1, value: 2, unit: 3 }, defaults: { meterId: ids.fieldOnlyMeterId, distance: { value: 1, unit: 'inch' }, surveyor: 'X' } }));
    expect(sv.body.invalid).toEqual([{ row: 2, field: 'unit', reason: 'meter M-2 has no calibrated distance, so a surface-voltage reading (V) cannot be converted to a field' }]);
  });
});

describe('whole-site JSON export and import', () => {
  it('moves the demo site into an empty instance: same counts, the same export, and a second import is refused', async () => {
    const demo = await startTestServer({ demo: true });
    const fresh = await startTestServer();
    try {
      const siteId = (await call(demo.baseUrl, 'GET', '/api/sites')).body.sites[0].id;
      const setup = (await call(demo.baseUrl, 'GET', `/api/sites/${siteId}/setup`)).body;
      const spot = setup.spots[0];
      // a follow-up, a plan and a position travel too
      expect((await call(demo.baseUrl, 'POST', '/api/follow-ups', { spotId: spot.id, findingClass: 'observation', action: 'Check the earthing clamp' })).status).toBe(201);
      expect((await call(demo.baseUrl, 'PUT', `/api/areas/${spot.areaId}/plan`, undefined, { raw: '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 5"><rect width="10" height="5"/></svg>', contentType: 'image/svg+xml' })).status).toBe(200);
      expect((await call(demo.baseUrl, 'PUT', `/api/spots/${spot.id}/position`, { x: 0.1, y: 0.9 })).status).toBe(200);

      const res = await fetch(`${demo.baseUrl}/api/sites/${siteId}/export.json`);
      expect(res.status).toBe(200);
      expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="site-quillmere-converting-works-demo-\d{4}-\d\d-\d\d\.json"$/);
      const data = await res.json();
      expect(data.readings.length).toBeGreaterThan(500);
      expect(data.readings.some((r: { supersedesId: string | null }) => r.supersedesId !== null)).toBe(true);
      expect(data.tombstones.length).toBeGreaterThan(0);

      const imported = await call(fresh.baseUrl, 'POST', '/api/import/site.json', data);
      expect(imported.status).toBe(201);
      const demoDb = dbFingerprint(demo.dbPath).counts;
      const freshDb = dbFingerprint(fresh.dbPath).counts;
      for (const t of ['sites', 'limit_sets', 'areas', 'spots', 'meters', 'rounds', 'round_skips', 'readings', 'reading_tombstones', 'reading_conflicts',
        'follow_ups', 'follow_up_events', 'area_plans', 'spot_positions']) {
        expect(freshDb[t], t).toBe(demoDb[t]);
      }
      expect(imported.body).toEqual({ siteId, counts: expect.objectContaining({ readings: demoDb.readings, rounds: demoDb.rounds, followUps: demoDb.follow_ups, plans: demoDb.area_plans, positions: demoDb.spot_positions }) });

      const again = await (await fetch(`${fresh.baseUrl}/api/sites/${siteId}/export.json`)).json();
      expect({ ...again, exportedAt: '' }).toEqual({ ...data, exportedAt: '' });
      // derived answers agree too
      const week = (await call(demo.baseUrl, 'GET', `/api/sites/${siteId}/review`)).body;
      const week2 = (await call(fresh.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${week.week.isoWeek}`)).body;
      expect({ ...week2, generatedAt: '' }).toEqual({ ...week, generatedAt: '' });

      const twice = await call(fresh.baseUrl, 'POST', '/api/import/site.json', data);
      expect(twice.status).toBe(409);
      expect(twice.body.error.message).toMatch(new RegExp(`^a site with id ${siteId} is already stored here`));

      const broken = { ...data, site: { ...data.site, id: newId() }, readings: [{ ...data.readings[0], roundId: newId() }, ...data.readings.slice(1)] };
      const before = dbFingerprint(fresh.dbPath);
      const bad = await call(fresh.baseUrl, 'POST', '/api/import/site.json', broken);
      expect(bad.status).toBe(400);
      expect(bad.body.error.fields).toEqual(expect.arrayContaining([{ path: 'readings.0.roundId', message: 'no round with this id in the export' }]));
      expect((await call(fresh.baseUrl, 'POST', '/api/import/site.json', { format: 'something else' })).status).toBe(400);
      expect(dbFingerprint(fresh.dbPath)).toEqual(before);

      // The readings CSV carries the estimate the spot's model defines: charge for a roll (line), surface charge
      // density for a web (sheet), each equal to the stored reading's own estimate (issue 4: "estimate").
      const csv = parseCsv(await (await fetch(`${demo.baseUrl}/api/sites/${siteId}/readings.csv`)).text()).rows;
      const head = csv[0]!;
      const at = (row: string[], name: string) => row[head.indexOf(name)]!;
      for (const code of ['C-01', 'C-02']) {
        const s = setup.spots.find((x: { code: string }) => x.code === code);
        const latest = (await call(demo.baseUrl, 'GET', `/api/spots/${s.id}/readings?limit=1`)).body.readings[0];
        const row = csv.find((r) => r[0] === latest.id)!;
        expect(at(row, 'model'), code).toBe(s.model);
        if (code === 'C-01') {
          expect(Number(at(row, 'charge estimate (C)')) / latest.estimate.chargeC).toBeCloseTo(1, 9);
          expect(Number(at(row, 'surface charge density estimate (C/m²)')) / latest.estimate.surfaceChargeDensityCPerM2).toBeCloseTo(1, 9);
        } else {
          expect(at(row, 'charge estimate (C)')).toBe('');
          expect(Number(at(row, 'surface charge density estimate (C/m²)')) / latest.estimate.surfaceChargeDensityCPerM2).toBeCloseTo(1, 9);
        }
      }
    } finally {
      await demo.close();
      await fresh.close();
    }
  });
});
