// The OpenAPI 3.1 document: served at /api/openapi.json, valid JSON, and every
// route mounted in the Express router documented with its body and answers.
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app';
import { openApiPath } from '../../server/openapi';
import { call } from '../helpers/api';
import { startTestServer, type TestServer } from '../helpers/server';

let srv: TestServer;
// eslint-disable-next-line @typescript-eslint/no-explicit-any
let doc: any;

beforeAll(async () => {
  srv = await startTestServer();
  const r = await fetch(`${srv.baseUrl}/api/openapi.json`);
  expect(r.status).toBe(200);
  expect(r.headers.get('content-type')).toContain('application/json');
  doc = JSON.parse(await r.text());
});
afterAll(async () => {
  await srv.close();
});

interface Layer { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] }; name?: string; matchers?: unknown }

/** Every (method, path) mounted under /api, read from the Express router itself. */
function mountedApiRoutes(app: Express): string[] {
  const out: string[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [m, on] of Object.entries(layer.route.methods)) if (on && m !== '_all') out.push(`${m.toUpperCase()} ${openApiPath(layer.route.path)}`);
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack);
  return out;
}

describe('OpenAPI document', () => {
  it('is OpenAPI 3.1.0 with info and paths', () => {
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.info.title).toBe('chargewalk API');
    expect(Object.keys(doc.paths).length).toBeGreaterThan(15);
  });

  it('documents every route mounted in the router, and nothing else', () => {
    const app = buildApp({ store: srv.store, clientDir: '/nonexistent', bodyLimit: '1mb' });
    const mounted = mountedApiRoutes(app);
    expect(mounted.length).toBeGreaterThan(25);
    const documented = Object.entries(doc.paths as Record<string, Record<string, unknown>>)
      .flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`));
    expect(new Set(mounted)).toEqual(new Set(documented));
    // the DEVELOPERS.md contract rows
    for (const row of ['GET /api/health', 'POST /api/readings', 'GET /api/spots/{id}/readings', 'POST /api/readings/{id}/corrections',
      'POST /api/readings/{id}/tombstone', 'GET /api/conflicts', 'PUT /api/areas/{id}/route', 'GET /api/limit-templates', 'GET /api/sites/{id}/setup']) {
      expect(documented).toContain(row);
    }
  });

  it('gives every operation an answer schema, every body a request schema, and every $ref a component', () => {
    const refs: string[] = [];
    const collect = (node: unknown) => {
      if (Array.isArray(node)) node.forEach(collect);
      else if (node && typeof node === 'object') {
        for (const [k, v] of Object.entries(node)) {
          if (k === '$ref' && typeof v === 'string') refs.push(v);
          else collect(v);
        }
      }
    };
    for (const [path, ops] of Object.entries(doc.paths as Record<string, Record<string, { requestBody?: { content: Record<string, { schema: unknown }> }; responses: Record<string, { content?: unknown }>; operationId: string }>>)) {
      for (const [method, op] of Object.entries(ops)) {
        expect(op.operationId, `${method} ${path}`).toMatch(/^[a-z]+[A-Za-z]+$/);
        const ok = Object.keys(op.responses).filter((s) => s.startsWith('2'));
        expect(ok.length, `${method} ${path}`).toBeGreaterThan(0);
        for (const s of ok) expect(op.responses[s]!.content, `${method} ${path} ${s}`).toBeDefined();
        expect(op.responses['500']).toBeDefined();
        if (method === 'post' || method === 'put') {
          // JSON, or the raw media types a route declares (a floor plan image), each with a schema
          const bodies = Object.values(op.requestBody?.content ?? {}) as { schema?: unknown }[];
          expect(bodies.length, `${method} ${path}`).toBeGreaterThan(0);
          for (const b of bodies) expect(b.schema, `${method} ${path}`).toBeDefined();
        }
      }
    }
    collect(doc);
    expect(refs.length).toBeGreaterThan(20);
    for (const ref of refs) {
      expect(ref).toMatch(/^#\/components\/schemas\//);
      expect(doc.components.schemas[ref.slice('#/components/schemas/'.length)], ref).toBeDefined();
    }
  });

  it('generates request bodies from the zod schemas as inputs (defaults optional) and answers as outputs', () => {
    const body = doc.paths['/api/readings'].post.requestBody.content['application/json'].schema;
    expect(body.anyOf.map((s: { $ref: string }) => s.$ref)).toEqual(['#/components/schemas/ReadingInput', '#/components/schemas/ReadingBatch']);
    const input = doc.components.schemas.ReadingInput;
    expect(input.required).toEqual(expect.arrayContaining(['id', 'roundId', 'spotId', 'meterId', 'value', 'unit', 'polarity', 'distance', 'zeroed']));
    expect(input.required).not.toContain('note');
    expect(input.properties.unit.enum).toContain('kV/inch');
    expect(doc.components.schemas.ReadingBatch.properties.readings.maxItems).toBe(500);
    // the stored payload of a conflict is an output: defaults filled, so required
    expect(doc.components.schemas.ReadingInputOutput.required).toContain('note');
    expect(doc.components.schemas.Reading.properties.verdict.$ref).toBe('#/components/schemas/LimitVerdict');
    expect(doc.paths['/api/spots/{id}/readings'].get.parameters.map((p: { name: string }) => p.name)).toEqual(['id', 'history', 'limit']);
  });

  it('is served with the API headers', async () => {
    const r = await call(srv.baseUrl, 'GET', '/api/openapi.json');
    expect(r.headers.get('cache-control')).toBe('no-store');
  });
});
