/**
 * The tablet's view of the trend, review, follow-up, plan, label and data
 * endpoints (issue 4). These screens read from the network (they are desk and
 * Monday-meeting screens); only the open follow-ups are cached for the round.
 *
 * The shapes here are what the screens read; every field the server may leave
 * out is optional, and the screens never crash on a missing or non-finite value.
 */
import { api } from './api';
import type { VerdictLevel } from '../core/limits';

// ---------- shared ----------

/** 'not-enough-data' answers from core/stats (never NaN). */
export interface NotEnough { status: 'not-enough-data'; reason: string; n?: number }

export function isNotEnough(x: unknown): x is NotEnough {
  return !!x && typeof x === 'object' && (x as { status?: string }).status === 'not-enough-data';
}

const enc = encodeURIComponent;

// ---------- follow-ups ----------

export const FINDING_CLASSES = ['observation', 'minor-nonconformance', 'major-nonconformance'] as const;
export type FindingClass = (typeof FINDING_CLASSES)[number];
export const FINDING_LABEL: Record<FindingClass, string> = {
  observation: 'Observation',
  'minor-nonconformance': 'Minor nonconformance',
  'major-nonconformance': 'Major nonconformance',
};

export interface FollowUpEvent {
  id?: string;
  /** opened | closed | reopened (| edited ...) */
  kind?: string;
  type?: string;
  at: string;
  by?: string | null;
  reason?: string | null;
  verifyingReadingId?: string | null;
}

export interface FollowUp {
  id: string;
  siteId?: string;
  spotId: string;
  openedFromReadingId?: string | null;
  findingClass: FindingClass;
  action: string;
  assignee: string;
  /** 'YYYY-MM-DD' */
  dueDate: string;
  status: 'open' | 'closed';
  openedAt?: string;
  createdAt?: string;
  closedAt?: string | null;
  closedReason?: string | null;
  closeReason?: string | null;
  verifyingReadingId?: string | null;
  events?: FollowUpEvent[];
  /** Set by the tablet while a close waits in the outbox. */
  pendingClose?: boolean;
  spotCode?: string;
  spotName?: string;
}

export interface FollowUpInput {
  spotId: string;
  openedFromReadingId?: string;
  findingClass: FindingClass;
  action: string;
  assignee: string;
  dueDate: string;
}

export function openedAtOf(f: FollowUp): string | null {
  return f.openedAt ?? f.createdAt ?? f.events?.find((e) => (e.kind ?? e.type) === 'opened')?.at ?? null;
}

export function createFollowUp(input: FollowUpInput): Promise<FollowUp> {
  return api<FollowUp>('POST', '/api/follow-ups', input);
}

export async function getFollowUp(id: string): Promise<FollowUp> {
  const r = await api<FollowUp | { followUp: FollowUp; events?: FollowUpEvent[] }>('GET', `/api/follow-ups/${enc(id)}`);
  if ('followUp' in r) return { ...r.followUp, events: r.events ?? r.followUp.events ?? [] };
  return r;
}

export async function followUpsOfSpot(spotId: string): Promise<FollowUp[]> {
  const r = await api<{ followUps: FollowUp[] }>('GET', `/api/spots/${enc(spotId)}/follow-ups`);
  return r.followUps ?? [];
}

export async function openFollowUpsOfSite(siteId: string): Promise<FollowUp[]> {
  const r = await api<{ followUps: FollowUp[] }>('GET', `/api/sites/${enc(siteId)}/follow-ups?status=open`);
  return r.followUps ?? [];
}

export function reopenFollowUp(id: string, reason: string): Promise<FollowUp> {
  return api<FollowUp>('POST', `/api/follow-ups/${enc(id)}/reopen`, { reason });
}

// ---------- trend ----------

export const TREND_RANGES = ['4w', '13w', '1y', 'all'] as const;
export type TrendRange = (typeof TREND_RANGES)[number];
export const TREND_RANGE_LABEL: Record<TrendRange, string> = { '4w': '4 weeks', '13w': '13 weeks', '1y': 'A year', all: 'All' };

export interface TrendPointDto {
  readingId?: string;
  id?: string;
  takenAt: string;
  fieldVPerM: number;
  level: VerdictLevel;
  rhPercent: number | null;
  chargeC?: number | null;
  value?: number;
  unit?: string;
  polarity?: '+' | '-';
}

