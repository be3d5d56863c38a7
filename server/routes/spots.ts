/** Spots: the measured objects and places; retiring one; its readings. */
import {
  ReadingListQuerySchema, ReadingListSchema, RetireInputSchema, SpotInputSchema, SpotSchema,
} from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const spotRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/spots', tag: 'set-up', summary: 'Create a spot', body: SpotInputSchema,
    description: 'The code (printed on the QR label) is unique within the site, whatever the letter case.',
    responses: { 201: { description: 'the new spot', schema: SpotSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createSpot(body) }),
  }),
  defineRoute({
    method: 'get', path: '/spots/:id', tag: 'set-up', summary: 'Read a spot', resource: 'spot',
    responses: { 200: { description: 'the spot', schema: SpotSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const spot = await store.getSpot(id);
      if (!spot) throw notFoundError('spot', id);
      return { body: spot };
    },
  }),
  defineRoute({
    method: 'put', path: '/spots/:id', tag: 'set-up', summary: 'Update a spot', resource: 'spot', body: SpotInputSchema,
    responses: { 200: { description: 'the updated spot', schema: SpotSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.updateSpot(id, body) }),
  }),
  defineRoute({
    method: 'post', path: '/spots/:id/retire', tag: 'set-up', summary: 'Retire a spot', resource: 'spot', body: RetireInputSchema,
    description: 'Its readings stay; new rounds no longer plan it; readings that still arrive for it are stored and flagged spot-retired. '
      + 'Retiring a retired spot answers it unchanged.',
    responses: { 200: { description: 'the retired spot', schema: SpotSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.retireSpot(id, body.reason) }),
  }),
  defineRoute({
    method: 'get', path: '/spots/:id/readings', tag: 'readings', summary: "The spot's readings, newest first", resource: 'spot',
    description: 'Current revisions that are not deleted; with history=1 also superseded and deleted revisions. limit: 1 to 1000, default 100.',
    query: ReadingListQuerySchema,
    responses: { 200: { description: 'readings, newest first', schema: ReadingListSchema } }, errors: [400, 404],
    handle: async ({ store, id, query }) => {
      const history = query.history === '1' || query.history === 'true';
      const readings = await store.listSpotReadings(id, { history, limit: query.limit ?? 100 });
      if (!readings) throw notFoundError('spot', id);
      return { body: { readings } };
    },
  }),
];
