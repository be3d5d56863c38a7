/**
 * Data in and out (issue 4): readings as CSV, CSV import of readings (preview and
 * commit, all or nothing, re-import adds nothing), and a whole site as JSON with its
 * import into another instance.
 */
import {
  ImportPreviewSchema, ImportResultSchema, ReadingImportSchema, ReadingsCsvQuerySchema, SiteExportSchema, SiteImportResultSchema,
  type ReadingImport,
} from '../../core/schemas';
import { civilDateAddDays, startOfLocalDay } from '../../core/time';
import { checkSiteExport } from '../exchange/site-json';
import { prepareImport, type PreparedImport } from '../exchange/import-readings';
import { readingsCsv } from '../exchange/readings-csv';
import { HttpError } from '../http/errors';
import { defineRoute, notFoundError, type Route } from '../http/route';
import { fileSlug } from '../review/review-csv';
import type { Store } from '../store/store';

/** A query bound: a date is a whole local day of the site (from: its start; to: the end of that day); a date-time is exact. */
function bound(text: string | undefined, timeZone: string, end: boolean): number | null {
  if (text === undefined) return null;
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return Date.parse(text);
  const day = { year: Number(m[1]), month: Number(m[2]), day: Number(m[3]) };
  return startOfLocalDay(end ? civilDateAddDays(day, 1) : day, timeZone);
}

async function prepared(store: Store, siteId: string, body: ReadingImport): Promise<PreparedImport> {
  const setup = await store.getSetup(siteId);
  if (!setup) throw notFoundError('site', siteId);
  return prepareImport(setup, body);
}

const IMPORT_DOC = 'Body: { csv, delimiter?, header? (default true), mapping: { field: column index (0 first) or header text }, '
  + 'defaults: { meterId, unit, distance, surveyor, zeroed }, skipInvalid? }. Fields: spot (code or name), takenAt (ISO with offset, or the '
  + 'site\'s local time without one), value (a negative value sets polarity - unless a polarity column says otherwise), unit, polarity, distance '
  + '("10" or "10 cm"), distanceUnit, rhPercent, temperatureC, meter (serial), surveyor, note, zeroed. Rows go into one import round per local day '
  + 'and surveyor; ids are derived from the content, so importing the same file again stores nothing twice. Every invalid row is listed with its '
  + 'line number in the file (row), the field and the reason.';

