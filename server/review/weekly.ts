/**
 * The weekly hot-spot review of a site (GET /api/sites/:id/review): for one site
 * week (Monday 00:00 to Monday 00:00 local), every spot with a reading ranked by
 * severity, the spots that were due but not measured, the humidity against the
 * site's usual, open follow-ups, and a few plain sentences on top.
 *
 * Definitions (the answer says them too where a number could be misread):
 * - severity: the highest ratio of any checked metric to its alarm level over the
 *   week's readings; ties by alarm count, then warn count, then the 8-week trend
 *   (rising first), then the spot code;
 * - change: this week's median |field| divided by last week's;
 * - trend: Theil–Sen and Mann–Kendall over the weekly medians of |field| of the
 *   last 8 weeks (this one included);
 * - humidity: the median RH of the week's readings (the reading's, else its
 *   round's) against the median of the 13 weeks before (of their weekly medians);
 * - due: planned in a round started that week; with no round that week, every
 *   spot active on the route. Retired spots are never due.
 */
import { CAUTION } from '../../core/hazard';
import { worseLevel, type VerdictLevel } from '../../core/limits/evaluate';
import type { FollowUp, ReviewSpot, WeeklyReview } from '../../core/schemas';
import { formatPValue, median, trendSummary, type TrendPoint } from '../../core/stats';
import { previousWeek, weekOf, weeksBack, weekStart, zonedDateTime, type Week } from '../../core/time';
import { formatSi } from '../../core/units/format';
import type { LeanReading, Store } from '../store/store';
import { ReadingJudge } from './judge';

export const TREND_WEEKS = 8;
export const USUAL_WEEKS = 13;

const LEVEL_RANK: Record<VerdictLevel, number> = { ok: 0, warn: 1, alarm: 2 };

