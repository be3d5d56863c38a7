/** Areas (EPA, hazardous zone, general) and the route order of their spots. */
import { AreaInputSchema, AreaSchema, RouteOrderSchema, SpotListSchema } from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const areaRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/areas', tag: 'set-up', summary: 'Create an area', body: AreaInputSchema,
    responses: { 201: { description: 'the new area', schema: AreaSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createArea(body) }),
  }),
  defineRoute({
    method: 'get', path: '/areas/:id', tag: 'set-up', summary: 'Read an area', resource: 'area',
    responses: { 200: { description: 'the area', schema: AreaSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const area = await store.getArea(id);
      if (!area) throw notFoundError('area', id);
      return { body: area };
    },
  }),
  defineRoute({
    method: 'put', path: '/areas/:id', tag: 'set-up', summary: 'Update an area', resource: 'area', body: AreaInputSchema,
    responses: { 200: { description: 'the updated area', schema: AreaSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.updateArea(id, body) }),
  }),
  defineRoute({
    method: 'put', path: '/areas/:id/route', tag: 'set-up', summary: "Set the order of the area's spots on the route", resource: 'area',
    description: 'The listed spots come first, in this order; the area\'s other spots follow in their previous order.',
    body: RouteOrderSchema,
    responses: { 200: { description: "the area's active spots in the new route order", schema: SpotListSchema } },
    errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: { spots: await store.setRouteOrder(id, body.spotIds) } }),
  }),
];
