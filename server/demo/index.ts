/**
 * Loads the invented demo site through the Store (the same code paths as the
 * API): set-up, then 14 weeks of rounds up to now, two a week, generated with a
 * seeded PRNG so the numbers are the same everywhere and only the dates follow
 * the calendar.
 *
 * The story in the numbers:
 * - humidity: usual 45-55 % RH; a dry spell in weeks 4-7 (25-35 % RH) raises fields;
 * - C-04 (web at dryer exit) trends up week by week, and dry air does not explain it
 *   (the web leaves a hot dryer: no humidity dependence, little scatter);
 * - C-05 (rewind roll) alarms until an ionising bar is fitted in week 9, then drops;
 * - the spare meter's calibration ran out three weeks ago (its readings are flagged);
 * - a few readings were corrected (a missed digit) and one deleted (wrong spot);
 * - follow-ups: one on C-05 opened from an alarm before the fix and closed by the
 *   first verifying reading within limits after it; one open on C-04 (trending up);
 * - an invented SVG floor plan per area (server/demo/plans.ts) with every spot placed.
 */
import { v7 } from 'uuid';
import {
  AreaInputSchema, CorrectionInputSchema, FollowUpInputSchema, LimitSetInputSchema, MeterInputSchema, ReadingInputSchema, RoundInputSchema,
  SiteInputSchema, SkipInputSchema, SpotInputSchema, type ReadingInput,
} from '../../core/schemas';
import { METRES_PER_DISTANCE_UNIT } from '../../core/units/distance';
import { VOLTS_PER_METRE_PER_FIELD_UNIT } from '../../core/units/field';
import type { Store } from '../store/store';
import { AREAS, LIMIT_SETS, SITE, SKIP_REASONS, SPOTS, SURVEYORS, type AreaKey, type DemoSpot, type MeterKey } from './plant';
import { mulberry32, type Prng } from './prng';
import { demoPlanSvg, demoSpotPositions } from './plans';
import { sanitizeSvg } from '../../core/plan';
import { sha256Hex, svgSize } from '../plans/image';

export const DEMO_WEEKS = 14;
const DRY_WEEKS = new Set([3, 4, 5, 6]);
const CORRECTED_ROUNDS = [5, 17, 23];
const DELETED_ROUND = 11;
const DAY = 86_400_000;
const INCH = 0.0254;

export interface DemoCounts {
  siteId: string;
  areas: number;
  spots: number;
  meters: number;
  rounds: number;
  readings: number;
  corrections: number;
  tombstones: number;
  skips: number;
  followUps: number;
}

function isoDate(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** Monday 00:00 UTC of the week holding `ms`. */
function mondayUtc(ms: number): number {
  const d = new Date(ms);
  const day = (d.getUTCDay() + 6) % 7;
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()) - day * DAY;
}

/** The value a surveyor types for field `e` (V/m, signed) in the spot's usual unit, rounded like a meter display. */
function displayValue(e: number, unit: DemoSpot['unit']): number {
  const mag = Math.abs(e);
  if (unit === 'kV/m') return Math.round((mag / VOLTS_PER_METRE_PER_FIELD_UNIT['kV/m']) * 10) / 10;
  if (unit === 'V/inch') return Math.max(1, Math.round(mag * INCH));
  if (unit === 'V/m') return Math.round(mag);
  return Math.round(mag * INCH * 10) / 10; // 'V': surface-voltage mode at 1 inch
}

function fieldFor(s: DemoSpot, week: number, rh: number, rng: Prng, distanceScale: number): number {
  const humidity = Math.exp(0.045 * (s.rhSensitivity ?? 1) * (48 - rh));
  const trend = 1 + (s.trendPerWeek ?? 0) * week;
  const fix = s.fixedFromWeek !== undefined && week >= s.fixedFromWeek ? s.fixFactor ?? 1 : 1;
  const spike = rng.chance(0.02) ? 2.5 : 1;
  const noise = Math.exp((s.noiseSd ?? 0.22) * rng.normal());
  return s.baseVPerM * humidity * trend * fix * spike * noise * distanceScale;
}

