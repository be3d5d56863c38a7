/** Field meters with their calibrated distance and calibration due date. */
import { MeterInputSchema, MeterSchema } from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const meterRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/meters', tag: 'set-up', summary: 'Create a meter', body: MeterInputSchema,
    responses: { 201: { description: 'the new meter', schema: MeterSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createMeter(body) }),
  }),
  defineRoute({
    method: 'get', path: '/meters/:id', tag: 'set-up', summary: 'Read a meter', resource: 'meter',
    responses: { 200: { description: 'the meter', schema: MeterSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const meter = await store.getMeter(id);
      if (!meter) throw notFoundError('meter', id);
      return { body: meter };
    },
  }),
  defineRoute({
    method: 'put', path: '/meters/:id', tag: 'set-up', summary: 'Update a meter', resource: 'meter', body: MeterInputSchema,
    description: 'Readings keep the calibrated distance and due date the meter had when they arrived.',
    responses: { 200: { description: 'the updated meter', schema: MeterSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.updateMeter(id, body) }),
  }),
];
