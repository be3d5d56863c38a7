// Floor plans, spot positions, pins, labels and look-up by code over real HTTP:
// PNG and JPEG stored as sent, SVG sanitized (what was removed is reported), other
// types 415, oversized 413, the served plan carries its own CSP; positions as
// fractions; pins with a status in words; QR labels; codes in any letter case.
import { deflateSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { MAX_PLAN_IMAGE_BYTES } from '../../core/plan';
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

/** A real w x h grey PNG (PNG spec: signature, IHDR, IDAT with zlib data, IEND; CRC-32 per chunk). */
function png(w: number, h: number): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (b: Buffer) => {
    let c = 0xffffffff;
    for (const x of b) c = crcTable[(c ^ x) & 0xff]! ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const td = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const c = Buffer.alloc(4);
    c.writeUInt32BE(crc(td));
    return Buffer.concat([len, td, c]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(w, 0);
  ihdr.writeUInt32BE(h, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  const raw = Buffer.alloc((w + 1) * h, 0x80);
  for (let y = 0; y < h; y++) raw[y * (w + 1)] = 0; // filter type 0 per row
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

/** The markers of a baseline JPEG header (ITU-T T.81): SOI, APP0 (JFIF), SOF0 with the size, EOI. Enough for sniffing and sizing. */
function jpeg(w: number, h: number): Buffer {
  const app0 = Buffer.from([0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]);
  const sof = Buffer.from([0xff, 0xc0, 0x00, 0x11, 0x08, h >> 8, h & 0xff, w >> 8, w & 0xff, 0x03, 0x01, 0x22, 0x00, 0x02, 0x11, 0x01, 0x03, 0x11, 0x01]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof, Buffer.from([0xff, 0xd9])]);
}

async function putPlan(body: Buffer | string, contentType?: string, areaId = ids.areaId) {
  return call(srv.baseUrl, 'PUT', `/api/areas/${areaId}/plan`, undefined, { raw: body, contentType });
}

describe('floor plan upload', () => {
  it('stores a PNG as sent, with its size, and serves it with the plan CSP', async () => {
    const image = png(40, 30);
    const r = await putPlan(image, 'image/png');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({
      areaId: ids.areaId, contentType: 'image/png', bytes: image.length, width: 40, height: 30, sha256: expect.stringMatching(/^[0-9a-f]{64}$/),
      uploadedAt: expect.any(String), removed: [],
    });
    const got = await fetch(`${srv.baseUrl}/api/areas/${ids.areaId}/plan`);
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(got.headers.get('content-security-policy')).toBe("default-src 'none'; style-src 'unsafe-inline'; img-src data:");
    expect(got.headers.get('x-content-type-options')).toBe('nosniff');
    expect(Buffer.from(await got.arrayBuffer()).equals(image)).toBe(true);
  });

  it('stores a JPEG, replacing the PNG', async () => {
    const r = await putPlan(jpeg(1600, 900), 'image/jpeg');
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ contentType: 'image/jpeg', width: 1600, height: 900, removed: [] });
    expect((await fetch(`${srv.baseUrl}/api/areas/${ids.areaId}/plan`)).headers.get('content-type')).toBe('image/jpeg');
  });

  it('sanitizes an SVG: scripts, handlers and external references go, and the answer says what was removed', async () => {
    const svg = `<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="800" height="600" onload="alert(1)">
      <script>alert('x')</script><rect x="10" y="10" width="100" height="50" fill="#ccc"/>
      <image href="https://evil.example/track.png"/><a href="javascript:alert(2)"><text x="5" y="5">Hall C</text></a></svg>`;
    const r = await putPlan(svg, 'image/svg+xml; charset=utf-8');
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ contentType: 'image/svg+xml', width: 800, height: 600 });
    expect(r.body.removed.length).toBeGreaterThanOrEqual(3);
    expect(r.body.removed.join(' ')).toMatch(/script/);
    const got = await fetch(`${srv.baseUrl}/api/areas/${ids.areaId}/plan`);
    expect(got.headers.get('content-type')).toBe('image/svg+xml');
    expect(got.headers.get('content-security-policy')).toBe("default-src 'none'; style-src 'unsafe-inline'; img-src data:");
    const text = await got.text();
    expect(text).toContain('<rect');
    expect(text).not.toMatch(/script|onload|evil\.example|javascript:/i);
  });

  it('refuses other types, mismatches and oversized files with 415 and 413 naming the field plan, and changes nothing', async () => {
    const before = dbFingerprint(srv.dbPath);
    const gif = Buffer.from('GIF89a\x01\x00\x01\x00\x80\x00\x00\xff\xff\xff\x00\x00\x00!\xf9\x04\x00\x00\x00\x00\x00,\x00\x00\x00\x00\x01\x00\x01\x00\x00\x02\x02D\x01\x00;', 'latin1');
    const r1 = await putPlan(gif, 'image/gif');
    expect(r1.status).toBe(415);
    expect(r1.body.error).toEqual({
      code: 'unsupported-media-type', message: 'the plan image must be one of image/png, image/jpeg, image/svg+xml; got image/gif',
      fields: [{ path: 'plan', message: 'must be image/png, image/jpeg, image/svg+xml' }],
    });
    const r2 = await putPlan(gif, 'image/png');
    expect(r2.status).toBe(415);
    expect(r2.body.error.message).toBe('the plan is not a PNG, JPEG or SVG image (its bytes are none of these), although it was sent as image/png');
    const r3 = await putPlan(png(2, 2), 'image/jpeg');
    expect(r3.status).toBe(415);
    expect(r3.body.error.message).toBe('the plan is a PNG image but was sent as image/jpeg: send it with Content-Type image/png');
    expect((await putPlan(png(2, 2))).status).toBe(415); // no Content-Type
    const big = Buffer.concat([png(2, 2), Buffer.alloc(MAX_PLAN_IMAGE_BYTES)]);
    const r4 = await putPlan(big, 'image/png');
    expect(r4.status).toBe(413);
    expect(r4.body.error).toMatchObject({ code: 'too-large', fields: [{ path: 'plan', message: 'must be at most 5 MB' }] });
    expect(r4.body.error.message).toMatch(/^the plan image is too large \(5 MB\): the largest accepted is 5 MB$/);
    const doctype = await putPlan('<!DOCTYPE svg [<!ENTITY x "y">]><svg xmlns="http://www.w3.org/2000/svg"/>', 'image/svg+xml');
    expect(doctype.status).toBe(400);
    expect(doctype.body.error.fields[0].path).toBe('plan');
    expect((await putPlan(Buffer.alloc(0), 'image/png')).status).toBe(400);
    expect((await putPlan(png(2, 2), 'image/png', newId())).status).toBe(404);
    expect(dbFingerprint(srv.dbPath)).toEqual(before);
  });

  it('deletes a plan; the spot positions stay', async () => {
    expect((await putPlan(png(10, 10), 'image/png')).status).toBe(200);
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${ids.spotIds[0]}/position`, { x: 0.5, y: 0.5 })).status).toBe(200);
    expect((await call(srv.baseUrl, 'DELETE', `/api/areas/${ids.areaId}/plan`)).body).toEqual({ areaId: ids.areaId, deleted: true });
    expect((await call(srv.baseUrl, 'DELETE', `/api/areas/${ids.areaId}/plan`)).body).toEqual({ areaId: ids.areaId, deleted: false });
    const gone = await call(srv.baseUrl, 'GET', `/api/areas/${ids.areaId}/plan`);
    expect(gone.status).toBe(404);
    expect(gone.body.error.message).toBe('this area has no floor plan yet: upload one with PUT');
    const pins = (await call(srv.baseUrl, 'GET', `/api/areas/${ids.areaId}/pins`)).body;
    expect(pins.plan).toBeNull();
    expect(pins.pins[0].position).toEqual({ x: 0.5, y: 0.5 });
  });
});

describe('positions and pins', () => {
  it('places, moves and unplaces spots; pins carry the latest verdict in words', async () => {
    expect((await putPlan(png(100, 50), 'image/png')).status).toBe(200);
    const [a, b, c] = ids.spotIds as [string, string, string];
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${a}/position`, { x: 0.25, y: 0.75 })).body).toEqual({ spotId: a, areaId: ids.areaId, position: { x: 0.25, y: 0.75 } });
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${a}/position`, { x: 0.3, y: 0.7 })).body.position).toEqual({ x: 0.3, y: 0.7 });
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${b}/position`, { x: 1, y: 0 })).status).toBe(200);
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${b}/position`, { x: null, y: null })).body.position).toBeNull();
    const bad = await call(srv.baseUrl, 'PUT', `/api/spots/${c}/position`, { x: 1.5, y: 0.2 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual([{ path: 'x', message: 'x must be between 0 and 1 (a fraction of the plan)' }]);
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${c}/position`, { x: 0.5, y: null })).body.error.fields[0].path).toBe('y');
    expect((await call(srv.baseUrl, 'PUT', `/api/spots/${newId()}/position`, { x: 0.5, y: 0.5 })).status).toBe(404);

    const roundId = await createRound(srv.baseUrl, ids.siteId);
    const acks = await call(srv.baseUrl, 'POST', '/api/readings', { readings: [
      readingInput(roundId, a, ids.meterId, { value: 6000, takenAt: '2026-03-02T08:05:00Z' }),
      readingInput(roundId, a, ids.meterId, { value: 100, takenAt: '2026-03-02T08:06:00Z' }),
      readingInput(roundId, b, ids.meterId, { value: 3000 }),
    ] });
    expect(acks.status).toBe(200);
    const pins = (await call(srv.baseUrl, 'GET', `/api/areas/${ids.areaId}/pins`)).body;
    expect(pins.plan).toMatchObject({ contentType: 'image/png', width: 100, height: 50 });
    expect(pins.pins.map((p: { code: string }) => p.code)).toEqual(['W-1', 'W-2', 'W-3']);
    expect(pins.pins[0]).toMatchObject({ position: { x: 0.3, y: 0.7 }, label: 'OK', text: 'W-1 · OK · 100 V/m', latest: { level: 'ok', fieldVPerM: 100 } });
    expect(pins.pins[1]).toMatchObject({ position: null, label: 'Warn', text: 'W-2 · Warn · 3.00 kV/m' });
    expect(pins.pins[2]).toMatchObject({ position: null, label: 'No reading', text: 'W-3 · No reading', latest: null });
    expect((await call(srv.baseUrl, 'GET', `/api/areas/${newId()}/pins`)).status).toBe(404);
  });
});