/** The week a review shows: the ISO week asked for, else the last complete week in the site's time zone. */
export function reviewWeek(isoWeek: string | undefined, timeZone: string, nowMs: number): Week {
  return isoWeek ? weekOf(isoWeek, timeZone) : previousWeek(weekStart(nowMs, timeZone));
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const round1 = (x: number) => Math.round(x * 10) / 10;

function changeText(ratio: number, previous: number): string {
  const prev = formatSi(previous, 'V/m');
  if (ratio >= 0.9 && ratio <= 1.1) return `about the same as last week (×${ratio.toFixed(2)} of its median ${prev})`;
  return `×${ratio.toFixed(2)} last week's median (${prev})`;
}

function trendOf(points: TrendPoint[]): ReviewSpot['trend'] {
  const t = trendSummary(points);
  if (t.status !== 'ok') return { weeks: points.length, status: 'not-enough-data', direction: null, pValue: null, slopeVPerMPerWeek: null, text: t.reason };
  const word = t.direction === 'increasing' ? 'rising' : t.direction === 'decreasing' ? 'falling' : 'no clear trend';
  return {
    weeks: points.length, status: 'ok', direction: t.direction, pValue: t.pValue, slopeVPerMPerWeek: t.slopePerWeek,
    text: `${word} (${formatPValue(t.pValue)}; ${t.slopePerWeek >= 0 ? '+' : '-'}${formatSi(Math.abs(t.slopePerWeek), 'V/m')} a week)`,
  };
}

function trendScore(t: ReviewSpot['trend']): number {
  if (t.direction === 'increasing') return 2 - (t.pValue ?? 1);
  if (t.direction === 'decreasing') return -2 + (t.pValue ?? 1);
  return 0;
}

interface SpotAcc {
  readings: number;
  fields: number[];
  rh: number[];
  worstLevel: VerdictLevel;
  worstRatio: number | null;
  /** The worst reading (by level, then ratio): its verdict's reason is given in full. */
  worst: LeanReading | null;
  worstKey: [number, number];
  warn: number;
  alarm: number;
}

export async function weeklyReview(store: Store, siteId: string, isoWeek: string | undefined, nowMs: number): Promise<WeeklyReview | null> {
  const site = await store.getSite(siteId);
  if (!site) return null;
  const week = reviewWeek(isoWeek, site.timeZone, nowMs);
  const history = weeksBack(previousWeek(week), USUAL_WEEKS);
  const data = await store.reviewData(siteId, { week, history, timeZone: site.timeZone, nowMs });
  if (!data) return null;
  const { setup } = data;
  const judge = new ReadingJudge(setup);
  const areaName = new Map(setup.areas.map((a) => [a.id, a.name]));
  const spotById = new Map(setup.spots.map((s) => [s.id, s]));

  // ---------- this week's readings, per spot ----------
  const acc = new Map<string, SpotAcc>();
  const siteRh: number[] = [];
  for (const r of data.readings) {
    const j = judge.judgeLean(r);
    let a = acc.get(r.spotId);
    if (!a) {
      a = { readings: 0, fields: [], rh: [], worstLevel: 'ok', worstRatio: null, worst: null, worstKey: [-1, -1], warn: 0, alarm: 0 };
      acc.set(r.spotId, a);
    }
    a.readings++;
    a.fields.push(Math.abs(j.fieldVPerM));
    if (r.rhPercent !== null) {
      a.rh.push(r.rhPercent);
      siteRh.push(r.rhPercent);
    }
    if (j.level === 'warn') a.warn++;
    if (j.level === 'alarm') a.alarm++;
    a.worstLevel = worseLevel(a.worstLevel, j.level);
    const ratio = j.ratioToAlarm;
    if (ratio !== null && (a.worstRatio === null || ratio > a.worstRatio)) a.worstRatio = ratio;
    const key: [number, number] = [LEVEL_RANK[j.level], ratio ?? 0];
    if (key[0] > a.worstKey[0] || (key[0] === a.worstKey[0] && key[1] > a.worstKey[1])) {
      a.worstKey = key;
      a.worst = r;
    }
  }

  // ---------- humidity ----------
  const usualWeekly = data.history.map((w) => w.medianRhPercent).filter((x): x is number => x !== null);
  const usualRh = usualWeekly.length ? median(usualWeekly) : null;
  const weekRh = siteRh.length ? median(siteRh) : null;
  const rhDiff = weekRh !== null && usualRh !== null ? round1(weekRh - usualRh) : null;

  // ---------- follow-ups ----------
  const today = zonedDateTime(nowMs, site.timeZone);
  const todayIso = `${String(today.year).padStart(4, '0')}-${String(today.month).padStart(2, '0')}-${String(today.day).padStart(2, '0')}`;
  const openBySpot = new Map<string, FollowUp[]>();
  for (const f of data.openFollowUps) openBySpot.set(f.spotId, [...(openBySpot.get(f.spotId) ?? []), f]);
  const overdue = data.openFollowUps.filter((f) => f.dueDate !== null && f.dueDate < todayIso).length;

  // ---------- ranked spots ----------
  const prev = data.history[data.history.length - 1];
  const trendWeeks = data.history.slice(-(TREND_WEEKS - 1));
  const spots: ReviewSpot[] = [];
  for (const [spotId, a] of acc) {
    const spot = spotById.get(spotId);
    if (!spot) continue;
    const med = median(a.fields);
    let worst = 0;
    for (const f of a.fields) if (f > worst) worst = f;
    const before = prev?.spots.get(spotId);
    const change = before && before.medianAbsFieldVPerM > 0
      ? {
        basis: 'ratio of weekly medians of |field|' as const, previousMedianAbsFieldVPerM: before.medianAbsFieldVPerM,
        ratio: med / before.medianAbsFieldVPerM, text: changeText(med / before.medianAbsFieldVPerM, before.medianAbsFieldVPerM),
      }
      : null;
    const points: TrendPoint[] = [];
    for (const w of trendWeeks) {
      const s = w.spots.get(spotId);
      if (s) points.push({ t: (w.startMs + w.endMs) / 2, v: s.medianAbsFieldVPerM });
    }
    points.push({ t: (week.startMs + week.endMs) / 2, v: med });
    const spotRh = a.rh.length ? median(a.rh) : null;
    spots.push({
      rank: 0, spotId, code: spot.code, name: spot.name, areaId: spot.areaId, areaName: areaName.get(spot.areaId) ?? '',
      readings: a.readings, worstAbsFieldVPerM: worst, medianAbsFieldVPerM: med, worstLevel: a.worstLevel,
      worstRatioToAlarm: a.worstRatio, worstReason: a.worst ? judge.judge(a.worst).verdict.reason : '', exceedances: { warn: a.warn, alarm: a.alarm },
      change, trend: trendOf(points),
      humidity: { weekMedianRhPercent: spotRh, siteUsualRhPercent: usualRh, differencePoints: spotRh !== null && usualRh !== null ? round1(spotRh - usualRh) : null },
      openFollowUps: openBySpot.get(spotId) ?? [],
      worstText: formatSi(worst, 'V/m'), medianText: formatSi(med, 'V/m'),
    });
  }
  // Severity: the verdict level first (an alarm outranks any warn, a warn any ok, whatever
  // the limit sets), then the worst ratio to the alarm level, exceedances and trend.
  spots.sort((x, y) => LEVEL_RANK[y.worstLevel] - LEVEL_RANK[x.worstLevel]
    || (y.worstRatioToAlarm ?? -1) - (x.worstRatioToAlarm ?? -1)
    || y.exceedances.alarm - x.exceedances.alarm
    || y.exceedances.warn - x.exceedances.warn
    || trendScore(y.trend) - trendScore(x.trend)
    || x.code.localeCompare(y.code));
  spots.forEach((s, i) => { s.rank = i + 1; });

  // ---------- due but not measured ----------
  const weekEndIso = new Date(week.endMs).toISOString();
  const active = setup.spots.filter((s) => s.retiredAt === null || s.retiredAt >= weekEndIso);
  const plannedCount = new Map<string, number>();
  for (const r of data.rounds) for (const id of r.plannedSpotIds) plannedCount.set(id, (plannedCount.get(id) ?? 0) + 1);
  // With no round that week, every spot that existed and was active then was due.
  const due = data.rounds.length > 0 ? active.filter((s) => plannedCount.has(s.id)) : active.filter((s) => s.createdAt < weekEndIso);
  const notMeasured: WeeklyReview['notMeasured'] = due.filter((s) => !acc.has(s.id)).map((s) => ({
    spotId: s.id, code: s.code, name: s.name, areaName: areaName.get(s.areaId) ?? '', plannedInRounds: plannedCount.get(s.id) ?? 0,
    skipped: data.skips.filter((k) => k.spotId === s.id).map((k) => ({ reason: k.reason, at: k.at })),
    openFollowUps: openBySpot.get(s.id)?.length ?? 0,
  }));

  // ---------- summary ----------
  const inAlarm = spots.filter((s) => s.worstLevel === 'alarm');
  const inWarn = spots.filter((s) => s.worstLevel === 'warn');
  const sentences: string[] = [];
  if (data.readings.length === 0) {
    sentences.push('No readings were taken this week.');
  } else if (inAlarm.length > 0) {
    const byArea = new Map<string, number>();
    for (const s of inAlarm) byArea.set(s.areaName, (byArea.get(s.areaName) ?? 0) + 1);
    const [topArea, topCount] = [...byArea.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0]!;
    const where = inAlarm.length === 1 ? ` (${inAlarm[0]!.code}, ${topArea})`
      : topCount === inAlarm.length ? `, all of them in ${topArea}` : `, ${topCount} of them in ${topArea}`;
    sentences.push(`${plural(inAlarm.length, 'spot')} in alarm${where}${inWarn.length ? `; ${inWarn.length} more at the warn level` : ''}.`);
  } else if (inWarn.length > 0) {
    sentences.push(`No spot in alarm; ${plural(inWarn.length, 'spot')} at the warn level.`);
  } else {
    sentences.push(`No spot reached a warn or alarm level (${plural(spots.length, 'spot')} measured).`);
  }
  const rising = spots.filter((s) => s.trend.direction === 'increasing');
  if (rising.length > 0) {
    const named = rising.slice(0, 3).map((s) => `${s.code} ${s.name} (${formatPValue(s.trend.pValue ?? 1)})`).join(', ');
    sentences.push(`Trending up over ${TREND_WEEKS} weeks: ${named}${rising.length > 3 ? ` and ${rising.length - 3} more` : ''}.`);
  }
  let humiditySentence: string;
  if (weekRh === null) humiditySentence = 'No humidity was recorded this week.';
  else if (usualRh === null) humiditySentence = `Humidity was ${round1(weekRh)} % RH (no earlier weeks to compare with).`;
  else if (Math.abs(rhDiff!) < 3) humiditySentence = `Humidity was about the usual: ${round1(weekRh)} % RH against a ${USUAL_WEEKS}-week median of ${round1(usualRh)} %.`;
  else {
    const pts = Math.round(Math.abs(rhDiff!));
    humiditySentence = `Humidity was ${plural(pts, 'point')} ${rhDiff! < 0 ? 'below' : 'above'} the ${USUAL_WEEKS}-week median (${round1(weekRh)} % RH against ${round1(usualRh)} %)${rhDiff! <= -10 ? ': dry air raises fields' : ''}.`;
  }
  sentences.push(humiditySentence);
  if (notMeasured.length > 0) {
    const skipped = notMeasured.filter((s) => s.skipped.length > 0).length;
    sentences.push(`${plural(notMeasured.length, 'spot')} due ${notMeasured.length === 1 ? 'was' : 'were'} not measured${skipped ? ` (${skipped} skipped with a reason)` : ''}.`);
  }
  if (data.openFollowUps.length > 0) {
    sentences.push(`${plural(data.openFollowUps.length, 'follow-up')} ${data.openFollowUps.length === 1 ? 'is' : 'are'} open${overdue ? `, ${overdue} overdue` : ''}.`);
  }

  return {
    site: { id: site.id, name: site.name, timeZone: site.timeZone },
    week: {
      isoWeek: week.isoWeek, startMs: week.startMs, endMs: week.endMs, start: new Date(week.startMs).toISOString(), end: weekEndIso,
      label: week.label, timeZone: week.timeZone,
    },
    generatedAt: new Date(nowMs).toISOString(),
    summary: sentences.join(' '),
    summarySentences: sentences,
    spots,
    notMeasured,
    humidity: { weekMedianRhPercent: weekRh, usualMedianRhPercent: usualRh, differencePoints: rhDiff, usualWeeks: usualWeekly.length, sentence: humiditySentence },
    counts: {
      rounds: data.rounds.length, readings: data.readings.length, spotsMeasured: spots.length, spotsDue: due.length,
      spotsInAlarm: inAlarm.length, spotsInWarn: inWarn.length, openFollowUps: data.openFollowUps.length, overdueFollowUps: overdue,
    },
    openFollowUps: data.openFollowUps,
    caution: CAUTION,
  };
}
