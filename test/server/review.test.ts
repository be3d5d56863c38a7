// Issue 4 over real HTTP on the invented demo site: follow-ups (open, close by a
// verifying reading or a reason, 409s, history, reopen), the spot trend checked
// against core/stats directly, the weekly review (ranking, summary, spots due but
// not measured, CSV), and the review's fast verdicts checked against the Reading
// entity's own on every demo reading.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { parseCsv } from '../../core/csv';
import { CAUTION } from '../../core/hazard';
import { humidityRelation, median, trendSummary } from '../../core/stats';
import { weekStart, zonedDateTime } from '../../core/time';
import { ReadingJudge } from '../../server/review/judge';
import { call } from '../helpers/api';
import { startTestServer, testBackends, type TestServer } from '../helpers/server';

interface Spot { id: string; code: string; name: string; areaId: string; model: string | null }
interface Reading { id: string; spotId: string; takenAt: string; fieldVPerM: number; verdict: { level: string; reason: string; checks: { ratioToAlarm: number | null }[] }; estimate?: { chargeC: number | null; surfaceChargeDensityCPerM2?: number | null } | null }

// Runs on SQLite, and on PostgreSQL too when CHARGEWALK_TEST_PG_URL is set.
describe.each(testBackends())('on %s', (backend) => {
let srv: TestServer;
let siteId: string;
let tz: string;
let spots: Spot[];
let meters: { id: string; serial: string }[];
const spot = (code: string) => spots.find((s) => s.code === code)!;

beforeAll(async () => {
  srv = await startTestServer({ demo: true, store: backend });
  siteId = (await call(srv.baseUrl, 'GET', '/api/sites')).body.sites[0].id;
  const setup = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/setup`)).body;
  tz = setup.site.timeZone;
  spots = setup.spots;
  meters = setup.meters;
});
afterAll(async () => {
  await srv.close();
});

async function spotReadings(spotId: string): Promise<Reading[]> {
  const r = await call(srv.baseUrl, 'GET', `/api/spots/${spotId}/readings?limit=1000`);
  expect(r.status).toBe(200);
  return r.body.readings;
}

/** A new round now with one reading at the spot; answers the stored reading. */
async function readNow(spotId: string, value: number, unit = 'kV/m', extra: Record<string, unknown> = {}): Promise<Reading> {
  const roundId = newId();
  const now = new Date().toISOString();
  expect((await call(srv.baseUrl, 'POST', '/api/rounds', { id: roundId, siteId, surveyor: 'Test', startedAt: now, plannedSpotIds: [spotId] })).status).toBe(201);
  const hall = meters.find((m) => m.serial === 'QW-FM-0417')!;
  const r = await call(srv.baseUrl, 'POST', '/api/readings', {
    id: newId(), roundId, spotId, meterId: hall.id, takenAt: now, value, unit, polarity: '-', distance: { value: 10, unit: 'cm' }, zeroed: true, rhPercent: 45, ...extra,
  });
  expect(r.status).toBe(200);
  expect(r.body.acks[0].status).toBe('stored');
  return r.body.acks[0].reading;
}

describe('follow-ups', () => {
  it('the demo has the follow-up that fixed C-05, closed by its verifying reading, and an open one on the rising C-04', async () => {
    const all = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/follow-ups?status=all`)).body.followUps as { spotCode: string; status: string; closedByReadingId: string | null; openedFromReadingId: string | null; createdAt: string; closedAt: string | null }[];
    const c05 = all.find((f) => f.spotCode === 'C-05')!;
    expect(c05).toMatchObject({ status: 'closed', closedByReadingId: expect.any(String), openedFromReadingId: expect.any(String) });
    const verifying = (await call(srv.baseUrl, 'GET', `/api/readings/${c05.closedByReadingId}`)).body.reading;
    expect(verifying.verdict.level).toBe('ok');
    expect(verifying.takenAt > c05.createdAt).toBe(true);
    expect(all.find((f) => f.spotCode === 'C-04')).toMatchObject({ status: 'open' });
  });

  it('open from an alarm reading, refuse readings that do not verify, close by a verifying reading, keep the history, reopen, close by reason', async () => {
    const c05 = spot('C-05');
    const history = await spotReadings(c05.id);
    const alarm = history.find((r) => r.verdict.level === 'alarm')!;
    expect(alarm).toBeDefined();
    const opened = await call(srv.baseUrl, 'POST', '/api/follow-ups', {
      spotId: c05.id, openedFromReadingId: alarm.id, findingClass: 'major-nonconformance', action: 'Fit an ionising bar before the rewind',
      assignee: 'Maintenance', dueDate: '2099-01-31', by: 'Reviewer',
    });
    expect(opened.status).toBe(201);
    const f = opened.body;
    expect(f).toMatchObject({
      spotId: c05.id, spotCode: 'C-05', status: 'open', findingClass: 'major-nonconformance', openedBy: 'Reviewer', closedAt: null,
      closedByReadingId: null, closedReason: null, openedFromReadingId: alarm.id, dueDate: '2099-01-31',
    });
    expect(f.events.map((e: { kind: string }) => e.kind)).toEqual(['opened']);

    // it travels with the set-up bundle (the round screen offline) and shows on the spot and the site
    const setup = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/setup`)).body;
    expect(setup.followUps.map((x: { id: string }) => x.id)).toContain(f.id);
    expect((await call(srv.baseUrl, 'GET', `/api/spots/${c05.id}/follow-ups?status=open`)).body.followUps.map((x: { id: string }) => x.id)).toEqual([f.id]);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/follow-ups?status=open`)).body.followUps.map((x: { id: string }) => x.id)).toContain(f.id);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/follow-ups?status=closed`)).body.followUps.map((x: { id: string }) => x.id)).not.toContain(f.id);

    // an old reading (taken before the follow-up was opened) does not verify, even when it was within limits
    const oldOk = history.find((r) => r.verdict.level === 'ok')!;
    const early = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: oldOk.id });
    expect(early.status).toBe(409);
    expect(early.body.error).toMatchObject({ code: 'conflict', fields: [{ path: 'verifyingReadingId', message: expect.stringContaining('before the follow-up was opened') }] });

    // a new reading over the limits does not verify
    const high = await readNow(c05.id, 400);
    expect(high.verdict.level).toBe('alarm');
    const over = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: high.id });
    expect(over.status).toBe(409);
    expect(over.body.error.message).toMatch(/^the verifying reading is not within limits \(alarm: .+\); the follow-up stays open$/);

    // a reading of another spot does not verify
    const other = await readNow(spot('C-01').id, 1);
    expect((await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: other.id })).body.error.message)
      .toContain('taken at another spot, not at C-05');

    // neither both nor neither; an unknown reading is a 404 naming the field
    const both = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: other.id, reason: 'x' });
    expect(both.status).toBe(400);
    expect(both.body.error.fields[0].message).toBe('close with either a verifying reading (verifyingReadingId) or a written reason, not both and not neither');
    const unknown = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: newId() });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.fields[0].path).toBe('verifyingReadingId');

    // a reading within limits closes it, linked
    const good = await readNow(c05.id, 2);
    expect(good.verdict.level).toBe('ok');
    const closed = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { verifyingReadingId: good.id, by: 'Surveyor' });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed', closedByReadingId: good.id, closedReason: null, closedBy: 'Surveyor' });
    expect(closed.body.events.at(-1)).toMatchObject({ kind: 'closed', by: 'Surveyor', readingId: good.id, detail: { verdict: { level: 'ok' } } });
    expect((await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { reason: 'again' })).status).toBe(409);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/setup`)).body.followUps.map((x: { id: string }) => x.id)).not.toContain(f.id);

    // edit, reopen, close by a written reason: the whole history stays
    expect((await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/reopen`, { reason: 'field back up after a week', by: 'Reviewer' })).body)
      .toMatchObject({ status: 'open', closedAt: null, closedByReadingId: null });
    const edited = await call(srv.baseUrl, 'PUT', `/api/follow-ups/${f.id}`, { assignee: 'Contractor', by: 'Reviewer' });
    expect(edited.body.events.at(-1)).toMatchObject({ kind: 'edited', detail: { assignee: { from: 'Maintenance', to: 'Contractor' } } });
    const byReason = await call(srv.baseUrl, 'POST', `/api/follow-ups/${f.id}/close`, { reason: 'Rewind line taken out of service' });
    expect(byReason.body).toMatchObject({ status: 'closed', closedReason: 'Rewind line taken out of service', closedByReadingId: null });
    const got = await call(srv.baseUrl, 'GET', `/api/follow-ups/${f.id}`);
    expect(got.body.events.map((e: { kind: string }) => e.kind)).toEqual(['opened', 'closed', 'reopened', 'edited', 'closed']);
    expect(got.body.events[2]).toMatchObject({ reason: 'field back up after a week', detail: { closedByReadingId: good.id } });
  });

  it('answers plain 400s and 404s for bad input', async () => {
    const bad = await call(srv.baseUrl, 'POST', '/api/follow-ups', { spotId: spot('C-01').id, findingClass: 'severe', action: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual(expect.arrayContaining([
      { path: 'findingClass', message: 'finding class must be observation, minor-nonconformance or major-nonconformance' },
      { path: 'action', message: 'action is required' },
    ]));
    const other = (await spotReadings(spot('C-01').id))[0]!;
    const wrongReading = await call(srv.baseUrl, 'POST', '/api/follow-ups', { spotId: spot('C-02').id, findingClass: 'observation', action: 'x', openedFromReadingId: other.id });
    expect(wrongReading.status).toBe(400);
    expect((await call(srv.baseUrl, 'GET', `/api/follow-ups/${newId()}`)).status).toBe(404);
    expect((await call(srv.baseUrl, 'POST', `/api/follow-ups/${newId()}/reopen`, { reason: 'x' })).status).toBe(404);
    expect((await call(srv.baseUrl, 'GET', `/api/spots/${spot('C-01').id}/follow-ups?status=maybe`)).status).toBe(400);
  });
});

describe('spot trend', () => {
  it('gives every current reading as a point, the field bands, and statistics equal to core/stats on daily medians', async () => {
    const c04 = spot('C-04');
    const r = await call(srv.baseUrl, 'GET', `/api/spots/${c04.id}/trend?range=all`);
    expect(r.status).toBe(200);
    const t = r.body;
    const entity = (await spotReadings(c04.id)).sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.id.localeCompare(b.id));
    expect(t.points.map((p: { readingId: string }) => p.readingId)).toEqual(entity.map((e) => e.id));
    t.points.forEach((p: { fieldVPerM: number; level: string }, i: number) => {
      expect(p.fieldVPerM).toBe(entity[i]!.fieldVPerM);
      expect(p.level).toBe(entity[i]!.verdict.level);
    });
    expect(t.bands).toEqual({ warnVPerM: 100e3, alarmVPerM: 300e3, source: expect.stringContaining('screening level') });
    expect(t.counts.readings).toBe(entity.length);

    // Independently: one point per local day (core/time), median time and median |field|, then core/stats.
    const days = new Map<string, { ts: number[]; vs: number[] }>();
    for (const p of t.points as { takenAt: string; fieldVPerM: number }[]) {
      const z = zonedDateTime(Date.parse(p.takenAt), tz);
      const key = `${z.year}-${z.month}-${z.day}`;
      const g = days.get(key) ?? { ts: [], vs: [] };
      g.ts.push(Date.parse(p.takenAt));
      g.vs.push(Math.abs(p.fieldVPerM));
      days.set(key, g);
    }
    const expected = trendSummary([...days.values()].map((g) => ({ t: median(g.ts), v: median(g.vs) })));
    expect(expected.status).toBe('ok');
    if (expected.status !== 'ok') return;
    expect(t.trendSummary).toMatchObject({
      status: 'ok', n: expected.n, slopeVPerMPerWeek: expected.slopePerWeek, pValue: expected.pValue, direction: expected.direction,
      slopeLowerVPerMPerWeek: expected.slopeLowerPerWeek, slopeUpperVPerMPerWeek: expected.slopeUpperPerWeek, tau: expected.tau,
    });
    expect(t.counts.days).toBe(days.size);
    const h = humidityRelation((t.points as { rhPercent: number | null; fieldVPerM: number }[]).filter((p) => p.rhPercent !== null)
      .map((p) => ({ rh: p.rhPercent!, fieldVPerM: p.fieldVPerM })));
    expect(h.status).toBe('ok');
    if (h.status !== 'ok') return;
    expect(t.humidity).toMatchObject({ status: 'ok', n: h.n, slopeLog10PerRhPoint: h.slopeLog10PerRhPoint, pValue: h.pValue, sentence: h.sentence });
    // the demo's story: C-04 rises week by week and dry air does not explain it (the web leaves a hot dryer) ...
    expect(t.trendSummary.direction).toBe('increasing');
    expect(t.humidity.significant).toBe(false);
    // ... while at the other hall spots the dry weeks raise the field: their humidity relation is clear
    const c01 = (await call(srv.baseUrl, 'GET', `/api/spots/${spot('C-01').id}/trend?range=all`)).body;
    expect(c01.humidity.significant).toBe(true);
    expect(c01.humidity.slopeLog10PerRhPoint).toBeLessThan(0);
  });

  it('gives the charge estimate of each point where the spot has a model, and says not-enough-data plainly', async () => {
    const c01 = spot('C-01'); // line model
    const t = (await call(srv.baseUrl, 'GET', `/api/spots/${c01.id}/trend?range=13w`)).body;
    const entity = new Map((await spotReadings(c01.id)).map((e) => [e.id, e]));
    expect(t.points.length).toBeGreaterThan(10);
    for (const p of t.points as { readingId: string; chargeC: number }[]) {
      const e = entity.get(p.readingId)!;
      expect(p.chargeC).toBeCloseTo(e.estimate!.chargeC!, 20);
      expect(Math.abs(p.chargeC / e.estimate!.chargeC! - 1)).toBeLessThan(1e-9);
    }
    expect(t.counts.withCharge).toBe(t.points.length);
    // a web (sheet model) defines no charge, only a surface charge density: the trend carries that one
    const c04 = spot('C-04');
    const web = (await call(srv.baseUrl, 'GET', `/api/spots/${c04.id}/trend?range=13w`)).body;
    const webEntity = new Map((await spotReadings(c04.id)).map((e) => [e.id, e]));
    expect(web.points.length).toBeGreaterThan(10);
    for (const p of web.points as { readingId: string; chargeC: number | null; surfaceChargeDensityCPerM2: number }[]) {
      expect(p.chargeC).toBeNull();
      expect(Math.abs(p.surfaceChargeDensityCPerM2 / webEntity.get(p.readingId)!.estimate!.surfaceChargeDensityCPerM2! - 1)).toBeLessThan(1e-9);
    }
    const e01 = (await call(srv.baseUrl, 'GET', `/api/spots/${spot('E-01').id}/trend?range=4w`)).body;
    expect(e01.points.every((p: { chargeC: null; surfaceChargeDensityCPerM2: null }) => p.chargeC === null && p.surfaceChargeDensityCPerM2 === null)).toBe(true);
    // a fresh spot with no readings
    const fresh = await call(srv.baseUrl, 'POST', '/api/spots', { areaId: c01.areaId, name: 'New roll', code: 'C-99', objectKind: 'roll', defaultDistance: { value: 10, unit: 'cm' } });
    const none = (await call(srv.baseUrl, 'GET', `/api/spots/${fresh.body.id}/trend`)).body;
    expect(none.points).toEqual([]);
    expect(none.trendSummary).toEqual({ status: 'not-enough-data', reason: 'a trend test needs at least 3 readings, got 0', n: 0 });
    expect(none.humidity.status).toBe('not-enough-data');
    expect((await call(srv.baseUrl, 'GET', `/api/spots/${c01.id}/trend?range=5y`)).body.error.fields).toEqual([{ path: 'range', message: 'range must be 4w, 13w, 1y or all' }]);
    expect((await call(srv.baseUrl, 'GET', `/api/spots/${newId()}/trend`)).status).toBe(404);
  });
});

const close = (a: number, b: number) => a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));

type Check = { metric: string; level: string; value: number; limit: number | null; ratioToAlarm: number | null; source: string; reason: string };
function sameCheck(a: Check | null, b: Check | null): boolean {
  if (a === null || b === null) return a === b;
  return a.metric === b.metric && a.level === b.level && a.limit === b.limit && a.source === b.source && a.reason === b.reason
    && close(a.value, b.value) && (a.ratioToAlarm === null ? b.ratioToAlarm === null : b.ratioToAlarm !== null && close(a.ratioToAlarm, b.ratioToAlarm));
}
function sameVerdict(a: Reading['verdict'] & { decidedBy?: unknown }, b: Reading['verdict'] & { decidedBy?: unknown }): boolean {
  const ca = a.checks as unknown as Check[];
  const cb = b.checks as unknown as Check[];
  return a.level === b.level && a.reason === b.reason && ca.length === cb.length && ca.every((c, i) => sameCheck(c, cb[i]!))
    && sameCheck(a.decidedBy as Check | null, b.decidedBy as Check | null);
}

describe('the fast verdicts of the review and trend', () => {
  it('equal the Reading entity\'s verdict, ratio and charge estimate on every demo reading', async () => {
    const setup = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/setup`)).body;
    const judge = new ReadingJudge(setup);
    let n = 0;
    for (const s of spots) {
      const entity = new Map((await spotReadings(s.id)).map((e) => [e.id, e]));
      const lean = (await srv.store.trendData(s.id, null, Date.now() + 3_600_000))!.readings;
      expect(lean.length).toBe(entity.size);
      for (const r of lean) {
        const e = entity.get(r.id)!;
        const full = judge.judge(r);
        const quick = judge.judgeLean(r);
        // Equal up to the last bits of a scaled estimate (relative 1e-12): same levels, limits, sources and reasons.
        expect(sameVerdict(full.verdict, e.verdict), `${s.code} ${r.id}`).toBe(true);
        expect(quick.level).toBe(e.verdict.level);
        const ratios = e.verdict.checks.map((c) => c.ratioToAlarm).filter((x): x is number => x !== null);
        if (ratios.length === 0) expect(quick.ratioToAlarm).toBeNull();
        else expect(close(quick.ratioToAlarm!, Math.max(...ratios))).toBe(true);
        const c = e.estimate?.chargeC ?? null;
        if (c === null) expect(full.chargeC).toBeNull();
        else expect(Math.abs(full.chargeC! / c - 1)).toBeLessThan(1e-9);
        n++;
      }
    }
    expect(n).toBeGreaterThan(500);
    expect(judge.fullEstimates).toBeLessThan(n / 3);
  });
});