describe('labels and codes', () => {
  it('gives one QR label per active spot that opens it in the round, and finds a spot by its code in any case', async () => {
    const r = await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/labels?base=https://cw.plant.example/`);
    expect(r.status).toBe(200);
    expect(r.body.labels).toHaveLength(3);
    expect(r.body.labels[0]).toMatchObject({
      spotId: ids.spotIds[0], code: 'W-1', name: 'Workstation 1', areaName: 'EPA 1', path: '/#/scan/W-1', url: 'https://cw.plant.example/#/scan/W-1',
    });
    expect(r.body.labels[0].qrSvg).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"[^>]*viewBox="0 0 \d+ \d+"/);
    const own = await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/labels`);
    expect(own.body.labels[0].url).toBe(`${srv.baseUrl}/#/scan/W-1`);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${ids.siteId}/labels?base=javascript:alert(1)`)).status).toBe(400);

    const found = await call(srv.baseUrl, 'GET', `/api/spots/by-code/w-2?siteId=${ids.siteId}`);
    expect(found.status).toBe(200);
    expect(found.body).toMatchObject({ id: ids.spotIds[1], code: 'W-2' });
    const missing = await call(srv.baseUrl, 'GET', `/api/spots/by-code/NOPE?siteId=${ids.siteId}`);
    expect(missing.status).toBe(404);
    expect(missing.body.error).toEqual({ code: 'not-found', message: 'no spot with the code NOPE at this site', fields: [{ path: 'code', message: 'no spot with this code' }] });
    expect((await call(srv.baseUrl, 'GET', '/api/spots/by-code/W-1')).body.error.fields).toEqual([{ path: 'siteId', message: 'must be a UUID' }]);
  });
});