export async function loadDemo(store: Store, opts: { now?: Date; seed?: number } = {}): Promise<DemoCounts> {
  const nowMs = (opts.now ?? new Date()).getTime();
  const rng = mulberry32(opts.seed ?? 20260302);
  const idAt = (ms: number) => v7({ msecs: Math.floor(ms), random: rng.bytes16() });

  // ---------- set-up ----------
  const site = await store.createSite(SiteInputSchema.parse(SITE));
  const limitSetIds = {} as Record<AreaKey, string>;
  for (const key of Object.keys(LIMIT_SETS) as AreaKey[]) {
    const ls = await store.createLimitSet(LimitSetInputSchema.parse({ siteId: site.id, ...LIMIT_SETS[key] }));
    limitSetIds[key] = ls.id;
  }
  const areaIds = {} as Record<AreaKey, string>;
  for (const key of Object.keys(AREAS) as AreaKey[]) {
    const area = await store.createArea(AreaInputSchema.parse({ siteId: site.id, limitSetId: limitSetIds[key], ...AREAS[key] }));
    areaIds[key] = area.id;
  }
  const meterIds = {} as Record<MeterKey, string>;
  const meterInputs: Record<MeterKey, unknown> = {
    hall: { serial: 'QW-FM-0417', label: 'Field meter, Ex-approved (hall and powder room)', modes: ['field', 'surface-voltage'], calibratedDistanceM: INCH, accuracyRel: 0.05, calibrationDue: isoDate(nowMs + 200 * DAY), defaultUnit: 'kV/m' },
    epa: { serial: 'QW-FM-0522', label: 'Field meter, EPA', modes: ['field', 'surface-voltage'], calibratedDistanceM: INCH, accuracyRel: 0.1, calibrationDue: isoDate(nowMs + 120 * DAY), defaultUnit: 'V/inch' },
    spare: { serial: 'QW-FM-0198', label: 'Spare field meter (calibration overdue)', modes: ['field'], calibratedDistanceM: null, accuracyRel: 0.1, calibrationDue: isoDate(nowMs - 21 * DAY), defaultUnit: 'kV/m' },
  };
  for (const key of Object.keys(meterInputs) as MeterKey[]) {
    meterIds[key] = (await store.createMeter(MeterInputSchema.parse({ siteId: site.id, ...(meterInputs[key] as object) }))).id;
  }
  const positions = new Map<AreaKey, number>();
  const spotIds: string[] = [];
  for (const s of SPOTS) {
    const pos = positions.get(s.area) ?? 0;
    positions.set(s.area, pos + 1);
    const spot = await store.createSpot(SpotInputSchema.parse({ ...s.spot, areaId: areaIds[s.area], routePosition: pos }));
    spotIds.push(spot.id);
  }
  // An invented floor plan per area with every spot placed, so the plan screen shows pins at once.
  for (const key of Object.keys(AREAS) as AreaKey[]) {
    const svg = sanitizeSvg(demoPlanSvg(key)).svg;
    const size = svgSize(svg);
    await store.putAreaPlan(areaIds[key], { contentType: 'image/svg+xml', bytes: Buffer.from(svg, 'utf8'), width: size?.width ?? null, height: size?.height ?? null, sha256: sha256Hex(Buffer.from(svg, 'utf8')) });
    const where = demoSpotPositions(key);
    for (let i = 0; i < SPOTS.length; i++) {
      const s = SPOTS[i]!;
      const at = s.area === key ? where[s.spot.code] : undefined;
      if (at) await store.setSpotPosition(spotIds[i]!, at);
    }
  }

  // ---------- rounds ----------
  const counts: DemoCounts = {
    siteId: site.id, areas: Object.keys(AREAS).length, spots: SPOTS.length, meters: 3, rounds: 0, readings: 0, corrections: 0, tombstones: 0, skips: 0,
    followUps: 0,
  };
  const firstMonday = mondayUtc(nowMs) - (DEMO_WEEKS - 1) * 7 * DAY;
  const toCorrect: { input: ReadingInput; trueValue: number }[] = [];
  let toDelete: ReadingInput | null = null;
  let roundNo = 0;
  for (let week = 0; week < DEMO_WEEKS; week++) {
    for (const weekday of [1, 3]) { // Tuesday and Thursday
      const start = firstMonday + (week * 7 + weekday) * DAY + 6.5 * 3600_000 + rng.between(0, 40) * 60_000;
      if (start + 2 * 3600_000 > nowMs) continue;
      const rh = DRY_WEEKS.has(week) ? rng.between(25, 35) : rng.between(45, 55);
      const temperatureC = Math.round(rng.between(19, 23.5) * 10) / 10;
      const surveyor = SURVEYORS[roundNo % SURVEYORS.length]!;
      roundNo++;
      const roundId = idAt(start);
      await store.createRound(RoundInputSchema.parse({
        id: roundId, siteId: site.id, surveyor, startedAt: new Date(start).toISOString(),
        rhPercent: Math.round(rh), temperatureC, notes: DRY_WEEKS.has(week) ? 'Dry air this week (heating on full).' : '',
      }));
      counts.rounds++;

      const batch: ReadingInput[] = [];
      let t = start;
      for (const [i, s] of SPOTS.entries()) {
        t += rng.between(60, 180) * 1000;
        if (rng.chance(0.03)) {
          await store.addSkip(roundId, SkipInputSchema.parse({
            id: idAt(t), roundId, spotId: spotIds[i], reason: SKIP_REASONS[Math.floor(rng.next() * SKIP_REASONS.length)], at: new Date(t).toISOString(),
          }));
          counts.skips++;
          continue;
        }
        const takes = rng.chance(0.15) ? 2 : 1;
        for (let k = 0; k < takes; k++) {
          const closer = k === 1 && s.spot.defaultDistance.unit === 'cm';
          const distance = closer ? { value: s.spot.defaultDistance.value / 2, unit: 'cm' as const } : s.spot.defaultDistance;
          const defaultM = s.spot.defaultDistance.value * METRES_PER_DISTANCE_UNIT[s.spot.defaultDistance.unit];
          const scale = closer ? (defaultM / (defaultM / 2)) ** 1.5 : 1; // between line-like and point-like fall-off
          const e = fieldFor(s, week, rh, rng, scale);
          const running = s.process && rng.chance(0.9);
          const input = ReadingInputSchema.parse({
            id: idAt(t + k * 20_000), roundId, spotId: spotIds[i], meterId: meterIds[s.meter], takenAt: new Date(t + k * 20_000).toISOString(),
            value: displayValue(e, s.unit), unit: s.unit, polarity: s.polarity, meterRange: s.unit === 'kV/m' || s.unit === 'V/m' ? '0-2000 kV/m' : '0-20 kV/inch',
            distance, side: s.spot.objectKind === 'web' ? 'free-span' : k === 1 ? 'other' : 'front', zeroed: rng.chance(0.97),
            rhPercent: Math.round((rh + rng.normal()) * 10) / 10, temperatureC,
            process: s.process ? { state: running ? 'running' : 'idle', material: s.process.material, lineSpeedMPerS: running ? s.process.lineSpeedMPerS : 0 } : null,
            note: k === 1 ? 'second reading, closer' : '',
          });
          // A missed digit, corrected later the same day (three times in the demo).
          if (CORRECTED_ROUNDS.includes(roundNo) && s.spot.code === 'C-02' && k === 0) {
            const typed = Math.round(input.value) / 10;
            toCorrect.push({ input: { ...input, value: typed }, trueValue: input.value });
            batch.push({ ...input, value: typed });
          } else {
            batch.push(input);
          }
        }
      }
      // One reading entered at the wrong spot, deleted later.
      if (roundNo === DELETED_ROUND) {
        const wrong = batch.find((r) => r.spotId === spotIds[SPOTS.findIndex((s) => s.spot.code === 'E-02')]);
        if (wrong) {
          toDelete = { ...wrong, id: idAt(Date.parse(wrong.takenAt) + 5_000), takenAt: new Date(Date.parse(wrong.takenAt) + 5_000).toISOString(), note: 'cart reading' };
          batch.push(toDelete);
        }
      }
      const end = t + 10 * 60_000;
      const acks = await store.ingestReadings(batch, { receivedAt: new Date(end).toISOString() });
      counts.readings += acks.filter((a) => a.status === 'stored').length;
      await store.finishRound(roundId, { endedAt: new Date(end).toISOString() });
    }
  }

  for (const c of toCorrect) {
    const at = Date.parse(c.input.takenAt) + 3 * 3600_000;
    await store.correctReading(c.input.id, CorrectionInputSchema.parse({
      ...c.input, id: idAt(at), value: c.trueValue, reason: `typed ${c.input.value} instead of ${c.trueValue} (missed a digit)`,
    }), { receivedAt: new Date(at).toISOString() });
    counts.corrections++;
  }
  if (toDelete) {
    const del: ReadingInput = toDelete;
    await store.tombstoneReading(del.id, 'entered at the wrong spot (it was the reel cart, E-03)', { at: new Date(Date.parse(del.takenAt) + 3600_000).toISOString() });
    counts.tombstones++;
  }

  // ---------- follow-ups ----------
  const spotId = (code: string) => spotIds[SPOTS.findIndex((x) => x.spot.code === code)]!;
  const c05 = SPOTS.find((x) => x.spot.code === 'C-05')!;
  const fixMs = firstMonday + (c05.fixedFromWeek ?? 8) * 7 * DAY;
  const c05Readings = ((await store.listSpotReadings(spotId('C-05'), { history: false, limit: 1000 })) ?? [])
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt));
  const lastAlarm = c05Readings.filter((r) => r.verdict.level === 'alarm' && Date.parse(r.takenAt) < fixMs).at(-1);
  if (lastAlarm) {
    const openedAt = Date.parse(lastAlarm.takenAt) + 4 * 3600_000;
    const f = await store.createFollowUp(FollowUpInputSchema.parse({
      spotId: spotId('C-05'), openedFromReadingId: lastAlarm.id, findingClass: 'major-nonconformance',
      action: 'Fit an ionising bar before the rewind of printer 2 and earth the rewind shaft', assignee: 'Maintenance',
      dueDate: isoDate(fixMs + 7 * DAY), by: SURVEYORS[1],
    }), { at: new Date(openedAt).toISOString() });
    counts.followUps++;
    const verifying = c05Readings.find((r) => r.verdict.level === 'ok' && Date.parse(r.takenAt) >= fixMs);
    if (verifying) {
      await store.closeFollowUp(f.id, { verifyingReadingId: verifying.id, by: SURVEYORS[0] ?? '' }, { at: new Date(Date.parse(verifying.takenAt) + 3600_000).toISOString() });
    }
  }
  const c04Latest = ((await store.listSpotReadings(spotId('C-04'), { history: false, limit: 1 })) ?? [])[0];
  if (c04Latest) {
    await store.createFollowUp(FollowUpInputSchema.parse({
      spotId: spotId('C-04'), openedFromReadingId: c04Latest.id, findingClass: 'observation',
      action: 'Field at the dryer exit rises week by week: check the static bar after the dryer and its cleaning schedule', assignee: 'Line 2 lead',
      dueDate: isoDate(nowMs + 10 * DAY), by: SURVEYORS[2],
    }), { at: new Date(Math.min(nowMs, Date.parse(c04Latest.takenAt) + 2 * 3600_000)).toISOString() });
    counts.followUps++;
  }
  return counts;
}
