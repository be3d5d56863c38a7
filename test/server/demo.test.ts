// The invented demo site, loaded through the real store and read over HTTP:
// enough spots, areas of different kinds, 12+ weeks of rounds, warnings and
// alarms, varying humidity, the trending spot and the fixed one.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_WEEKS } from '../../server/demo';
import { call } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

interface R { id: string; spotId: string; takenAt: string; fieldVPerM: number; rhPercent: number | null; verdict: { level: string }; meterCalibrationOverdue: boolean }

let srv: TestServer;
let setup: { site: { id: string; timeZone: string }; areas: { id: string; kind: string; zone: number | null }[]; spots: { id: string; code: string; areaId: string; objectKind: string }[]; meters: unknown[]; limitSets: { rules: { source: string }[] }[] };
let rounds: { id: string; startedAt: string; rhPercent: number | null }[];
let readings: R[];

beforeAll(async () => {
  srv = await startTestServer({ demo: true });
  const sites = (await call(srv.baseUrl, 'GET', '/api/sites')).body.sites;
  expect(sites).toHaveLength(1);
  setup = (await call(srv.baseUrl, 'GET', `/api/sites/${sites[0].id}/setup`)).body;
  rounds = (await call(srv.baseUrl, 'GET', `/api/sites/${sites[0].id}/rounds`)).body.rounds;
  readings = [];
  for (const r of rounds) readings.push(...(await call(srv.baseUrl, 'GET', `/api/rounds/${r.id}/readings`)).body.readings);
});
afterAll(async () => {
  await srv.close();
});

const weekOf = (iso: string) => Math.floor((Date.parse(iso) / 86_400_000 + 3) / 7); // weeks since the epoch, Monday-based

