/**
 * Small helpers for API tests: a JSON fetch that returns status and body, a
 * minimal set-up made through the API, reading inputs, and a fingerprint of
 * every table to prove a rejected request changed nothing.
 */
import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { newId } from '../../core/ids/uuidv7';

export interface ApiAnswer<T = any> { // eslint-disable-line @typescript-eslint/no-explicit-any
  status: number;
  body: T;
  headers: Headers;
}

/** Sends JSON (or a raw string / Buffer with its own content type) and parses the JSON answer. */
export async function call<T = any>( // eslint-disable-line @typescript-eslint/no-explicit-any
  baseUrl: string, method: string, path: string, body?: unknown,
  opts: { raw?: string | Buffer; contentType?: string } = {},
): Promise<ApiAnswer<T>> {
  const headers: Record<string, string> = { accept: 'application/json' };
  let payload: string | Buffer | undefined;
  if (opts.raw !== undefined) {
    payload = opts.raw;
    if (opts.contentType) headers['content-type'] = opts.contentType;
  } else if (body !== undefined) {
    payload = JSON.stringify(body);
    headers['content-type'] = opts.contentType ?? 'application/json';
  }
  const res = await fetch(`${baseUrl}${path}`, { method, headers, body: typeof payload === 'string' || payload === undefined ? payload : new Uint8Array(payload) });
  const text = await res.text();
  let parsed: unknown = text;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    // not JSON: keep the text
  }
  return { status: res.status, body: parsed as T, headers: res.headers };
}

export interface SetupIds {
  siteId: string;
  limitSetId: string;
  areaId: string;
  spotIds: string[];
  meterId: string;
  /** A meter without a calibrated distance (field mode only). */
  fieldOnlyMeterId: string;
}

/** A site with one EPA area (field warn 2500 V/m, alarm 4921 V/m), three spots and two meters. */
export async function createSetup(baseUrl: string): Promise<SetupIds> {
  const ok = (r: ApiAnswer, what: string) => {
    if (r.status !== 201) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.body)}`);
    return r.body as { id: string };
  };
  const site = ok(await call(baseUrl, 'POST', '/api/sites', { name: 'Test plant', timeZone: 'Europe/Berlin' }), 'site');
  const ls = ok(await call(baseUrl, 'POST', '/api/limit-sets', {
    siteId: site.id, name: 'EPA',
    rules: [{ metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'ANSI/ESD S20.20-2021 8.3.1 (125 V/inch)' }],
  }), 'limit set');
  const area = ok(await call(baseUrl, 'POST', '/api/areas', { siteId: site.id, name: 'EPA 1', kind: 'epa', limitSetId: ls.id }), 'area');
  const spotIds: string[] = [];
  for (const [i, code] of ['W-1', 'W-2', 'W-3'].entries()) {
    spotIds.push(ok(await call(baseUrl, 'POST', '/api/spots', {
      areaId: area.id, name: `Workstation ${i + 1}`, code, objectKind: 'workstation', defaultDistance: { value: 1, unit: 'inch' }, routePosition: i,
    }), 'spot').id);
  }
  const meter = ok(await call(baseUrl, 'POST', '/api/meters', {
    siteId: site.id, serial: 'M-1', modes: ['field', 'surface-voltage'], calibratedDistanceM: 0.0254, calibrationDue: '2099-12-31',
  }), 'meter');
  const fieldOnly = ok(await call(baseUrl, 'POST', '/api/meters', {
    siteId: site.id, serial: 'M-2', modes: ['field'], calibrationDue: '2099-12-31',
  }), 'meter 2');
  return { siteId: site.id, limitSetId: ls.id, areaId: area.id, spotIds, meterId: meter.id, fieldOnlyMeterId: fieldOnly.id };
}

export async function createRound(baseUrl: string, siteId: string, extra: Record<string, unknown> = {}): Promise<string> {
  const id = newId();
  const r = await call(baseUrl, 'POST', '/api/rounds', { id, siteId, surveyor: 'Test Surveyor', startedAt: '2026-03-02T08:00:00Z', ...extra });
  if (r.status !== 201) throw new Error(`round: ${r.status} ${JSON.stringify(r.body)}`);
  return id;
}

/** A valid reading input (1000 V/m at 1 inch unless overridden). */
export function readingInput(roundId: string, spotId: string, meterId: string, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    id: newId(), roundId, spotId, meterId, takenAt: '2026-03-02T08:05:00Z',
    value: 1000, unit: 'V/m', polarity: '+', distance: { value: 1, unit: 'inch' }, zeroed: true, ...extra,
  };
}

/** Row counts and a hash of every row of every table: equal fingerprints mean nothing changed. */
export function dbFingerprint(dbPath: string): { counts: Record<string, number>; hash: string } {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true });
  try {
    const tables = (db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name").all() as { name: string }[])
      .map((t) => t.name);
    const counts: Record<string, number> = {};
    const h = createHash('sha256');
    for (const t of tables) {
      const rows = db.prepare(`SELECT * FROM "${t}" ORDER BY rowid`).all();
      counts[t] = rows.length;
      h.update(t).update(JSON.stringify(rows));
    }
    return { counts, hash: h.digest('hex') };
  } finally {
    db.close();
  }
}
