/**
 * Checks that a whole-site export (core/schemas/exchange.ts) holds together before
 * it is imported: every record belongs to the site, every reference points at a
 * record of the export, every correction at a revision of the same spot. Answers
 * the problems with their paths (readings.12.roundId); none means it can go in.
 */
import type { SiteExport } from '../../core/schemas';
import type { FieldMessage } from '../http/errors';

export function checkSiteExport(d: SiteExport): FieldMessage[] {
  const out: FieldMessage[] = [];
  const add = (path: string, message: string) => { if (out.length < 50) out.push({ path, message }); };
  const siteId = d.site.id;
  const ids = <T extends { id: string }>(xs: T[]) => new Set(xs.map((x) => x.id));
  const limitSets = ids(d.limitSets);
  const areas = ids(d.areas);
  const spots = new Map(d.spots.map((s) => [s.id, s]));
  const meters = ids(d.meters);
  const rounds = ids(d.rounds);
  const readings = new Map(d.readings.map((r) => [r.id, r]));
  const followUps = ids(d.followUps);
  const unique = (what: string, xs: { id: string }[]) => {
    const seen = new Set<string>();
    xs.forEach((x, i) => { if (seen.has(x.id)) add(`${what}.${i}.id`, 'this id appears twice'); seen.add(x.id); });
  };
  for (const [what, xs] of [['limitSets', d.limitSets], ['areas', d.areas], ['spots', d.spots], ['meters', d.meters], ['rounds', d.rounds],
    ['skips', d.skips], ['readings', d.readings], ['followUps', d.followUps], ['followUpEvents', d.followUpEvents]] as const) unique(what, xs);

  d.limitSets.forEach((x, i) => { if (x.siteId !== siteId) add(`limitSets.${i}.siteId`, 'belongs to another site than the export'); });
  d.areas.forEach((x, i) => {
    if (x.siteId !== siteId) add(`areas.${i}.siteId`, 'belongs to another site than the export');
    if (x.limitSetId !== null && !limitSets.has(x.limitSetId)) add(`areas.${i}.limitSetId`, 'no limit set with this id in the export');
  });
  const codes = new Set<string>();
  d.spots.forEach((x, i) => {
    if (!areas.has(x.areaId)) add(`spots.${i}.areaId`, 'no area with this id in the export');
    if (codes.has(x.code.toLowerCase())) add(`spots.${i}.code`, 'another spot has this code');
    codes.add(x.code.toLowerCase());
  });
  d.meters.forEach((x, i) => { if (x.siteId !== siteId) add(`meters.${i}.siteId`, 'belongs to another site than the export'); });
  d.rounds.forEach((x, i) => {
    if (x.siteId !== siteId) add(`rounds.${i}.siteId`, 'belongs to another site than the export');
    x.plannedSpotIds.forEach((s, j) => { if (!spots.has(s)) add(`rounds.${i}.plannedSpotIds.${j}`, 'no spot with this id in the export'); });
  });
  d.skips.forEach((x, i) => {
    if (!rounds.has(x.roundId)) add(`skips.${i}.roundId`, 'no round with this id in the export');
    if (!spots.has(x.spotId)) add(`skips.${i}.spotId`, 'no spot with this id in the export');
  });
  const superseded = new Set<string>();
  d.readings.forEach((x, i) => {
    if (!rounds.has(x.roundId)) add(`readings.${i}.roundId`, 'no round with this id in the export');
    if (!spots.has(x.spotId)) add(`readings.${i}.spotId`, 'no spot with this id in the export');
    if (!meters.has(x.meterId)) add(`readings.${i}.meterId`, 'no meter with this id in the export');
    if ((x.supersedesId === null) !== (x.correctionReason === null)) add(`readings.${i}.correctionReason`, 'a correction has a reason, an original has none');
    if (x.supersedesId !== null) {
      if (!readings.has(x.supersedesId)) add(`readings.${i}.supersedesId`, 'no reading with this id in the export');
      else if (superseded.has(x.supersedesId)) add(`readings.${i}.supersedesId`, 'this revision is corrected twice');
      superseded.add(x.supersedesId);
    }
  });
  const tombstoned = new Set<string>();
  d.tombstones.forEach((x, i) => {
    if (!readings.has(x.readingId)) add(`tombstones.${i}.readingId`, 'no reading with this id in the export');
    if (tombstoned.has(x.readingId)) add(`tombstones.${i}.readingId`, 'this reading is deleted twice');
    tombstoned.add(x.readingId);
  });
  d.conflicts.forEach((x, i) => { if (!readings.has(x.readingId)) add(`conflicts.${i}.readingId`, 'no reading with this id in the export'); });
  d.followUps.forEach((x, i) => {
    if (x.siteId !== siteId) add(`followUps.${i}.siteId`, 'belongs to another site than the export');
    if (!spots.has(x.spotId)) add(`followUps.${i}.spotId`, 'no spot with this id in the export');
    for (const k of ['openedFromReadingId', 'closedByReadingId'] as const) {
      const r = x[k];
      if (r !== null && !readings.has(r)) add(`followUps.${i}.${k}`, 'no reading with this id in the export');
    }
    if ((x.status === 'open') !== (x.closedAt === null)) add(`followUps.${i}.closedAt`, 'an open follow-up has no closing time, a closed one has one');
    if (x.status === 'closed' && (x.closedByReadingId === null) === (x.closedReason === null)) add(`followUps.${i}.closedReason`, 'a closed follow-up has a verifying reading or a reason');
  });
  d.followUpEvents.forEach((x, i) => {
    if (!followUps.has(x.followUpId)) add(`followUpEvents.${i}.followUpId`, 'no follow-up with this id in the export');
    if (x.readingId !== null && !readings.has(x.readingId)) add(`followUpEvents.${i}.readingId`, 'no reading with this id in the export');
  });
  const planned = new Set<string>();
  d.plans.forEach((x, i) => {
    if (!areas.has(x.areaId)) add(`plans.${i}.areaId`, 'no area with this id in the export');
    if (planned.has(x.areaId)) add(`plans.${i}.areaId`, 'this area has two plans');
    planned.add(x.areaId);
  });
  const placed = new Set<string>();
  d.positions.forEach((x, i) => {
    if (!spots.has(x.spotId)) add(`positions.${i}.spotId`, 'no spot with this id in the export');
    if (!areas.has(x.areaId)) add(`positions.${i}.areaId`, 'no area with this id in the export');
    if (placed.has(x.spotId)) add(`positions.${i}.spotId`, 'this spot is placed twice');
    placed.add(x.spotId);
  });
  return out;
}
