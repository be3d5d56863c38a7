/** Sites: list, create, read, update; the offline set-up bundle; the site's rounds. */
import {
  RoundListSchema, SetupBundleSchema, SiteInputSchema, SiteListSchema, SiteSchema,
} from '../../core/schemas';
import { defineRoute, notFoundError, type Route } from '../http/route';

export const siteRoutes: Route[] = [
  defineRoute({
    method: 'get', path: '/sites', tag: 'set-up', summary: 'List the sites',
    responses: { 200: { description: 'every site, by name', schema: SiteListSchema } }, errors: [],
    handle: async ({ store }) => ({ body: { sites: await store.listSites() } }),
  }),
  defineRoute({
    method: 'post', path: '/sites', tag: 'set-up', summary: 'Create a site', body: SiteInputSchema,
    responses: { 201: { description: 'the new site', schema: SiteSchema } }, errors: [400, 409, 413, 415],
    handle: async ({ store, body }) => ({ status: 201, body: await store.createSite(body) }),
  }),
  defineRoute({
    method: 'get', path: '/sites/:id', tag: 'set-up', summary: 'Read a site', resource: 'site',
    responses: { 200: { description: 'the site', schema: SiteSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const site = await store.getSite(id);
      if (!site) throw notFoundError('site', id);
      return { body: site };
    },
  }),
  defineRoute({
    method: 'put', path: '/sites/:id', tag: 'set-up', summary: 'Update a site', resource: 'site', body: SiteInputSchema,
    responses: { 200: { description: 'the updated site', schema: SiteSchema } }, errors: [400, 404, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.updateSite(id, body) }),
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/setup', tag: 'set-up', resource: 'site',
    summary: 'Everything a tablet needs to walk the site offline',
    description: 'The site with its areas, spots (retired ones too, with retiredAt), meters and limit sets.',
    responses: { 200: { description: 'the set-up bundle', schema: SetupBundleSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const setup = await store.getSetup(id);
      if (!setup) throw notFoundError('site', id);
      return { body: setup };
    },
  }),
  defineRoute({
    method: 'get', path: '/sites/:id/rounds', tag: 'rounds', summary: "The site's rounds, newest first", resource: 'site',
    responses: { 200: { description: 'rounds, newest first', schema: RoundListSchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const rounds = await store.listRounds(id);
      if (!rounds) throw notFoundError('site', id);
      return { body: { rounds } };
    },
  }),
];