export const exchangeRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/sites/:id/readings.csv', tag: 'data', summary: "The site's readings as CSV", resource: 'site', query: ReadingsCsvQuerySchema,
    description: "from, to: dates (the site's calendar, both days included) or date-times with offset; default everything. Value and unit as "
      + 'entered, normalized field, distance as entered, charge estimate where the spot has a model, verdict and reason, RH, temperature, '
      + 'meter, surveyor, round and reading ids; superseded revisions included and marked, deleted ones marked.',
    responses: { 200: { description: 'CSV (RFC 4180), UTF-8, as an attachment', contentType: 'text/csv' } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      const site = await store.getSite(id);
      if (!site) throw notFoundError('site', id);
      const from = bound(query.from, site.timeZone, false);
      const to = bound(query.to, site.timeZone, true);
      if (from !== null && to !== null && to <= from) {
        throw new HttpError(400, 'invalid', 'the query is not valid: to must be after from', [{ path: 'to', message: 'must be after from' }]);
      }
      const data = await store.exportReadings(id, from, to);
      if (!data) throw notFoundError('site', id);
      const name = `readings-${fileSlug(site.name)}${query.from ? `-from-${query.from.slice(0, 10)}` : ''}${query.to ? `-to-${query.to.slice(0, 10)}` : ''}.csv`;
      return { raw: { contentType: 'text/csv; charset=utf-8', body: readingsCsv(data.setup, data.readings), headers: { 'Content-Disposition': `attachment; filename="${name}"` } } };
    },
  }),
  defineRoute({
    method: 'post', path: '/sites/:id/import/readings/preview', tag: 'data', summary: 'Check a CSV of readings before importing it', resource: 'site',
    body: ReadingImportSchema, jsonLimit: '32mb',
    description: `${IMPORT_DOC} Nothing is stored. alreadyImported: valid rows stored by an earlier import of the same content.`,
    responses: { 200: { description: 'the preview', schema: ImportPreviewSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => {
      const p = await prepared(store, id, body);
      const existing = await store.existingReadingIds(p.valid.map((v) => v.input.id));
      return {
        body: {
          rows: p.rows, valid: p.valid.length, invalid: p.invalid, alreadyImported: existing.size, rounds: new Set(p.valid.map((v) => v.input.roundId)).size,
          columns: p.columns,
          sample: p.valid.slice(0, 10).map((v) => ({
            row: v.row, spotCode: v.spotCode, takenAt: v.input.takenAt, value: v.input.value, unit: v.input.unit, polarity: v.input.polarity,
            fieldVPerM: v.fieldVPerM, distance: v.input.distance, rhPercent: v.input.rhPercent, surveyor: v.surveyor, readingId: v.input.id,
          })),
        },
      };
    },
  }),
  defineRoute({
    method: 'post', path: '/sites/:id/import/readings/commit', tag: 'data', summary: 'Import a CSV of readings (all valid rows in one transaction)', resource: 'site',
    body: ReadingImportSchema, jsonLimit: '32mb',
    description: `${IMPORT_DOC} Any invalid row answers 400 listing them (fields: rows.<line>.<field>) and stores nothing, unless skipInvalid is true; `
      + 'then the valid rows go in ONE transaction, or nothing does.',
    responses: { 200: { description: 'what was stored', schema: ImportResultSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => {
      const p = await prepared(store, id, body);
      if (p.invalid.length > 0 && !body.skipInvalid) {
        const rows = new Set(p.invalid.map((x) => x.row)).size;
        throw new HttpError(400, 'invalid',
          `${rows} ${rows === 1 ? 'row is' : 'rows are'} not valid, so nothing was imported: fix ${rows === 1 ? 'it' : 'them'}, or send skipInvalid: true to import the ${p.valid.length} valid rows`,
          p.invalid.slice(0, 200).map((x) => ({ path: `rows.${x.row}.${x.field}`, message: `line ${x.row}: ${x.reason}` })));
      }
      if (p.valid.length === 0) throw new HttpError(400, 'invalid', 'no row of the file is valid: nothing to import', [{ path: 'csv', message: 'no valid row' }]);
      const used = new Set(p.valid.map((v) => v.input.roundId));
      const { acks, roundsCreated } = await store.importReadings({
        rounds: [...p.rounds.values()].filter((r) => used.has(r.input.id)),
        readings: p.valid.map((v) => v.input),
      });
      const count = (s: string) => acks.filter((a) => a.status === s).length;
      return {
        body: {
          rows: p.rows, valid: p.valid.length, invalid: p.invalid, stored: count('stored'), duplicates: count('duplicate'), conflicts: count('conflict'),
          rounds: roundsCreated,
        },
      };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/export.json', tag: 'data', summary: 'The whole site as JSON', resource: 'site',
    description: 'Set-up, rounds, skips, every reading revision (history, tombstones, kept conflicts), follow-ups with their events, floor plans '
      + '(base64) and spot positions; stored inputs only. POST it to /api/import/site.json on another instance.',
    responses: { 200: { description: 'the site export, as an attachment', schema: SiteExportSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const data = await store.exportSite(id);
      if (!data) throw notFoundError('site', id);
      return {
        raw: {
          contentType: 'application/json; charset=utf-8', body: JSON.stringify(data),
          headers: { 'Content-Disposition': `attachment; filename="site-${fileSlug(data.site.name)}-${data.exportedAt.slice(0, 10)}.json"` },
        },
      };
    },
  }),
  defineRoute({
    method: 'post', path: '/import/site.json', tag: 'data', summary: 'Import a whole site exported by chargewalk', body: SiteExportSchema, jsonLimit: '200mb',
    description: 'Into an instance that does not hold the site: 409 when the site id (or any other id of the export) is already stored. '
      + 'The export is checked whole first (400 naming each problem by path), then imported in ONE transaction.',
    responses: { 201: { description: 'the imported site and its row counts', schema: SiteImportResultSchema } }, errors: [400, 409, 413, 415],
    handle: async ({ store, body }) => {
      const problems = checkSiteExport(body);
      if (problems.length > 0) {
        throw new HttpError(400, 'invalid', `the site export does not hold together: ${problems[0]!.path}: ${problems[0]!.message}${problems.length > 1 ? ` (and ${problems.length - 1} more)` : ''}`, problems);
      }
      const counts = await store.importSite(body);
      return { status: 201, body: { siteId: body.site.id, counts } };
    },
  }),
];
