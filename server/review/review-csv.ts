/**
 * The ranked table of a weekly review as CSV (GET /api/sites/:id/review.csv): one
 * row per measured spot, in rank order, SI values with the unit in the header.
 */
import { toCsv } from '../../core/csv';
import type { WeeklyReview } from '../../core/schemas';

export const REVIEW_CSV_HEADER = [
  'rank', 'code', 'spot', 'area', 'readings', 'worst |field| (V/m)', 'median |field| (V/m)', 'worst verdict', 'worst ratio to alarm',
  'warn readings', 'alarm readings', 'why', 'previous week median |field| (V/m)', 'change (ratio of weekly medians)',
  'trend 8 weeks', 'trend p-value', 'trend slope (V/m per week)', 'week median RH (%)', 'site usual RH (%)', 'RH difference (points)',
  'open follow-ups',
] as const;

export function reviewCsv(review: WeeklyReview): string {
  const rows = review.spots.map((s) => [
    s.rank, s.code, s.name, s.areaName, s.readings, s.worstAbsFieldVPerM, s.medianAbsFieldVPerM, s.worstLevel, s.worstRatioToAlarm,
    s.exceedances.warn, s.exceedances.alarm, s.worstReason, s.change?.previousMedianAbsFieldVPerM ?? null, s.change?.ratio ?? null,
    s.trend.direction ?? 'not enough data', s.trend.pValue, s.trend.slopeVPerMPerWeek, s.humidity.weekMedianRhPercent,
    s.humidity.siteUsualRhPercent, s.humidity.differencePoints, s.openFollowUps.map((f) => f.action).join('; '),
  ]);
  return toCsv([[...REVIEW_CSV_HEADER], ...rows]);
}

/** A file name safe everywhere: "review-quillmere-converting-works-2026-W09.csv". */
export function fileSlug(text: string): string {
  return text.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'site';
}