describe('demo site', () => {
  it('has at least 20 spots in 3 areas of different kinds, with limit sets whose rules name their sources', () => {
    expect(setup.spots.length).toBeGreaterThanOrEqual(20);
    expect(new Set(setup.areas.map((a) => a.kind))).toEqual(new Set(['epa', 'hazardous', 'general']));
    expect(setup.areas.some((a) => a.kind === 'hazardous' && a.zone === 1)).toBe(true);
    expect(setup.areas.some((a) => a.kind === 'hazardous' && a.zone === 22)).toBe(true);
    for (const area of setup.areas) expect(setup.spots.filter((s) => s.areaId === area.id).length).toBeGreaterThanOrEqual(2);
    expect(new Set(setup.spots.map((s) => s.objectKind)).size).toBeGreaterThanOrEqual(8);
    expect(setup.meters).toHaveLength(3);
    for (const ls of setup.limitSets) for (const rule of ls.rules) expect(rule.source.length).toBeGreaterThan(5);
    expect(setup.site.timeZone).toBe('Europe/Berlin');
  });

  it('has at least 12 weeks of rounds up to now, two a week', () => {
    const weeks = new Set(rounds.map((r) => weekOf(r.startedAt)));
    expect(weeks.size).toBeGreaterThanOrEqual(12);
    expect(weeks.size).toBeLessThanOrEqual(DEMO_WEEKS);
    expect(rounds.length).toBeGreaterThanOrEqual(24);
    expect(Date.parse(rounds[0]!.startedAt)).toBeLessThan(Date.now());
    expect(Date.now() - Date.parse(rounds[0]!.startedAt)).toBeLessThan(8 * 86_400_000);
  });

  it('has realistic readings with some warnings and alarms, and humidity that varies', () => {
    expect(readings.length).toBeGreaterThan(500);
    const levels = readings.map((r) => r.verdict.level);
    expect(levels.filter((l) => l === 'warn').length).toBeGreaterThan(5);
    expect(levels.filter((l) => l === 'alarm').length).toBeGreaterThan(3);
    expect(levels.filter((l) => l === 'ok').length).toBeGreaterThan(readings.length / 2);
    const rh = rounds.map((r) => r.rhPercent!);
    expect(Math.min(...rh)).toBeLessThan(36);
    expect(Math.max(...rh)).toBeGreaterThan(44);
    expect(readings.some((r) => r.meterCalibrationOverdue)).toBe(true);
    // EPA fields are tens to hundreds of V/m; the film hall's kV/m
    const area = (code: string) => setup.spots.filter((s) => s.code.startsWith(code)).map((s) => s.id);
    const median = (ids: string[]) => {
      const v = readings.filter((r) => ids.includes(r.spotId)).map((r) => Math.abs(r.fieldVPerM)).sort((a, b) => a - b);
      return v[Math.floor(v.length / 2)]!;
    };
    expect(median(area('E-'))).toBeGreaterThan(20);
    expect(median(area('E-'))).toBeLessThan(1000);
    expect(median(area('C-'))).toBeGreaterThan(5e3);
    expect(median(area('C-'))).toBeLessThan(200e3);
  });

  it('tells its stories: a spot trending up, a spot fixed in week 9, corrections and a deletion', async () => {
    const byCode = (code: string) => {
      const id = setup.spots.find((s) => s.code === code)!.id;
      return readings.filter((r) => r.spotId === id).sort((a, b) => a.takenAt.localeCompare(b.takenAt)).map((r) => Math.abs(r.fieldVPerM));
    };
    const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
    const trend = byCode('C-04');
    expect(mean(trend.slice(-6))).toBeGreaterThan(1.8 * mean(trend.slice(0, 6)));
    const fixed = byCode('C-05');
    expect(mean(fixed.slice(-6))).toBeLessThan(0.4 * mean(fixed.slice(0, 6)));
    const history = (await call(srv.baseUrl, 'GET', `/api/spots/${setup.spots.find((s) => s.code === 'C-02')!.id}/readings?history=1&limit=1000`)).body.readings;
    expect(history.filter((r: { supersedesId: string | null }) => r.supersedesId !== null).length).toBeGreaterThanOrEqual(1);
    const e02 = (await call(srv.baseUrl, 'GET', `/api/spots/${setup.spots.find((s) => s.code === 'E-02')!.id}/readings?history=1&limit=1000`)).body.readings;
    expect(e02.filter((r: { deleted: unknown }) => r.deleted !== null)).toHaveLength(1);
  });
  it('has an invented floor plan per area with every spot placed and labelled in words, so the plan screen shows pins at once', async () => {
    for (const area of setup.areas) {
      const pins = (await call(srv.baseUrl, 'GET', `/api/areas/${area.id}/pins`)).body;
      expect(pins.plan, area.id).not.toBeNull();
      expect(pins.plan.contentType).toBe('image/svg+xml');
      expect(pins.pins.length).toBeGreaterThanOrEqual(2);
      for (const p of pins.pins) {
        expect(p.position, p.code).not.toBeNull();
        expect(p.position.x).toBeGreaterThan(0);
        expect(p.position.x).toBeLessThan(1);
        expect(p.position.y).toBeGreaterThan(0);
        expect(p.position.y).toBeLessThan(1);
        expect(p.text).toMatch(new RegExp(`^${p.code} · (OK|Warn|Alarm|No reading)`));
      }
      const img = await fetch(`${srv.baseUrl}/api/areas/${area.id}/plan`);
      expect(img.status).toBe(200);
      const svg = await img.text();
      expect(svg).toMatch(/^<svg /);
      expect(svg).toContain('invented demo plan');
      expect(svg).not.toMatch(/<script|href=|on\w+=/i);
    }
  });
  it('reads its isolated conductors (drum, operator) in surface-voltage mode, so the spark-energy check against the MIE is made (W = C V^2 / 2, e.g. Griffiths, Introduction to Electrodynamics, ch. 2)', async () => {
    for (const code of ['C-06', 'C-09', 'P-03']) {
      const id = setup.spots.find((s) => s.code === code)!.id;
      const r = (await call(srv.baseUrl, 'GET', `/api/spots/${id}/readings?limit=1`)).body.readings[0];
      expect(r.unit, code).toBe('V');
      const spark = r.hazards.find((v: { check: string }) => v.check === 'spark-energy');
      expect(spark.level, code).not.toBe('not-applicable');
      expect(spark.compared.unit).toBe('J');
      // the energy compared is C V^2 / 2 of the estimate
      expect(spark.compared.value / r.estimate.energyJ).toBeCloseTo(1, 9);
      expect(r.estimate.energyJ / (0.5 * r.estimate.capacitanceF * r.estimate.potentialV ** 2)).toBeCloseTo(1, 9);
    }
  });
});
