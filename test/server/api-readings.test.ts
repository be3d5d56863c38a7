// Readings over real HTTP against a real SQLite file: one and batch, read back,
// correction (history kept), tombstone, idempotent retry, conflict, retired spot,
// surface-voltage without calibrated distance, round summary and skips.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { call, createRound, createSetup, readingInput, type SetupIds } from '../helpers/api';
import { startTestServer, testBackends, type TestServer } from '../helpers/server';

// Runs on SQLite, and on PostgreSQL too when CHARGEWALK_TEST_PG_URL is set.
describe.each(testBackends())('on %s', (backend) => {
let srv: TestServer;
let ids: SetupIds;
let roundId: string;

beforeAll(async () => {
  srv = await startTestServer({ store: backend });
  ids = await createSetup(srv.baseUrl);
  roundId = await createRound(srv.baseUrl, ids.siteId);
});
afterAll(async () => {
  await srv.close();
});

const post = (body: unknown) => call(srv.baseUrl, 'POST', '/api/readings', body);

describe('POST /api/readings', () => {
  it('stores one reading and answers its ack with the derived values and verdict', async () => {
    // 125 V/inch = 4921.26 V/m: at the alarm level 4921 V/m (a value at the level reaches it)
    const input = readingInput(roundId, ids.spotIds[0]!, ids.meterId, { value: 125, unit: 'V/inch', polarity: '-', takenAt: '2026-03-02T09:05:00+01:00' });
    const r = await post(input);
    expect(r.status).toBe(200);
    expect(r.body.acks).toHaveLength(1);
    const ack = r.body.acks[0];
    expect(ack).toMatchObject({ id: input.id, status: 'stored' });
    expect(ack.reading).toMatchObject({
      id: input.id, value: 125, unit: 'V/inch', polarity: '-', takenAt: '2026-03-02T08:05:00.000Z',
      distanceM: 0.0254, supersedesId: null, supersededById: null, deleted: null, flags: [], meterCalibrationOverdue: false,
      meterRange: '', side: null, groundBehind: null, process: null, note: '',
    });
    expect(ack.reading.fieldVPerM).toBeCloseTo(-125 / 0.0254, 9);
    expect(ack.reading.verdict.level).toBe('alarm');
    expect(ack.reading.verdict.decidedBy).toMatchObject({ metric: 'fieldVPerM', limit: 4921, source: 'ANSI/ESD S20.20-2021 8.3.1 (125 V/inch)' });
  });

  it('stores a batch in order, and reads it back from the round and the spot', async () => {
    const batch = [
      readingInput(roundId, ids.spotIds[1]!, ids.meterId, { value: 3, unit: 'kV/m', takenAt: '2026-03-02T08:10:00Z' }),
      readingInput(roundId, ids.spotIds[1]!, ids.meterId, { value: 0.5, unit: 'kV/m', takenAt: '2026-03-02T08:11:00Z', side: 'back', rhPercent: 31.5, temperatureC: 21, process: { state: 'running', material: 'film', lineSpeedMPerS: 4 }, note: 'second side' }),
      readingInput(roundId, ids.spotIds[2]!, ids.meterId, { value: 10, unit: 'V', takenAt: '2026-03-02T08:12:00Z' }),
    ];
    const r = await post({ readings: batch });
    expect(r.status).toBe(200);
    expect(r.body.acks.map((a: { id: string; status: string }) => [a.id, a.status])).toEqual(batch.map((b) => [b.id, 'stored']));
    expect(r.body.acks[0].reading.verdict.level).toBe('warn');
    expect(r.body.acks[1].reading).toMatchObject({ side: 'back', rhPercent: 31.5, temperatureC: 21, process: { state: 'running', material: 'film', lineSpeedMPerS: 4 }, note: 'second side' });
    // surface-voltage mode: E = V / dCal = 10 V / 0.0254 m
    expect(r.body.acks[2].reading.fieldVPerM).toBeCloseTo(10 / 0.0254, 9);

    const spot = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[1]}/readings`);
    expect(spot.status).toBe(200);
    expect(spot.body.readings.map((x: { id: string }) => x.id)).toEqual([batch[1]!.id, batch[0]!.id]); // newest first
    const limited = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[1]}/readings?limit=1`);
    expect(limited.body.readings).toHaveLength(1);
    const round = await call(srv.baseUrl, 'GET', `/api/rounds/${roundId}/readings`);
    expect(round.body.readings.map((x: { id: string }) => x.id)).toEqual(expect.arrayContaining(batch.map((b) => b.id)));
  });

  it('acknowledges an identical resend as duplicate and stores nothing new', async () => {
    const input = readingInput(roundId, ids.spotIds[0]!, ids.meterId, { value: 42 });
    expect((await post({ readings: [input] })).body.acks[0].status).toBe('stored');
    const before = await srv.fingerprint();
    // the same content, keys in another order and time written with an offset: still the same reading
    const resent = { ...input, takenAt: '2026-03-02T09:05:00+01:00' };
    const r = await post({ readings: [resent, { ...resent }] });
    expect(r.status).toBe(200);
    expect(r.body.acks.map((a: { status: string }) => a.status)).toEqual(['duplicate', 'duplicate']);
    expect(r.body.acks[0].reading.value).toBe(42);
    expect(await srv.fingerprint()).toEqual(before);
  });

  it('keeps a resend with other content as a conflict, never overwriting the original', async () => {
    const input = readingInput(roundId, ids.spotIds[0]!, ids.meterId, { value: 7 });
    await post(input);
    const changed = { ...input, value: 70, note: 'typed again' };
    const r = await post({ readings: [changed] });
    expect(r.body.acks[0]).toMatchObject({ id: input.id, status: 'conflict', message: expect.stringContaining('kept for review') });
    expect(r.body.acks[0].reading.value).toBe(7);
    const again = await post({ readings: [changed] }); // a second resend of the same conflicting content is kept once
    expect(again.body.acks[0].status).toBe('conflict');
    const got = await call(srv.baseUrl, 'GET', `/api/readings/${input.id}`);
    expect(got.body.reading.value).toBe(7);
    const conflicts = await call(srv.baseUrl, 'GET', '/api/conflicts');
    const mine = conflicts.body.conflicts.filter((c: { readingId: string }) => c.readingId === input.id);
    expect(mine).toHaveLength(1);
    expect(mine[0].payload).toMatchObject({ id: input.id, value: 70, note: 'typed again' });
  });

  it('stores and flags a reading for a spot retired while the tablet was offline', async () => {
    const spot = await call(srv.baseUrl, 'POST', '/api/spots', { areaId: ids.areaId, name: 'Cart', code: 'CART-9', objectKind: 'cart', defaultDistance: { value: 1, unit: 'inch' } });
    await call(srv.baseUrl, 'POST', `/api/spots/${spot.body.id}/retire`, { reason: 'cart scrapped' });
    const r = await post(readingInput(roundId, spot.body.id, ids.meterId));
    expect(r.body.acks[0].status).toBe('stored');
    expect(r.body.acks[0].reading.flags).toEqual([{ code: 'spot-retired', message: expect.stringContaining('CART-9 (Cart) was retired') }]);
  });

  it('refuses a surface-voltage reading from a meter without a calibrated distance (400 naming readings.N.unit), storing none of the batch', async () => {
    const before = await srv.fingerprint();
    const r = await post({ readings: [
      readingInput(roundId, ids.spotIds[0]!, ids.fieldOnlyMeterId, { unit: 'kV/m', value: 1 }),
      readingInput(roundId, ids.spotIds[0]!, ids.fieldOnlyMeterId, { unit: 'V', value: 100 }),
    ] });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('invalid');
    expect(r.body.error.fields).toEqual([{ path: 'readings.1.unit', message: expect.stringContaining('no calibrated distance') }]);
    expect(await srv.fingerprint()).toEqual(before);
  });

  it('answers 404 naming readings.N.spotId for an unknown spot and stores none of the batch', async () => {
    const before = await srv.fingerprint();
    const unknown = newId();
    const r = await post({ readings: [readingInput(roundId, ids.spotIds[0]!, ids.meterId), readingInput(roundId, unknown, ids.meterId)] });
    expect(r.status).toBe(404);
    expect(r.body.error).toEqual({ code: 'not-found', message: `no spot with id ${unknown}`, fields: [{ path: 'readings.1.spotId', message: `no spot with id ${unknown}` }] });
    const single = await post(readingInput(newId(), ids.spotIds[0]!, ids.meterId));
    expect(single.status).toBe(404);
    expect(single.body.error.fields[0].path).toBe('roundId');
    expect(await srv.fingerprint()).toEqual(before);
  });

  it('flags readings of a meter past its calibration due date', async () => {
    const m = await call(srv.baseUrl, 'POST', '/api/meters', { siteId: ids.siteId, serial: 'OLD', modes: ['field'], calibrationDue: '2026-01-31' });
    const r = await post(readingInput(roundId, ids.spotIds[0]!, m.body.id, { takenAt: '2026-02-01T08:00:00Z' }));
    expect(r.body.acks[0].reading.meterCalibrationOverdue).toBe(true);
  });
});

