/**
 * Floor plans, spot positions, pins, spot labels and look-up by code (issue 4).
 *
 * A plan image is sent raw (Content-Type image/png, image/jpeg or image/svg+xml, at
 * most MAX_PLAN_IMAGE_BYTES). Its type is decided from its bytes, never from the
 * name or the header alone: another type, or bytes that do not match the header,
 * answer 415 naming the field 'plan'. An SVG is sanitized (core/plan) and the
 * answer lists what was removed. Plans are served with a CSP of their own that
 * runs nothing, loads nothing and allows only inline styles and data: images.
 */
import QRCode from 'qrcode';
import {
  LabelListSchema, LabelsQuerySchema, PinListSchema, PlanDeletedSchema, PlanUploadSchema, SpotByCodeQuerySchema, SpotPositionInputSchema,
  SpotPositionSchema, SpotSchema,
} from '../../core/schemas';
import { MAX_PLAN_IMAGE_BYTES, sanitizeSvg, sniffPlanImageType, SvgRejectedError, type PlanImageType } from '../../core/plan';
import { formatSi } from '../../core/units/format';
import { HttpError } from '../http/errors';
import { defineRoute, notFoundError, type Route } from '../http/route';
import { jpegSize, pngSize, sha256Hex, svgSize } from '../plans/image';

export const PLAN_TYPES: readonly PlanImageType[] = ['image/png', 'image/jpeg', 'image/svg+xml'];
export const PLAN_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:";

const NAMES: Record<PlanImageType, string> = { 'image/png': 'a PNG image', 'image/jpeg': 'a JPEG image', 'image/svg+xml': 'an SVG drawing' };

/** Checks and prepares an uploaded plan: the sniffed type must be the declared one; SVGs are sanitized. */
export function preparePlan(declared: string, raw: Buffer): { contentType: PlanImageType; bytes: Buffer; width: number | null; height: number | null; removed: string[] } {
  const field = [{ path: 'plan', message: 'must be a PNG, JPEG or SVG image whose bytes match its Content-Type' }];
  if (raw.length === 0) throw new HttpError(400, 'invalid', 'the plan image is empty', [{ path: 'plan', message: 'is empty' }]);
  let sniffed = sniffPlanImageType(raw);
  // An SVG led by a DOCTYPE is not sniffed as one; the sanitizer refuses it with the reason (entity tricks).
  if (sniffed === null && declared === 'image/svg+xml' && /<svg[\s>]/.test(raw.subarray(0, 4096).toString('utf8'))) sniffed = 'image/svg+xml';
  if (sniffed === null) {
    throw new HttpError(415, 'unsupported-media-type', `the plan is not a PNG, JPEG or SVG image (its bytes are none of these), although it was sent as ${declared}`, field);
  }
  if (sniffed !== declared) {
    throw new HttpError(415, 'unsupported-media-type', `the plan is ${NAMES[sniffed]} but was sent as ${declared}: send it with Content-Type ${sniffed}`, field);
  }
  if (sniffed === 'image/svg+xml') {
    let clean;
    try {
      clean = sanitizeSvg(raw.toString('utf8'));
    } catch (e) {
      if (e instanceof SvgRejectedError) throw new HttpError(400, 'invalid', `the plan SVG was refused: ${e.message}`, [{ path: 'plan', message: e.message }]);
      throw e;
    }
    const bytes = Buffer.from(clean.svg, 'utf8');
    const size = svgSize(clean.svg);
    return { contentType: sniffed, bytes, width: size?.width ?? null, height: size?.height ?? null, removed: clean.removed };
  }
  const size = sniffed === 'image/png' ? pngSize(raw) : jpegSize(raw);
  return { contentType: sniffed, bytes: raw, width: size?.width ?? null, height: size?.height ?? null, removed: [] };
}

const LEVEL_LABEL = { ok: 'OK', warn: 'Warn', alarm: 'Alarm' } as const;

