/** Limit sets: warn and alarm levels per metric, each with its source. */
import { LimitSetInputSchema, LimitSetSchema } from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const limitSetRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/limit-sets', tag: 'set-up', summary: 'Create a limit set', body: LimitSetInputSchema,
    responses: { 201: { description: 'the new limit set', schema: LimitSetSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createLimitSet(body) }),
  }),
  defineRoute({
    method: 'get', path: '/limit-sets/:id', tag: 'set-up', summary: 'Read a limit set', resource: 'limit set',
    responses: { 200: { description: 'the limit set', schema: LimitSetSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const ls = await store.getLimitSet(id);
      if (!ls) throw notFoundError('limit set', id);
      return { body: ls };
    },
  }),
  defineRoute({
    method: 'put', path: '/limit-sets/:id', tag: 'set-up', summary: 'Update a limit set', resource: 'limit set',
    description: 'Verdicts are recomputed from the stored readings with the current rules, so a change applies to past readings too.',
    body: LimitSetInputSchema,
    responses: { 200: { description: 'the updated limit set', schema: LimitSetSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.updateLimitSet(id, body) }),
  }),
];
