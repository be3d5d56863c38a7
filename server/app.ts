/**
 * Assembly only: security headers, the API (strict JSON in, JSON out, every route
 * from routes/index.ts), the OpenAPI document, the static tablet client, and the
 * error handler LAST.
 */
import express, { type Express } from 'express';
import { z } from 'zod';
import { apiRoutes } from './routes';
import { errorHandler, HttpError } from './http/errors';
import { defineRoute, hasOwnBodyParser, mountRoutes, type Route } from './http/route';
import { noStore, requireJsonBody, securityHeaders } from './http/security';
import { staticClient } from './http/static-client';
import { buildOpenApi } from './openapi';
import type { Store } from './store/store';

export interface AppOptions {
  store: Store;
  /** Folder of the built client (index.html, assets/, the service worker). */
  clientDir: string;
  /** express.json limit, e.g. '1mb'. */
  bodyLimit: string;
  version?: string;
  log?: (message: string) => void;
}

const OpenApiDocumentSchema = z.looseObject({
  openapi: z.literal('3.1.0'),
  info: z.looseObject({ title: z.string(), version: z.string() }),
  paths: z.record(z.string(), z.unknown()),
}).meta({ id: 'OpenApiDocument' });

/** All API routes including the document that describes them. */
export function allRoutes(version = '0.0.0'): Route[] {
  let doc: unknown = null;
  const routes: Route[] = [...apiRoutes];
  routes.push(defineRoute({
    method: 'get', path: '/openapi.json', tag: 'system', summary: 'This OpenAPI 3.1 document',
    responses: { 200: { description: 'the OpenAPI document', schema: OpenApiDocumentSchema } }, errors: [],
    handle: async () => {
      doc ??= buildOpenApi(routes, { version });
      return { body: doc };
    },
  }));
  return routes;
}

export function buildApp(opts: AppOptions): Express {
  const app = express();
  app.disable('x-powered-by');
  app.use(securityHeaders);

  const api = express.Router();
  api.use(noStore);
  const routes = allRoutes(opts.version);
  // Routes that read their own body (a plan image, a large import) come before the global JSON parser.
  mountRoutes(api, routes.filter(hasOwnBodyParser), opts.store);
  api.use(requireJsonBody);
  api.use(express.json({ limit: opts.bodyLimit, type: 'application/json', strict: true }));
  mountRoutes(api, routes.filter((r) => !hasOwnBodyParser(r)), opts.store);
  api.use((req, _res, next) => {
    next(new HttpError(404, 'not-found', `no API route ${req.method} /api${req.path}; see /api/openapi.json`));
  });
  app.use('/api', api);

  app.use(staticClient(opts.clientDir));
  app.use((req, _res, next) => next(new HttpError(404, 'not-found', `nothing at ${req.method} ${req.path}`)));
  app.use(errorHandler(opts.log ?? ((m) => console.error(m))));
  return app;
}
