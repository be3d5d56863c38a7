/**
 * A route is declared once, with the zod schemas of its body, query and answers;
 * the same declaration mounts the Express handler and writes the OpenAPI entry,
 * so the document cannot drift from what the server does.
 *
 * The handler receives input already parsed (a bad body is a 400 with field paths
 * before it runs; a path id that is not a UUID is a 404 naming the field 'id').
 */
import express, { type Request, type RequestHandler, type Router } from 'express';
import type { z } from 'zod';
import { Id } from '../../core/schemas';
import type { Store } from '../store/store';
import { fromZodError, HttpError } from './errors';
import { requireJsonBody } from './security';

type Output<S> = S extends z.ZodType ? z.output<S> : undefined;

export interface RouteContext<B, Q> {
  body: B;
  query: Q;
  /** The path's :id, checked to be a UUID ('' when the path has none). */
  id: string;
  /** Other path parameters as given (e.g. :code), not checked. */
  params: Record<string, string>;
  /** The raw body of a route declared with rawBody (null otherwise). */
  rawBody: Buffer | null;
  store: Store;
  req: Request;
}

/** An answer that is not JSON (CSV, an image): sent as it is with its content type. */
export interface RawReply {
  contentType: string;
  body: string | Buffer;
  headers?: Record<string, string>;
}

export interface Reply {
  status?: number;
  body?: unknown;
  raw?: RawReply;
}

export interface ResponseDoc {
  description: string;
  schema?: z.ZodType;
  /** Media type of the answer when it is not JSON, e.g. 'text/csv' (documented as a string). */
  contentType?: string;
}

/** A route that takes a raw (non-JSON) body, e.g. a floor plan image. */
export interface RawBodySpec {
  /** Accepted Content-Type values; any other answers 415 before the body is read. */
  types: readonly string[];
  /** Largest body, bytes; larger answers 413 naming the limit in words. */
  limitBytes: number;
  /** Field name used in error messages, e.g. 'plan'. */
  field: string;
  /** What the body is, for messages, e.g. 'the plan image'. */
  what: string;
}

export type Method = 'get' | 'post' | 'put' | 'delete';

export interface RouteSpec<B extends z.ZodType | undefined, Q extends z.ZodType | undefined> {
  method: Method;
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
  /** The body is raw bytes of these types (not JSON); the handler gets it as ctx.rawBody. */
  rawBody?: RawBodySpec;
  /** A JSON body limit of its own (e.g. '32mb' for imports) instead of CHARGEWALK_BODY_LIMIT, when larger. */
  jsonLimit?: string;
  responses: Record<number, ResponseDoc>;
  /** Error statuses this route can answer (documented with the Error envelope). */
  errors: number[];
  handle: (ctx: RouteContext<Output<B>, Output<Q>>) => Promise<Reply>;
}

/** A declared route with its types erased, as the router and the OpenAPI builder see it. */
export interface Route {
  method: Method;
  path: string;
  tag: string;
  summary: string;
  description?: string;
  resource?: string;
  body?: z.ZodType;
  bodyDoc?: z.ZodType;
  query?: z.ZodType;
  rawBody?: RawBodySpec;
  jsonLimit?: string;
  responses: Record<number, ResponseDoc>;
  errors: number[];
  handle: (ctx: RouteContext<unknown, unknown>) => Promise<Reply>;
}

/** Routes that parse their own body (raw images, large imports): app.ts mounts them before the global JSON parser. */
export function hasOwnBodyParser(route: Route): boolean {
  return route.rawBody !== undefined || route.jsonLimit !== undefined;
}

/** '5 MB', '512 kB', '900 bytes'. */
export function bytesInWords(n: number): string {
  if (n >= 1024 * 1024) return `${Number((n / (1024 * 1024)).toFixed(1))} MB`;
  if (n >= 1024) return `${Number((n / 1024).toFixed(1))} kB`;
  return `${n} bytes`;
}

interface ParserError extends Error { type?: string; length?: number }

/** Checks the Content-Type, then reads the raw body up to the limit; 415 and 413 name the field. */
function rawBodyParser(spec: RawBodySpec): RequestHandler[] {
  const parse = express.raw({ type: () => true, limit: spec.limitBytes });
  const checkType: RequestHandler = (req, _res, next) => {
    const type = (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
    if (!spec.types.includes(type)) {
      next(new HttpError(415, 'unsupported-media-type',
        `${spec.what} must be one of ${spec.types.join(', ')}; got ${type === '' ? 'no Content-Type' : type.slice(0, 100)}`,
        [{ path: spec.field, message: `must be ${spec.types.join(', ')}` }]));
      return;
    }
    next();
  };
  const read: RequestHandler = (req, res, next) => {
    parse(req, res, (err?: unknown) => {
      const e = err as ParserError | undefined;
      if (e?.type === 'entity.too.large') {
        const size = typeof e.length === 'number' && e.length > 0 ? ` (${bytesInWords(e.length)})` : '';
        next(new HttpError(413, 'too-large', `${spec.what} is too large${size}: the largest accepted is ${bytesInWords(spec.limitBytes)}`,
          [{ path: spec.field, message: `must be at most ${bytesInWords(spec.limitBytes)}` }]));
        return;
      }
      next(err);
    });
  };
  return [checkType, read];
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
    const parsers: RequestHandler[] = route.rawBody
      ? rawBodyParser(route.rawBody)
      : route.jsonLimit ? [requireJsonBody, express.json({ limit: route.jsonLimit, type: 'application/json', strict: true })] : [];
    router[route.method](route.path, ...parsers, async (req, res) => {
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
      const rawBody = route.rawBody && Buffer.isBuffer(req.body) ? req.body : null;
      const named = Object.fromEntries(Object.entries(params).filter((e): e is [string, string] => typeof e[1] === 'string'));
      const reply = await route.handle({ body, query, id, params: named, rawBody, store, req });
      if (reply.raw) {
        for (const [k, v] of Object.entries(reply.raw.headers ?? {})) res.setHeader(k, v);
        res.status(reply.status ?? 200).type(reply.raw.contentType).send(reply.raw.body);
        return;
      }
      res.status(reply.status ?? 200).json(reply.body);
    });
  }
}
