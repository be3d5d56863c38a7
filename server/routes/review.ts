/** The spot trend and the weekly hot-spot review (issue 4), and the review as CSV. */
import {
  ReviewQuerySchema, SpotTrendSchema, TrendQuerySchema, WeeklyReviewSchema,
} from '../../core/schemas';
import { parseIsoWeek } from '../../core/time';
import { HttpError } from '../http/errors';
import { defineRoute, notFoundError, type Route } from '../http/route';
import { fileSlug, reviewCsv } from '../review/review-csv';
import { spotTrend } from '../review/trend';
import { weeklyReview } from '../review/weekly';

function checkWeek(week: string | undefined): void {
  if (week !== undefined && parseIsoWeek(week) === null) {
    throw new HttpError(400, 'invalid', `the query is not valid: week: ${week} is not an ISO week (weeks run 1 to 52, or 53 in some years)`,
      [{ path: 'week', message: 'must be an ISO week like 2026-W09 that exists' }]);
  }
}

export const reviewRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/spots/:id/trend', tag: 'review', summary: "A spot's trend: points, limit bands, robust trend, humidity relation", resource: 'spot',
    query: TrendQuerySchema,
    description: 'range: 4w, 13w, 1y (default) or all, ending now. Points: every current reading (field, verdict level, RH: the reading\'s or its '
      + "round's, charge estimate where the spot has a model). trendSummary: Theil–Sen slope per week and Mann–Kendall p over one point per local "
      + 'day (median |field|); humidity: slope of log10 |field| against RH over every reading with RH.',
    responses: { 200: { description: 'the trend', schema: SpotTrendSchema } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      const t = await spotTrend(store, id, query.range ?? '1y', Date.now());
      if (!t) throw notFoundError('spot', id);
      return { body: t };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/review', tag: 'review', summary: 'The weekly hot-spot review', resource: 'site', query: ReviewQuerySchema,
    description: "week: an ISO week (2026-W09); default the last complete week in the site's time zone (Monday 00:00 to Monday 00:00 local). "
      + 'Spots ranked by severity (worst ratio to an alarm level, then alarm and warn counts, then the 8-week trend), with change from the '
      + 'previous week (ratio of weekly medians of |field|), 8-week trend over weekly medians, humidity against the 13 weeks before, open '
      + 'follow-ups; spots due but not measured; plain summary sentences; the caution text.',
    responses: { 200: { description: 'the review', schema: WeeklyReviewSchema } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      checkWeek(query.week);
      const r = await weeklyReview(store, id, query.week, Date.now());
      if (!r) throw notFoundError('site', id);
      return { body: r };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/review.csv', tag: 'review', summary: 'The weekly review\'s ranked table as CSV', resource: 'site', query: ReviewQuerySchema,
    description: 'The same week and ranking as GET /api/sites/:id/review; one row per measured spot, values in SI with the unit in the header.',
    responses: { 200: { description: 'CSV (RFC 4180), UTF-8, as an attachment', contentType: 'text/csv' } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      checkWeek(query.week);
      const r = await weeklyReview(store, id, query.week, Date.now());
      if (!r) throw notFoundError('site', id);
      return {
        raw: {
          contentType: 'text/csv; charset=utf-8', body: reviewCsv(r),
          headers: { 'Content-Disposition': `attachment; filename="review-${fileSlug(r.site.name)}-${r.week.isoWeek}.csv"` },
        },
      };
    },
  }),
];
