/**
 * Follow-ups (issue 4): corrective actions opened from a hot spot; closed by a
 * verifying reading within limits or a written reason; every step kept.
 */
import {
  FollowUpCloseSchema, FollowUpEditSchema, FollowUpInputSchema, FollowUpListQuerySchema, FollowUpListSchema, FollowUpReopenSchema,
  FollowUpWithEventsSchema,
} from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const followUpRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/follow-ups', tag: 'follow-ups', summary: 'Open a follow-up on a spot', body: FollowUpInputSchema,
    description: 'A corrective action: finding class, what to do, who, due date; optionally the reading that showed the problem (of the same spot). '
      + 'It shows on the spot, in the review and (through the set-up bundle) on the round screen.',
    responses: { 201: { description: 'the new follow-up with its history', schema: FollowUpWithEventsSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createFollowUp(body) }),
  }),
  defineRoute({
    method: 'get', path: '/follow-ups/:id', tag: 'follow-ups', summary: 'A follow-up with its history', resource: 'follow-up',
    responses: { 200: { description: 'the follow-up and its events, oldest first', schema: FollowUpWithEventsSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const f = await store.getFollowUp(id);
      if (!f) throw notFoundError('follow-up', id);
      return { body: f };
    },
  }),
  defineRoute({
    method: 'put', path: '/follow-ups/:id', tag: 'follow-ups', summary: 'Edit a follow-up (class, action, assignee, due date)', resource: 'follow-up',
    body: FollowUpEditSchema, description: 'Only the fields given change; the history records each change with its old and new value.',
    responses: { 200: { description: 'the follow-up with its history', schema: FollowUpWithEventsSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.editFollowUp(id, body) }),
  }),
  defineRoute({
    method: 'post', path: '/follow-ups/:id/close', tag: 'follow-ups', summary: 'Close a follow-up', resource: 'follow-up', body: FollowUpCloseSchema,
    description: 'With { verifyingReadingId }: a current reading of the same spot, taken after the follow-up was opened, within limits (verdict ok); '
      + 'it is linked. Otherwise 409 saying why. Or with { reason }: a written reason. 409 when already closed.',
    responses: { 200: { description: 'the closed follow-up with its history', schema: FollowUpWithEventsSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.closeFollowUp(id, body) }),
  }),
  defineRoute({
    method: 'post', path: '/follow-ups/:id/reopen', tag: 'follow-ups', summary: 'Reopen a closed follow-up', resource: 'follow-up', body: FollowUpReopenSchema,
    responses: { 200: { description: 'the reopened follow-up with its history', schema: FollowUpWithEventsSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.reopenFollowUp(id, body) }),
  }),
  defineRoute({
    method: 'get', path: '/spots/:id/follow-ups', tag: 'follow-ups', summary: "The spot's follow-ups", resource: 'spot', query: FollowUpListQuerySchema,
    description: 'status: open, closed or all (default all). Open ones first by due date, then closed ones, newest first.',
    responses: { 200: { description: 'follow-ups', schema: FollowUpListSchema } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      const list = await store.listSpotFollowUps(id, query.status ?? 'all');
      if (!list) throw notFoundError('spot', id);
      return { body: { followUps: list } };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/follow-ups', tag: 'follow-ups', summary: "The site's follow-ups", resource: 'site', query: FollowUpListQuerySchema,
    description: 'status: open (default), closed or all. The open ones also come with GET /api/sites/:id/setup for the round screen offline.',
    responses: { 200: { description: 'follow-ups', schema: FollowUpListSchema } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      const list = await store.listSiteFollowUps(id, query.status ?? 'open');
      if (!list) throw notFoundError('site', id);
      return { body: { followUps: list } };
    },
  }),
];