export const planRoutes: Route[] = [
  defineRoute({
    method: 'put', path: '/areas/:id/plan', tag: 'plans', summary: "Upload the area's floor plan (PNG, JPEG or SVG)", resource: 'area',
    rawBody: { types: PLAN_TYPES, limitBytes: MAX_PLAN_IMAGE_BYTES, field: 'plan', what: 'the plan image' },
    description: `The raw image as the body, Content-Type image/png, image/jpeg or image/svg+xml, at most ${MAX_PLAN_IMAGE_BYTES / 1024 / 1024} MB. `
      + 'The type is decided from the bytes: another type or a mismatch answers 415 (field plan), a larger file 413. An SVG is sanitized '
      + '(no scripts, event handlers, external references); removed lists what was taken out. Replaces an earlier plan; positions stay.',
    responses: { 200: { description: 'the stored plan', schema: PlanUploadSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, rawBody, req }) => {
      const declared = (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
      const plan = preparePlan(declared, rawBody ?? Buffer.alloc(0));
      const info = await store.putAreaPlan(id, { contentType: plan.contentType, bytes: plan.bytes, width: plan.width, height: plan.height, sha256: sha256Hex(plan.bytes) });
      return { body: { ...info, removed: plan.removed } };
    },
  }),
  defineRoute({
    method: 'get', path: '/areas/:id/plan', tag: 'plans', summary: "The area's floor plan image", resource: 'area',
    description: `Served as stored, with Content-Security-Policy "${PLAN_CSP}" and X-Content-Type-Options nosniff. 404 when the area has no plan.`,
    responses: { 200: { description: 'the image', contentType: 'image/*' } }, errors: [404],
    handle: async ({ store, id }) => {
      const found = await store.getAreaPlan(id);
      if (!found) throw notFoundError('area', id);
      if (!found.plan) throw new HttpError(404, 'not-found', 'this area has no floor plan yet: upload one with PUT', [{ path: 'plan', message: 'none uploaded' }]);
      return {
        raw: {
          contentType: found.plan.info.contentType, body: found.plan.bytes,
          headers: { 'Content-Security-Policy': PLAN_CSP, 'X-Content-Type-Options': 'nosniff', 'Content-Disposition': 'inline', ETag: `"${found.plan.info.sha256}"` },
        },
      };
    },
  }),
  defineRoute({
    method: 'delete', path: '/areas/:id/plan', tag: 'plans', summary: "Remove the area's floor plan", resource: 'area',
    description: 'Spot positions stay, so a new plan of the same floor keeps them. deleted is false when there was no plan.',
    responses: { 200: { description: 'whether a plan was removed', schema: PlanDeletedSchema } }, errors: [404],
    handle: async ({ store, id }) => ({ body: { areaId: id, deleted: await store.deleteAreaPlan(id) } }),
  }),
  defineRoute({
    method: 'put', path: '/spots/:id/position', tag: 'plans', summary: "Place a spot on its area's plan", resource: 'spot', body: SpotPositionInputSchema,
    description: '{ x, y }: fractions 0..1 of the plan\'s width (from the left) and height (from the top); { x: null, y: null } unplaces the spot.',
    responses: { 200: { description: 'the position', schema: SpotPositionSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.setSpotPosition(id, body.x === null || body.y === null ? null : { x: body.x, y: body.y }) }),
  }),
  defineRoute({
    method: 'get', path: '/areas/:id/pins', tag: 'plans', summary: "The area's spots as plan pins with their latest status", resource: 'area',
    description: 'Active spots in route order, each with its position (null: not placed) and the verdict of its latest current reading, '
      + 'with a label in words (Alarm, Warn, OK, No reading) so status never rests on colour alone.',
    responses: { 200: { description: 'the pins', schema: PinListSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const found = await store.areaPins(id);
      if (!found) throw notFoundError('area', id);
      const pins = found.pins.map((p) => {
        const r = p.latest;
        const label = r ? LEVEL_LABEL[r.verdict.level] : 'No reading';
        return {
          spotId: p.spotId, code: p.code, name: p.name, position: p.position,
          latest: r ? { readingId: r.id, takenAt: r.takenAt, level: r.verdict.level, fieldVPerM: r.fieldVPerM } : null,
          label, text: r ? `${p.code} · ${label} · ${formatSi(Math.abs(r.fieldVPerM), 'V/m')}` : `${p.code} · ${label}`,
        };
      });
      return { body: { areaId: id, plan: found.plan, pins } };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/labels', tag: 'plans', summary: 'Spot labels: a QR code per spot, for a printed sheet', resource: 'site',
    query: LabelsQuerySchema,
    description: 'Active spots in route order. The QR code holds the app address that opens the spot in the current round '
      + '(<base>/#/scan/<code>); base defaults to the address this request came to.',
    responses: { 200: { description: 'the labels', schema: LabelListSchema } }, errors: [400, 404],
    handle: async ({ store, id, query, req }) => {
      const setup = await store.getSetup(id);
      if (!setup) throw notFoundError('site', id);
      const base = (query.base ?? `${req.protocol}://${req.get('host') ?? 'localhost'}`).replace(/\/+$/, '');
      const areaName = new Map(setup.areas.map((a) => [a.id, a.name]));
      const labels = await Promise.all(setup.spots.filter((s) => s.retiredAt === null).map(async (s) => {
        const path = `/#/scan/${encodeURIComponent(s.code)}`;
        const url = `${base}${path}`;
        return {
          spotId: s.id, code: s.code, name: s.name, areaName: areaName.get(s.areaId) ?? '', path, url,
          qrSvg: await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 2 }),
        };
      }));
      return { body: { labels } };
    },
  }),
  defineRoute({
    method: 'get', path: '/spots/by-code/:code', tag: 'plans', summary: 'Find a spot by its label code', query: SpotByCodeQuerySchema,
    description: 'siteId is required (codes are unique within a site). Letter case does not matter.',
    responses: { 200: { description: 'the spot', schema: SpotSchema } }, errors: [400, 404],
    handle: async ({ store, query, params }) => {
      const code = params.code ?? '';
      const spot = await store.getSpotByCode(query.siteId, code);
      if (!spot) throw new HttpError(404, 'not-found', `no spot with the code ${code.slice(0, 40)} at this site`, [{ path: 'code', message: 'no spot with this code' }]);
      return { body: spot };
    },
  }),
];
