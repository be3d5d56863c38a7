/**
 * A spot's trend over a range (GET /api/spots/:id/trend): every current reading as
 * a point (field, verdict level, humidity, charge estimate), the warn and alarm
 * bands of the field from the area's limit set, the robust trend and the relation
 * to humidity (core/stats).
 *
 * The trend statistics run on one value per local day: the median |field| of the
 * day's readings at its median time. A second reading taken in the same round (a
 * closer distance, a repeat) then does not count as independent evidence, and
 * Theil–Sen stays fast over a year (365 points, not thousands). The humidity
 * relation uses every reading with a humidity.
 */
import type { LimitRule } from '../../core/limits/evaluate';
import type { SpotTrend, TrendRange } from '../../core/schemas';
import { formatPValue, humidityRelation, median, trendSummary, type TrendPoint } from '../../core/stats';
import { formatSi } from '../../core/units/format';
import type { Store } from '../store/store';
import { ReadingJudge } from './judge';
import { localDates } from './local-days';

const DAY_MS = 86_400_000;
export const RANGE_DAYS: Record<TrendRange, number | null> = { '4w': 28, '13w': 91, '1y': 365, all: null };
export const TREND_BASIS = 'one point per local day: the median |field| of the day\'s readings at their median time';

/** The |field| warn and alarm bands of a limit set (null when it has no field rule). */
export function fieldBands(rules: readonly LimitRule[]): SpotTrend['bands'] {
  const rule = rules.find((r) => r.metric === 'fieldVPerM');
  return rule ? { warnVPerM: rule.warn, alarmVPerM: rule.alarm, source: rule.source } : null;
}

/** Daily points (t: median time, v: median |field|) from readings, days in the site's time zone. */
export function dailyMedians(points: readonly { t: number; v: number }[], timeZone: string): TrendPoint[] {
  const days = localDates(points.map((p) => p.t), timeZone);
  const groups = new Map<string, { ts: number[]; vs: number[] }>();
  points.forEach((p, i) => {
    const key = days[i]!;
    let g = groups.get(key);
    if (!g) {
      g = { ts: [], vs: [] };
      groups.set(key, g);
    }
    g.ts.push(p.t);
    g.vs.push(p.v);
  });
  return [...groups.values()].map((g) => ({ t: median(g.ts), v: median(g.vs) }));
}

/** "rising by 1.2 kV/m a week (p = 0.003)", or "no clear trend (…)". */
export function trendSentence(t: { direction: string; slopePerWeek: number; pValue: number }): string {
  const rate = `${formatSi(Math.abs(t.slopePerWeek), 'V/m')} a week`;
  if (t.direction === 'increasing') return `rising by ${rate} (${formatPValue(t.pValue)})`;
  if (t.direction === 'decreasing') return `falling by ${rate} (${formatPValue(t.pValue)})`;
  return `no clear trend (${t.slopePerWeek >= 0 ? '+' : '-'}${rate}, ${formatPValue(t.pValue)})`;
}

export async function spotTrend(store: Store, spotId: string, range: TrendRange, nowMs: number): Promise<SpotTrend | null> {
  const days = RANGE_DAYS[range];
  const fromMs = days === null ? null : nowMs - days * DAY_MS;
  // Readings stamped up to an hour ahead (a tablet clock slightly fast) still count.
  const toMs = nowMs + 3_600_000;
  const data = await store.trendData(spotId, fromMs, toMs);
  if (!data) return null;
  const judge = new ReadingJudge(data.setup);
  const counts = { readings: 0, ok: 0, warn: 0, alarm: 0, withHumidity: 0, withCharge: 0, days: 0 };
  const points: SpotTrend['points'] = [];
  const abs: { t: number; v: number }[] = [];
  const humid: { rh: number; fieldVPerM: number }[] = [];
  for (const r of data.readings) {
    const j = judge.judgeLean(r);
    points.push({ readingId: r.id, takenAt: r.takenAt, fieldVPerM: j.fieldVPerM, level: j.level, rhPercent: r.rhPercent, chargeC: j.chargeC, surfaceChargeDensityCPerM2: j.surfaceChargeDensityCPerM2 });
    counts.readings++;
    counts[j.level]++;
    if (j.chargeC !== null) counts.withCharge++;
    abs.push({ t: Date.parse(r.takenAt), v: Math.abs(j.fieldVPerM) });
    if (r.rhPercent !== null) {
      counts.withHumidity++;
      humid.push({ rh: r.rhPercent, fieldVPerM: j.fieldVPerM });
    }
  }
  const daily = dailyMedians(abs, data.setup.site.timeZone);
  counts.days = daily.length;
  const t = trendSummary(daily);
  const h = humidityRelation(humid);
  return {
    spot: { id: data.spot.id, code: data.spot.code, name: data.spot.name, areaId: data.area.id, areaName: data.area.name, model: data.spot.model },
    range: { key: range, from: fromMs === null ? null : new Date(fromMs).toISOString(), to: new Date(nowMs).toISOString() },
    bands: fieldBands(judge.rulesOf(spotId)),
    points,
    trendSummary: t.status === 'ok'
      ? {
        status: 'ok', n: t.n, basis: TREND_BASIS, slopeVPerMPerWeek: t.slopePerWeek, slopeLowerVPerMPerWeek: t.slopeLowerPerWeek,
        slopeUpperVPerMPerWeek: t.slopeUpperPerWeek, pValue: t.pValue, tau: t.tau, alpha: t.alpha, significant: t.significant,
        direction: t.direction, sentence: trendSentence(t),
      }
      : { status: 'not-enough-data', reason: t.reason, n: t.n },
    humidity: h.status === 'ok'
      ? {
        status: 'ok', n: h.n, slopeLog10PerRhPoint: h.slopeLog10PerRhPoint, percentChangePerRhPoint: h.percentChangePerRhPoint,
        pValue: h.pValue, rSquared: h.rSquared, significant: h.significant, sentence: h.sentence,
      }
      : { status: 'not-enough-data', reason: h.reason, n: h.n },
    counts,
  };
}
