/** Rounds: start (client-made id, idempotent), summary, readings, finish, skips. */
import {
  ReadingListSchema, RoundFinishSchema, RoundInputSchema, RoundSchema, RoundSummarySchema, SkipInputSchema, SkipSchema,
} from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const roundRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/rounds', tag: 'rounds', summary: 'Start a round', body: RoundInputSchema,
    description: 'The tablet makes the id (UUIDv7), so a round can start offline. 201 when stored, 200 for an identical retry, '
      + '409 for the same id with other content. Without plannedSpotIds every active spot of the site is planned, in route order.',
    responses: {
      201: { description: 'the new round', schema: RoundSchema },
      200: { description: 'the same round was already stored (a retry)', schema: RoundSchema },
    },
    errors: [400, 404, 409, 413, 415],
    handle: async ({ store, body }) => {
      const { round, created } = await store.createRound(body);
      return { status: created ? 201 : 200, body: round };
    },
  }),
  defineRoute({
    method: 'get', path: '/rounds/:id', tag: 'rounds', summary: 'A round with its summary', resource: 'round',
    description: 'Counts are over current revisions that are not deleted. notMeasured: planned spots neither measured nor skipped.',
    responses: { 200: { description: 'the round summary', schema: RoundSummarySchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const summary = await store.getRoundSummary(id);
      if (!summary) throw notFoundError('round', id);
      return { body: summary };
    },
  }),
  defineRoute({
    method: 'get', path: '/rounds/:id/readings', tag: 'rounds', summary: "The round's readings (current revisions)", resource: 'round',
    responses: { 200: { description: 'readings in the order taken', schema: ReadingListSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const readings = await store.listRoundReadings(id);
      if (!readings) throw notFoundError('round', id);
      return { body: { readings } };
    },
  }),
  defineRoute({
    method: 'post', path: '/rounds/:id/finish', tag: 'rounds', summary: 'Finish a round', resource: 'round', body: RoundFinishSchema,
    description: 'Finishing again with the same endedAt is harmless; with another endedAt it is a conflict.',
    responses: { 200: { description: 'the round summary', schema: RoundSummarySchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.finishRound(id, body) }),
  }),
  defineRoute({
    method: 'post', path: '/rounds/:id/skips', tag: 'rounds', summary: 'Skip a spot in a round, with a reason', resource: 'round',
    body: SkipInputSchema,
    description: 'Idempotent by the skip id (made by the tablet): 201 when stored, 200 for an identical retry, 409 for other content.',
    responses: {
      201: { description: 'the skip', schema: SkipSchema },
      200: { description: 'the same skip was already stored (a retry)', schema: SkipSchema },
    },
    errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => {
      const { skip, created } = await store.addSkip(id, body);
      return { status: created ? 201 : 200, body: skip };
    },
  }),
];
