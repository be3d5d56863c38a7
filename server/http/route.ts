/**
 * A route is declared once, with the zod schemas of its body, query and answers;
 * the same declaration mounts the Express handler and writes the OpenAPI entry,
 * so the document cannot drift from what the server does.
 *
 * The handler receives input already parsed (a bad body is a 400 with field paths
 * before it runs; a path id that is not a UUID is a 404 naming the field 'id').
 */
import type { Request, Router } from 'express';
import type { z } from 'zod';
import { Id } from '../../core/schemas';
import type { Store } from '../store/store';
import { fromZodError, HttpError } from './errors';

type Output<S> = S extends z.ZodType ? z.output<S> : undefined;

export interface RouteContext<B, Q> {
  body: B;
  query: Q;
  /** The path's :id, checked to be a UUID ('' when the path has none). */
  id: string;
  store: Store;
  req: Request;
}

export interface Reply {
  status?: number;
  body: unknown;
}

export interface ResponseDoc {
  description: string;
  schema?: z.ZodType;
}

export interface RouteSpec<B extends z.ZodType | undefined, Q extends z.ZodType | undefined> {
  method: 'get' | 'post' | 'put';
  /** Express path under /api, e.g. '/spots/:id/readings'. */
  path: string;
  tag: string;
  summary: string;
  description?: string;
  /** What the :id names, for the 404 message ("no spot with id ..."). */
  resource?: string;
  /** Parsed before the handler runs. */
  body?: B;
  /** Documented only: the handler parses the body itself (POST /api/readings, which takes one reading or a batch). */
  bodyDoc?: z.ZodType;
  query?: Q;
  responses: Record<number, ResponseDoc>;
  /** Error statuses this route can answer (documented with the Error envelope). */
  errors: number[];
  handle: (ctx: RouteContext<Output<B>, Output<Q>>) => Promise<Reply>;
}

/** A declared route with its types erased, as the router and the OpenAPI builder see it. */
export interface Route {
  method: 'get' | 'post' | 'put';
  path: string;
  tag: string;
  summary: string;
  description?: string;
  resource?: string;
  body?: z.ZodType;
  bodyDoc?: z.ZodType;
  query?: z.ZodType;
  responses: Record<number, ResponseDoc>;
  errors: number[];
  handle: (ctx: RouteContext<unknown, unknown>) => Promise<Reply>;
}

export function defineRoute<B extends z.ZodType | undefined = undefined, Q extends z.ZodType | undefined = undefined>(
  spec: RouteSpec<B, Q>,
): Route {
  return spec as unknown as Route;
}

/** Throws 404 with field 'id' unless `raw` is a UUID. */
export function parseId(raw: string | undefined, resource = 'record'): string {
  const r = Id.safeParse(raw);
  if (!r.success) {
    throw new HttpError(404, 'not-found', `no ${resource} with id '${String(raw).slice(0, 80)}' (not a UUID)`, [{ path: 'id', message: 'must be a UUID' }]);
  }
  return r.data;
}

export function notFoundError(resource: string, id: string): HttpError {
  return new HttpError(404, 'not-found', `no ${resource} with id ${id}`, [{ path: 'id', message: `no ${resource} with this id` }]);
}

export function mountRoutes(router: Router, routes: Route[], store: Store): void {
  for (const route of routes) {
    router[route.method](route.path, async (req, res) => {
      const params = req.params as Record<string, string | undefined>;
      const id = route.path.includes(':id') ? parseId(params.id, route.resource) : '';
      let body: unknown;
      if (route.body) {
        if (req.body === undefined) {
          throw new HttpError(400, 'invalid', 'a JSON body is required (Content-Type: application/json)', [{ path: '(body)', message: 'is required' }]);
        }
        const r = route.body.safeParse(req.body);
        if (!r.success) throw fromZodError(r.error);
        body = r.data;
      }
      let query: unknown;
      if (route.query) {
        const r = route.query.safeParse(req.query);
        if (!r.success) throw fromZodError(r.error, 'the query');
        query = r.data;
      }
      const reply = await route.handle({ body, query, id, store, req });
      res.status(reply.status ?? 200).json(reply.body);
    });
  }
}