describe('weekly review', () => {
  it('ranks the spots of a dry demo week by severity, says so in plain words, and lists spots due but not measured', async () => {
    const rounds = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/rounds`)).body.rounds as { startedAt: string }[];
    const first = Math.min(...rounds.map((r) => Date.parse(r.startedAt)));
    // Demo weeks 3-6 are the dry spell; take week 4.
    const week = weekStart(first + 4 * 7 * 86_400_000, tz);

    // A spot added later and planned in a round of that week, with no reading: due, not measured.
    const c01 = spot('C-01');
    const added = (await call(srv.baseUrl, 'POST', '/api/spots', { areaId: c01.areaId, name: 'Slitter knife guard', code: 'C-77', objectKind: 'tool', defaultDistance: { value: 5, unit: 'cm' } })).body;
    const roundId = newId();
    expect((await call(srv.baseUrl, 'POST', '/api/rounds', { id: roundId, siteId, surveyor: 'Late', startedAt: new Date(week.startMs + 2 * 86_400_000).toISOString(), plannedSpotIds: [added.id, c01.id] })).status).toBe(201);
    expect((await call(srv.baseUrl, 'POST', `/api/rounds/${roundId}/skips`, { id: newId(), roundId, spotId: added.id, reason: 'guard removed for cleaning', at: new Date(week.startMs + 2 * 86_400_000 + 60_000).toISOString() })).status).toBe(201);

    const r = await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${week.isoWeek}`);
    expect(r.status).toBe(200);
    const rev = r.body;
    expect(rev.week).toMatchObject({ isoWeek: week.isoWeek, startMs: week.startMs, endMs: week.endMs, timeZone: 'Europe/Berlin' });
    expect(rev.week.label).toMatch(/^Week \d+, \d{4}: Mon /);
    expect(rev.caution).toBe(CAUTION);
    expect(rev.spots.length).toBeGreaterThanOrEqual(20);
    expect(rev.spots.map((s: { rank: number }) => s.rank)).toEqual(rev.spots.map((_: unknown, i: number) => i + 1));
    // ranked by verdict level, then by the worst ratio to an alarm level within a level
    const levelRank: Record<string, number> = { alarm: 2, warn: 1, ok: 0 };
    const keys = rev.spots.map((s: { worstLevel: string; worstRatioToAlarm: number | null }) => [levelRank[s.worstLevel]!, s.worstRatioToAlarm ?? -1] as const);
    for (let i = 1; i < keys.length; i++) {
      const [l0, r0] = keys[i - 1]!;
      const [l1, r1] = keys[i]!;
      expect(l0 > l1 || (l0 === l1 && r0 >= r1)).toBe(true);
    }
    expect(new Set(keys.map((k: readonly [number, number]) => k[0])).size).toBeGreaterThan(1);
    const top = rev.spots[0];
    expect(top.worstLevel).toBe('alarm');
    expect(top.worstRatioToAlarm).toBeGreaterThanOrEqual(1);
    expect(top.worstReason).toMatch(/at or above the alarm level/);
    expect(top.exceedances.alarm).toBeGreaterThan(0);
    expect(rev.counts.spotsInAlarm).toBe(rev.spots.filter((s: { worstLevel: string }) => s.worstLevel === 'alarm').length);
    expect(rev.counts.spotsInAlarm).toBeGreaterThan(0);
    expect(rev.summary).toMatch(new RegExp(`^${rev.counts.spotsInAlarm} spots? in alarm`));
    // the dry spell: humidity well below the usual (the weeks before were normal), and the summary says it
    expect(rev.humidity.differencePoints).toBeLessThan(-8);
    expect(rev.summary).toMatch(/Humidity was \d+ points below the 13-week median/);
    expect(top.change.basis).toBe('ratio of weekly medians of |field|');
    expect(top.trend.weeks).toBeGreaterThanOrEqual(4);

    const nm = rev.notMeasured.find((s: { code: string }) => s.code === 'C-77');
    expect(nm).toEqual({ spotId: added.id, code: 'C-77', name: 'Slitter knife guard', areaName: 'Hall C: film converting', plannedInRounds: 1, skipped: [{ reason: 'guard removed for cleaning', at: expect.any(String) }], openFollowUps: 0 });
    expect(rev.notMeasured.some((s: { code: string }) => s.code === 'C-01')).toBe(false);
    expect(rev.summary).toMatch(/spots? due (was|were) not measured/);

    // the same again comes from the kept weekly aggregates, equal
    const again = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${week.isoWeek}`)).body;
    expect({ ...again, generatedAt: '' }).toEqual({ ...rev, generatedAt: '' });

    // CSV of the ranked table
    const csv = await fetch(`${srv.baseUrl}/api/sites/${siteId}/review.csv?week=${week.isoWeek}`);
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(csv.headers.get('content-disposition')).toBe(`attachment; filename="review-quillmere-converting-works-demo-${week.isoWeek}.csv"`);
    const rows = parseCsv(await csv.text()).rows;
    expect(rows[0]!.slice(0, 6)).toEqual(['rank', 'code', 'spot', 'area', 'readings', 'worst |field| (V/m)']);
    expect(rows.length).toBe(rev.spots.length + 1);
    expect(rows[1]!.slice(0, 2)).toEqual(['1', top.code]);
  });

  it('drops the kept aggregates of a week when a reading taken in it arrives late', async () => {
    const rounds = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/rounds`)).body.rounds as { id: string; startedAt: string }[];
    const lastWeek = weekStart(Date.now() - 7 * 86_400_000, tz);
    const thisWeek = weekStart(Date.now(), tz).isoWeek;
    const before = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${thisWeek}`)).body;
    const round = rounds.find((r) => Date.parse(r.startedAt) >= lastWeek.startMs && Date.parse(r.startedAt) < lastWeek.endMs);
    if (!round) return; // the demo had no round last week (only right after New Year)
    const p04 = spot('P-04');
    const hall = meters.find((m) => m.serial === 'QW-FM-0417')!;
    const at = new Date(Date.parse(round.startedAt) + 60_000).toISOString();
    const late = await call(srv.baseUrl, 'POST', '/api/readings', { id: newId(), roundId: round.id, spotId: p04.id, meterId: hall.id, takenAt: at, value: 900, unit: 'kV/m', polarity: '-', distance: { value: 10, unit: 'cm' }, zeroed: true });
    expect(late.body.acks[0].status).toBe('stored');
    const after = (await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${thisWeek}`)).body;
    const b = before.spots.find((s: { code: string }) => s.code === 'P-04');
    const a = after.spots.find((s: { code: string }) => s.code === 'P-04');
    if (b?.change && a?.change) expect(a.change.previousMedianAbsFieldVPerM).toBeGreaterThan(b.change.previousMedianAbsFieldVPerM);
  });

  it('defaults to the last complete week and refuses weeks that do not exist', async () => {
    const r = await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review`);
    expect(r.status).toBe(200);
    const thisWeek = weekStart(Date.now(), tz);
    expect(r.body.week.endMs).toBe(thisWeek.startMs);
    for (const w of ['2026-W99', '2021-W53', 'last', '2026-9']) {
      const bad = await call(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${w}`);
      expect(bad.status, w).toBe(400);
      expect(bad.body.error.fields[0].path).toBe('week');
    }
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${newId()}/review`)).status).toBe(404);
    expect((await call(srv.baseUrl, 'GET', `/api/sites/${newId()}/review.csv`)).status).toBe(404);
  });
});
});
