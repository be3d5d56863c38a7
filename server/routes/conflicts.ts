/** Resent readings whose content differed from the stored one, kept for review. */
import { ConflictListSchema } from '../../core/schemas';
import { defineRoute, type Route } from '../http/route';

export const conflictRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/conflicts', tag: 'readings', summary: 'Readings resent with the same id but other content',
    description: 'Never applied and never dropped: kept here, newest first, for a person to review.',
    responses: { 200: { description: 'conflicts, newest first', schema: ConflictListSchema } }, errors: [],
    handle: async ({ store }) => ({ body: { conflicts: await store.listConflicts() } }),
  }),
];
