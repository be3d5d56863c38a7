/** Health: is the database open and did the start-up check pass. */
import { HealthSchema } from '../../core/schemas';
import { defineRoute, type Route } from '../http/route';

export const healthRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/health', tag: 'system', summary: 'Server and database status',
    description: '200 with status ok; 503 with status degraded when the database cannot be read.',
    responses: {
      200: { description: 'everything works', schema: HealthSchema },
      503: { description: 'the database cannot be read', schema: HealthSchema },
    },
    errors: [],
    handle: async ({ store }) => {
      const database = await store.health();
      return { status: database.ok ? 200 : 503, body: { status: database.ok ? 'ok' : 'degraded', database } };
    },
  }),
];
