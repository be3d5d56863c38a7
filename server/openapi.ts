/**
 * The OpenAPI 3.1 document, generated from the route declarations and the zod
 * schemas of core/schemas (z.toJSONSchema, JSON Schema draft 2020-12, which is
 * OpenAPI 3.1's dialect). Schemas with a .meta({ id }) become components.
 * Request bodies are converted as inputs (defaults make fields optional),
 * answers as outputs; where the two differ for one id, the answer's variant is
 * named `<id>Output`.
 */
import { z } from 'zod';
import { ErrorEnvelopeSchema, Id } from '../core/schemas';
import type { Route } from './http/route';

type Json = Record<string, unknown>;
type Io = 'input' | 'output';

interface Converted {
  io: Io;
  schema: Json;
  defs: Record<string, Json>;
}

const ERROR_TEXT: Record<number, string> = {
  400: 'invalid input (code invalid): fields name each problem with its dotted path',
  404: 'unknown id (code not-found)',
  409: 'conflict with stored data (code conflict)',
  413: 'body larger than its limit (CHARGEWALK_BODY_LIMIT for JSON; the route says when it has its own) (code too-large)',
  415: 'body of a type the route does not take (code unsupported-media-type)',
  503: 'database busy (code unavailable): retry',
};

function convert(schema: z.ZodType, io: Io): Converted {
  const json = z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' }) as Json;
  const { $schema: _s, $defs, ...rest } = json;
  return { io, schema: rest, defs: ($defs ?? {}) as Record<string, Json> };
}

function rewriteRefs(node: unknown, rename: (id: string) => string): unknown {
  if (Array.isArray(node)) return node.map((n) => rewriteRefs(n, rename));
  if (node === null || typeof node !== 'object') return node;
  const out: Json = {};
  for (const [k, v] of Object.entries(node as Json)) {
    if (k === '$ref' && typeof v === 'string' && v.startsWith('#/$defs/')) out[k] = `#/components/schemas/${rename(v.slice(8))}`;
    else out[k] = rewriteRefs(v, rename);
  }
  return out;
}

function operationId(route: Route): string {
  const words = route.path.split('/').filter(Boolean).map((p) => (p.startsWith(':') ? `By${p.slice(1)}` : p))
    .flatMap((p) => p.split(/[-.]/)).map((w) => w[0]!.toUpperCase() + w.slice(1));
  return `${route.method}${words.join('')}`;
}

export function openApiPath(expressPath: string): string {
  return `/api${expressPath.replace(/:(\w+)/g, '{$1}')}`;
}

export function buildOpenApi(routes: Route[], info: { version: string }): Json {
  const conversions: Converted[] = [];
  const use = (schema: z.ZodType, io: Io) => {
    const c = convert(schema, io);
    conversions.push(c);
    return c;
  };
  const errorSchema = use(ErrorEnvelopeSchema, 'output');

  const ops: { route: Route; body?: Converted; query?: { name: string; required: boolean; c: Converted; description?: string }[]; responses: [string, string, Converted | null, string?][] }[] = [];
  for (const route of routes) {
    const bodySchema = route.body ?? route.bodyDoc;
    const body = bodySchema ? use(bodySchema, 'input') : undefined;
    let query: { name: string; required: boolean; c: Converted }[] | undefined;
    if (route.query instanceof z.ZodObject) {
      query = Object.entries(route.query.shape as Record<string, z.ZodType>).map(([name, s]) => ({
        name, required: !s.safeParse(undefined).success, c: use(s, 'input'),
      }));
    }
    const responses: [string, string, Converted | null, string?][] = Object.entries(route.responses)
      .map(([status, doc]) => [status, doc.description, doc.schema ? use(doc.schema, 'output') : null, doc.contentType]);
    for (const status of route.errors) responses.push([String(status), ERROR_TEXT[status] ?? 'error', errorSchema]);
    responses.push(['500', 'a fault of the server (code internal); never caused by input', errorSchema]);
    ops.push({ route, body, query, responses });
  }

  // Name components: one per id, or two when an id's input and output variants differ.
  const variants = new Map<string, Map<Io, string>>();
  for (const c of conversions) {
    for (const [id, def] of Object.entries(c.defs)) {
      const m = variants.get(id) ?? new Map<Io, string>();
      if (!m.has(c.io)) m.set(c.io, JSON.stringify(def));
      variants.set(id, m);
    }
  }
  const nameOf = (io: Io) => (id: string) => {
    const m = variants.get(id);
    const split = m?.has('input') && m.has('output') && m.get('input') !== m.get('output');
    return split && io === 'output' ? `${id}Output` : id;
  };
  const components: Record<string, unknown> = {};
  for (const c of conversions) {
    for (const [id, def] of Object.entries(c.defs)) {
      const name = nameOf(c.io)(id);
      if (!(name in components)) components[name] = rewriteRefs(def, nameOf(c.io));
    }
  }
  const schemaOf = (c: Converted) => rewriteRefs(c.schema, nameOf(c.io));

  const paths: Record<string, Json> = {};
  for (const { route, body, query, responses } of ops) {
    const path = openApiPath(route.path);
    const parameters: Json[] = [];
    for (const m of route.path.matchAll(/:(\w+)/g)) {
      parameters.push(m[1] === 'id'
        ? { name: m[1], in: 'path', required: true, schema: convert(Id, 'input').schema, description: `id of the ${route.resource ?? 'record'} (UUID)` }
        : { name: m[1], in: 'path', required: true, schema: { type: 'string' } });
    }
    for (const q of query ?? []) parameters.push({ name: q.name, in: 'query', required: q.required, schema: schemaOf(q.c) });
    const op: Json = {
      operationId: operationId(route),
      tags: [route.tag],
      summary: route.summary,
      ...(route.description ? { description: route.description } : {}),
      ...(parameters.length ? { parameters } : {}),
      ...(body ? { requestBody: { required: true, content: { 'application/json': { schema: schemaOf(body) } } } } : {}),
      ...(route.rawBody ? {
        requestBody: {
          required: true,
          content: Object.fromEntries(route.rawBody.types.map((t) => [t, { schema: { type: 'string', contentMediaType: t } }])),
        },
      } : {}),
      responses: Object.fromEntries(responses.map(([status, description, c, contentType]) => [
        status, contentType
          ? { description, content: { [contentType]: { schema: { type: 'string', contentMediaType: contentType } } } }
          : c ? { description, content: { 'application/json': { schema: schemaOf(c) } } } : { description },
      ])),
    };
    paths[path] = { ...(paths[path] ?? {}), [route.method]: op };
  }

  return {
    openapi: '3.1.0',
    jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
    info: {
      title: 'chargewalk API',
      version: info.version,
      description: 'Electrostatic field-meter walkarounds: set-up, rounds, readings (exactly-once batch ingest), corrections and tombstones; '
        + 'charge estimates (POST /api/estimate), multi-distance sweep fits (POST /api/sweep) and, on every reading whose spot has a model, '
        + 'the estimate and the hazard verdicts of its area, each threshold with its source. '
        + 'Every error answers { error: { code, message, fields?: [{ path, message }] } }. Readings are append-only.',
      license: { name: 'MIT', identifier: 'MIT' },
    },
    servers: [{ url: '/' }],
    paths,
    components: { schemas: components },
  };
}
