/**
 * The tablet's calls to the trend, review, follow-up, plan, label and data
 * endpoints (issue 4), typed by the shared schemas in core/schemas. These screens
 * read from the network (they are desk and Monday-meeting screens); the open
 * follow-ups also travel with the set-up bundle for the round screen offline.
 */
import { api } from './api';
import type {
  FollowUp, FollowUpWithEvents, ImportPreview, ImportResult, Pin, PlanInfo, SiteImportResult, SpotTrend, TrendRange, WeeklyReview,
} from '../core/schemas';

export type { FollowUp, FollowUpWithEvents, Pin, SpotTrend, TrendRange, WeeklyReview };
export { FINDING_CLASSES, FINDING_CLASS_LABEL as FINDING_LABEL, TREND_RANGES, type FindingClass, type ReviewSpot } from '../core/schemas';

/** 'not-enough-data' answers from core/stats (never NaN). */
export interface NotEnough { status: 'not-enough-data'; reason: string; n: number }

export function isNotEnough(x: unknown): x is NotEnough {
  return !!x && typeof x === 'object' && (x as { status?: string }).status === 'not-enough-data';
}

const enc = encodeURIComponent;

// ---------- follow-ups ----------

export interface FollowUpEventView { kind: string; at: string; by: string; readingId: string | null; reason: string | null }

export function getFollowUp(id: string): Promise<FollowUpWithEvents> {
  return api<FollowUpWithEvents>('GET', `/api/follow-ups/${enc(id)}`);
}

export async function followUpsOfSpot(spotId: string): Promise<FollowUp[]> {
  const r = await api<{ followUps: FollowUp[] }>('GET', `/api/spots/${enc(spotId)}/follow-ups?status=all`);
  return r.followUps;
}

export async function openFollowUpsOfSite(siteId: string): Promise<FollowUp[]> {
  const r = await api<{ followUps: FollowUp[] }>('GET', `/api/sites/${enc(siteId)}/follow-ups?status=open`);
  return r.followUps;
}

export function reopenFollowUp(id: string, reason: string, by = ''): Promise<FollowUp> {
  return api<FollowUp>('POST', `/api/follow-ups/${enc(id)}/reopen`, { reason, by });
}

// ---------- trend ----------

export const TREND_RANGE_LABEL: Record<TrendRange, string> = { '4w': '4 weeks', '13w': '13 weeks', '1y': 'A year', all: 'All' };

export function loadTrend(spotId: string, range: TrendRange): Promise<SpotTrend> {
  return api<SpotTrend>('GET', `/api/spots/${enc(spotId)}/trend?range=${range}`);
}

// ---------- review ----------

export function loadReview(siteId: string, isoWeek: string): Promise<WeeklyReview> {
  return api<WeeklyReview>('GET', `/api/sites/${enc(siteId)}/review?week=${enc(isoWeek)}`);
}

export function reviewCsvUrl(siteId: string, isoWeek: string): string {
  return `/api/sites/${enc(siteId)}/review.csv?week=${enc(isoWeek)}`;
}

// ---------- plans ----------

export async function loadPins(areaId: string): Promise<{ plan: PlanInfo | null; pins: Pin[] }> {
  const r = await api<{ plan: PlanInfo | null; pins: Pin[] }>('GET', `/api/areas/${enc(areaId)}/pins`);
  return { plan: r.plan, pins: r.pins };
}

export function planUrl(areaId: string, version: string | number = ''): string {
  return `/api/areas/${enc(areaId)}/plan${version ? `?v=${enc(String(version))}` : ''}`;
}

export function setPosition(spotId: string, pos: { x: number; y: number } | null): Promise<unknown> {
  return api('PUT', `/api/spots/${enc(spotId)}/position`, pos ?? { x: null, y: null });
}

// ---------- labels ----------

export interface Label { spotId: string; code: string; name: string; areaName: string; url: string; qrSvg?: string }

export async function loadLabels(siteId: string): Promise<Label[]> {
  const r = await api<{ labels: Label[] }>('GET', `/api/sites/${enc(siteId)}/labels?base=${enc(location.origin)}`);
  return r.labels;
}

// ---------- data in and out ----------

export function readingsCsvUrl(siteId: string, from: string, to: string): string {
  const q = new URLSearchParams();
  if (from) q.set('from', from);
  if (to) q.set('to', to);
  const s = q.toString();
  return `/api/sites/${enc(siteId)}/readings.csv${s ? `?${s}` : ''}`;
}

export function siteJsonUrl(siteId: string): string {
  return `/api/sites/${enc(siteId)}/export.json`;
}

export function previewImport(siteId: string, body: unknown): Promise<ImportPreview> {
  return api<ImportPreview>('POST', `/api/sites/${enc(siteId)}/import/readings/preview`, body);
}

export function commitImport(siteId: string, body: unknown): Promise<ImportResult> {
  return api<ImportResult>('POST', `/api/sites/${enc(siteId)}/import/readings/commit`, body);
}

export function importSite(body: unknown): Promise<SiteImportResult> {
  return api<SiteImportResult>('POST', '/api/import/site.json', body);
}
