/** Starter limit sets from core/hazard/templates.ts, every number with its source. */
import { LIMIT_TEMPLATES } from '../../core/hazard/templates';
import { LimitTemplateListSchema } from '../../core/schemas';
import { defineRoute, type Route } from '../http/route';

export const limitTemplateRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/limit-templates', tag: 'set-up', summary: 'Starter limit sets, every number with its source',
    description: 'Copy one into a limit set and check it against the site\'s copy of the standards (SAFETY.md).',
    responses: { 200: { description: 'templates for EPA, general, dust zones and gas zones by group', schema: LimitTemplateListSchema } },
    errors: [],
    handle: async () => ({ body: { templates: LIMIT_TEMPLATES } }),
  }),
];