describe('corrections and tombstones', () => {
  it('corrects a reading: a new revision, the old one kept and visible with history=1', async () => {
    const original = readingInput(roundId, ids.spotIds[2]!, ids.meterId, { value: 4.5, unit: 'kV/m', takenAt: '2026-03-02T08:20:00Z' });
    await post(original);
    const correction = { ...original, id: newId(), value: 45, reason: 'missed a digit' };
    const r = await call(srv.baseUrl, 'POST', `/api/readings/${original.id}/corrections`, correction);
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ id: correction.id, value: 45, supersedesId: original.id, supersededById: null, correctionReason: 'missed a digit' });
    const retry = await call(srv.baseUrl, 'POST', `/api/readings/${original.id}/corrections`, correction);
    expect(retry.status).toBe(200);
    expect(retry.body.id).toBe(correction.id);

    const old = await call(srv.baseUrl, 'GET', `/api/readings/${original.id}`);
    expect(old.body.reading).toMatchObject({ id: original.id, value: 4.5, supersededById: correction.id });
    expect(old.body.history.map((h: { id: string }) => h.id)).toEqual([original.id, correction.id]);
    const current = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[2]}/readings`);
    const currentIds = current.body.readings.map((x: { id: string }) => x.id);
    expect(currentIds).toContain(correction.id);
    expect(currentIds).not.toContain(original.id);
    const all = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[2]}/readings?history=1`);
    expect(all.body.readings.map((x: { id: string }) => x.id)).toEqual(expect.arrayContaining([original.id, correction.id]));

    const twice = await call(srv.baseUrl, 'POST', `/api/readings/${original.id}/corrections`, { ...correction, id: newId() });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toContain(`already corrected by ${correction.id}`);
  });

  it('tombstones a reading: gone from lists, kept with history=1, 409 when deleted again or corrected', async () => {
    const input = readingInput(roundId, ids.spotIds[2]!, ids.meterId, { takenAt: '2026-03-02T08:30:00Z' });
    await post(input);
    const r = await call(srv.baseUrl, 'POST', `/api/readings/${input.id}/tombstone`, { reason: 'wrong spot' });
    expect(r.status).toBe(200);
    expect(r.body.deleted).toEqual({ reason: 'wrong spot', at: expect.any(String) });
    const again = await call(srv.baseUrl, 'POST', `/api/readings/${input.id}/tombstone`, { reason: 'again' });
    expect(again.status).toBe(409);
    expect(again.body.error).toEqual({ code: 'conflict', message: 'this reading is already deleted' });
    const corr = await call(srv.baseUrl, 'POST', `/api/readings/${input.id}/corrections`, { ...input, id: newId(), reason: 'x' });
    expect(corr.status).toBe(409);
    const current = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[2]}/readings`);
    expect(current.body.readings.map((x: { id: string }) => x.id)).not.toContain(input.id);
    const all = await call(srv.baseUrl, 'GET', `/api/spots/${ids.spotIds[2]}/readings?history=1`);
    expect(all.body.readings.find((x: { id: string }) => x.id === input.id).deleted.reason).toBe('wrong spot');
  });

  it('answers 404 for corrections and tombstones of unknown readings', async () => {
    const unknown = newId();
    const r = await call(srv.baseUrl, 'POST', `/api/readings/${unknown}/tombstone`, { reason: 'x' });
    expect(r.status).toBe(404);
    expect(r.body.error.fields).toEqual([{ path: 'id', message: `no reading with id ${unknown}` }]);
    expect((await call(srv.baseUrl, 'GET', `/api/readings/${unknown}`)).status).toBe(404);
  });
});

describe('rounds', () => {
  it('is idempotent by id: 201, then 200 for an identical retry, 409 for other content', async () => {
    const id = newId();
    const body = { id, siteId: ids.siteId, surveyor: 'A. Surveyor', startedAt: '2026-03-03T08:00:00Z', rhPercent: 30 };
    const first = await call(srv.baseUrl, 'POST', '/api/rounds', body);
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ id, endedAt: null, rhPercent: 30, startedAt: '2026-03-03T08:00:00.000Z' });
    const retry = await call(srv.baseUrl, 'POST', '/api/rounds', body);
    expect(retry.status).toBe(200);
    expect(retry.body).toEqual(first.body);
    const clash = await call(srv.baseUrl, 'POST', '/api/rounds', { ...body, surveyor: 'Someone else' });
    expect(clash.status).toBe(409);
    const list = await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/rounds`);
    expect(list.body.rounds[0].id).toBe(id); // newest first
  });

  it('summarizes a round: readings, spots measured, warnings, alarms, skipped with reasons, not measured', async () => {
    const [a, b, c] = ids.spotIds as [string, string, string];
    const spotX = (await call(srv.baseUrl, 'POST', '/api/spots', { areaId: ids.areaId, name: 'X', code: 'X-1', objectKind: 'tool', defaultDistance: { value: 1, unit: 'inch' } })).body.id;
    const rid = await createRound(srv.baseUrl, ids.siteId, { plannedSpotIds: [a, b, c, spotX] });
    const r1 = readingInput(rid, a, ids.meterId, { value: 1000 }); // ok
    const r2 = readingInput(rid, a, ids.meterId, { value: 3000 }); // warn
    const r3 = readingInput(rid, b, ids.meterId, { value: 6000 }); // alarm
    const r4 = readingInput(rid, b, ids.meterId, { value: 9000 }); // alarm, then deleted
    await post({ readings: [r1, r2, r3, r4] });
    await call(srv.baseUrl, 'POST', `/api/readings/${r4.id}/tombstone`, { reason: 'duplicate entry' });
    // the warning is corrected down to ok: counts follow the current revision
    await call(srv.baseUrl, 'POST', `/api/readings/${r2.id}/corrections`, { ...r2, id: newId(), value: 300, reason: 'unit was V/m x10' });
    const skip = { id: newId(), roundId: rid, spotId: c, reason: 'line stopped', at: '2026-03-02T08:30:00Z' };
    const s1 = await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/skips`, skip);
    expect(s1.status).toBe(201);
    expect((await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/skips`, skip)).status).toBe(200);
    expect((await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/skips`, { ...skip, reason: 'other' })).status).toBe(409);

    const sum = await call(srv.baseUrl, 'GET', `/api/rounds/${rid}`);
    expect(sum.status).toBe(200);
    expect(sum.body).toMatchObject({
      readings: 3, spotsMeasured: 2, planned: 4, warnings: 0, alarms: 1,
      skipped: [{ id: skip.id, roundId: rid, spotId: c, reason: 'line stopped', at: '2026-03-02T08:30:00.000Z' }],
      notMeasured: [spotX],
    });

    const fin = await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/finish`, { endedAt: '2026-03-02T09:00:00Z', notes: 'done' });
    expect(fin.status).toBe(200);
    expect(fin.body.round).toMatchObject({ endedAt: '2026-03-02T09:00:00.000Z', notes: 'done' });
    expect((await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/finish`, { endedAt: '2026-03-02T09:00:00Z' })).status).toBe(200);
    expect((await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/finish`, { endedAt: '2026-03-02T10:00:00Z' })).status).toBe(409);
    const early = await call(srv.baseUrl, 'POST', `/api/rounds/${await createRound(srv.baseUrl, ids.siteId)}/finish`, { endedAt: '2026-03-01T00:00:00Z' });
    expect(early.status).toBe(400);
    expect(early.body.error.fields).toEqual([{ path: 'endedAt', message: 'the end of a round must not be before its start' }]);
  });

  it('refuses a skip whose round id differs from the path, and unknown planned spots', async () => {
    const rid = await createRound(srv.baseUrl, ids.siteId);
    const r = await call(srv.baseUrl, 'POST', `/api/rounds/${rid}/skips`, { id: newId(), roundId: newId(), spotId: ids.spotIds[0], reason: 'x', at: '2026-03-02T08:30:00Z' });
    expect(r.status).toBe(400);
    expect(r.body.error.fields[0].path).toBe('roundId');
    const unknown = newId();
    const p = await call(srv.baseUrl, 'POST', '/api/rounds', { id: newId(), siteId: ids.siteId, surveyor: 'A', startedAt: '2026-03-02T08:00:00Z', plannedSpotIds: [ids.spotIds[0], unknown] });
    expect(p.status).toBe(404);
    expect(p.body.error.fields).toEqual([{ path: 'plannedSpotIds.1', message: `no spot with id ${unknown}` }]);
  });
});
});