export interface TrendSummaryDto {
  status: 'ok';
  n: number;
  slopePerWeek: number;
  slopeLowerPerWeek?: number;
  slopeUpperPerWeek?: number;
  levelAtCentre?: number;
  centreMs?: number;
  pValue: number;
  significant: boolean;
  direction: 'increasing' | 'decreasing' | 'no trend' | string;
  alpha?: number;
}

export interface HumidityDto {
  status: 'ok';
  n: number;
  slopeLog10PerRhPoint: number;
  percentChangePerRhPoint: number;
  pValue: number;
  rSquared?: number;
  significant: boolean;
  alpha?: number;
}

export interface Bands { warn: number | null; alarm: number | null; metric?: string; source?: string }

export interface TrendResponse {
  spotId?: string;
  range?: string;
  from?: string | null;
  to?: string | null;
  points: TrendPointDto[];
  bands?: Bands | null;
  trend?: TrendSummaryDto | NotEnough | null;
  humidity?: HumidityDto | NotEnough | null;
  sentence?: string;
}

export function loadTrend(spotId: string, range: TrendRange): Promise<TrendResponse> {
  return api<TrendResponse>('GET', `/api/spots/${enc(spotId)}/trend?range=${range}`);
}

// ---------- review ----------

export interface ReviewSpot {
  spotId: string;
  code: string;
  name: string;
  areaId?: string;
  areaName?: string;
  rank?: number;
  level?: VerdictLevel;
  worstLevel?: VerdictLevel;
  worstVPerM?: number | null;
  worstFieldVPerM?: number | null;
  medianVPerM?: number | null;
  medianFieldVPerM?: number | null;
  ratioToAlarm?: number | null;
  readings?: number;
  exceedances?: number;
  warnCount?: number;
  alarmCount?: number;
  change?: { previousWorstVPerM?: number | null; ratio?: number | null; percent?: number | null; text?: string } | null;
  changePercent?: number | null;
  previousWorstVPerM?: number | null;
  trend?: TrendSummaryDto | NotEnough | null;
  humidity?: { meanRh?: number | null; medianRh?: number | null; text?: string } | null;
  rhPercent?: number | null;
  openFollowUps?: FollowUp[] | number;
  worstReadingId?: string | null;
}

export interface ReviewNotMeasured { spotId: string; code: string; name: string; areaName?: string; reason?: string | null }

export interface ReviewResponse {
  site: { id: string; name: string; timeZone?: string };
  week: { isoWeek: string; label?: string; firstDay?: string; lastDay?: string; startMs?: number; endMs?: number } | string;
  summary: string[] | string;
  spots: ReviewSpot[];
  notMeasured: ReviewNotMeasured[];
  humidity?: { medianRh?: number | null; usualRh?: number | null; differencePoints?: number | null; text?: string; sentence?: string } | null;
  caution: string;
  generatedAt?: string;
}

export function loadReview(siteId: string, isoWeek: string): Promise<ReviewResponse> {
  return api<ReviewResponse>('GET', `/api/sites/${enc(siteId)}/review?week=${enc(isoWeek)}`);
}

export function reviewCsvUrl(siteId: string, isoWeek: string): string {
  return `/api/sites/${enc(siteId)}/review.csv?week=${enc(isoWeek)}`;
}

// ---------- plans ----------

export interface Pin {
  spotId: string;
  code: string;
  name: string;
  x: number | null;
  y: number | null;
  level?: VerdictLevel | null;
  lastTakenAt?: string | null;
  retired?: boolean;
}

export async function loadPins(areaId: string): Promise<Pin[]> {
  const r = await api<{ pins: Pin[] }>('GET', `/api/areas/${enc(areaId)}/pins`);
  return r.pins ?? [];
}

export function planUrl(areaId: string, version: string | number = ''): string {
  return `/api/areas/${enc(areaId)}/plan${version ? `?v=${enc(String(version))}` : ''}`;
}

export function setPosition(spotId: string, pos: { x: number; y: number } | null): Promise<unknown> {
  return api('PUT', `/api/spots/${enc(spotId)}/position`, pos ?? { x: null, y: null });
}

// ---------- labels ----------

export interface Label { spotId: string; code: string; name: string; areaName?: string; areaId?: string; url: string; qrSvg?: string }

export async function loadLabels(siteId: string): Promise<Label[]> {
  const r = await api<{ labels: Label[] }>('GET', `/api/sites/${enc(siteId)}/labels`);
  return r.labels ?? [];
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
