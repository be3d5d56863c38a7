/**
 * Set-up made over the real API for browser tests: one site, one limit set with
 * a field rule (warn 5 kV/m, alarm 10 kV/m), two areas, `spotCount` spots and a
 * meter (field mode, default unit kV/m). Returns the ids.
 */
export interface Fixture {
  siteId: string;
  limitSetId: string;
  areaIds: string[];
  spotIds: string[];
  meterId: string;
}

export async function call<T>(base: string, method: string, path: string, body?: unknown): Promise<T> {
  const res = await fetch(base + path, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${text}`);
  return (text ? JSON.parse(text) : null) as T;
}

export async function makeFixture(base: string, opts: { spotCount?: number; spotNames?: string[]; siteName?: string; calibrationDue?: string } = {}): Promise<Fixture> {
  const site = await call<{ id: string }>(base, 'POST', '/api/sites', { name: opts.siteName ?? 'Test plant Northfield', timeZone: 'Europe/Berlin' });
  const ls = await call<{ id: string }>(base, 'POST', '/api/limit-sets', {
    siteId: site.id, name: 'Test EPA field limits',
    rules: [{ metric: 'fieldVPerM', warn: 5000, alarm: 10000, source: 'test fixture' }],
  });
  const a1 = await call<{ id: string }>(base, 'POST', '/api/areas', { siteId: site.id, name: 'Assembly EPA', kind: 'epa', limitSetId: ls.id });
  const a2 = await call<{ id: string }>(base, 'POST', '/api/areas', { siteId: site.id, name: 'Winding hall', kind: 'hazardous', zone: 1, gasGroup: 'IIA', limitSetId: ls.id });
  const n = opts.spotCount ?? 4;
  const spotIds: string[] = [];
  for (let i = 0; i < n; i++) {
    const s = await call<{ id: string }>(base, 'POST', '/api/spots', {
      areaId: i < Math.ceil(n / 2) ? a1.id : a2.id,
      name: opts.spotNames?.[i] ?? `Spot ${String(i + 1).padStart(2, '0')}`,
      code: `T${String(i + 1).padStart(2, '0')}`,
      objectKind: i % 2 ? 'roll' : 'workstation',
      defaultDistance: { value: 10, unit: 'cm' },
      routePosition: i,
    });
    spotIds.push(s.id);
  }
  const meter = await call<{ id: string }>(base, 'POST', '/api/meters', {
    siteId: site.id, serial: 'FM-0001', label: 'Meter A', modes: ['field', 'surface-voltage'], calibratedDistanceM: 0.0254,
    calibrationDue: opts.calibrationDue ?? '2099-12-31', defaultUnit: 'kV/m',
  });
  return { siteId: site.id, limitSetId: ls.id, areaIds: [a1.id, a2.id], spotIds, meterId: meter.id };
}
