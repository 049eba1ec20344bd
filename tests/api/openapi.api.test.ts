import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import type { LabRouteSummary } from '../../server/http/routes/route.ts';

/**
 * The API document at /api/v1/openapi.json: OpenAPI 3.1 in shape (checked here against the
 * rules of the OpenAPI Specification 3.1.0 — required fields, responses on every operation,
 * path parameters declared, security schemes and $refs that resolve), and complete: the
 * routes the running app actually registers (walked from its router) and the document's
 * operations must be the same set, so a new route without docs fails here.
 * When openapi-spec-validator (Python) is installed it validates the document as well.
 */
type Json = Record<string, unknown>;
const METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'];

let t: TestApp;
let doc: Json;
beforeAll(async () => {
  t = await buildTestApp();
  doc = (
    await request(t.app)
      .get('/api/v1/openapi.json')
      .expect(200)
      .expect('Content-Type', /application\/json/)
  ).body;
});
afterAll(async () => t.close());

const paths = () => doc.paths as Record<string, Record<string, Json>>;
const operations = () =>
  Object.entries(paths()).flatMap(([path, item]) =>
    Object.entries(item)
      .filter(([m]) => METHODS.includes(m))
      .map(([method, op]) => ({ method, path, op })),
  );
const toTemplate = (expressPath: string) => expressPath.replace(/:([A-Za-z]+)/g, '{$1}');

/** Every `METHOD path` the Express app registers under /api and /healthz, read from its router. */
function registeredRoutes(): string[] {
  type Layer = { route?: { path: string | RegExp | (string | RegExp)[]; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } };
  const out: string[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        const routePaths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const m of Object.keys(layer.route.methods))
          if (m !== '_all') for (const p of routePaths) out.push(`${m} ${typeof p === 'string' ? toTemplate(p) : String(p)}`);
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk((t.app as unknown as { router: { stack: Layer[] } }).router.stack);
  return out.filter((r) => / \/(api\/|healthz$)/.test(r)).sort();
}

/** Follows a local JSON pointer (`#/components/…`) in the document. */
function resolve(pointer: string): unknown {
  if (!pointer.startsWith('#/')) return undefined;
  return pointer
    .slice(2)
    .split('/')
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'))
    .reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Json)[key] : undefined), doc);
}

describe('API document', () => {
  it('is served without a session and is OpenAPI 3.1 in shape', async () => {
    expect(doc.openapi).toBe('3.1.0');
    const info = doc.info as Json;
    expect(typeof info.title).toBe('string');
    expect(typeof info.version).toBe('string');
    expect(doc.components).toEqual(expect.objectContaining({ securitySchemes: expect.any(Object) }));
    for (const path of Object.keys(paths())) expect(path.startsWith('/'), path).toBe(true);
    expect(operations().length).toBeGreaterThan(30);
  });

  it('every operation has responses, a unique operationId, its path parameters and known security schemes', () => {
    const ids = new Set<string>();
    const schemes = Object.keys((doc.components as Json).securitySchemes as Json);
    expect(schemes.sort()).toEqual(['ingestKey', 'personalToken', 'sessionCookie']);
    for (const { method, path, op } of operations()) {
      const where = `${method} ${path}`;
      const responses = op.responses as Json;
      expect(Object.keys(responses).length, where).toBeGreaterThan(0);
      for (const code of Object.keys(responses)) expect(code, where).toMatch(/^([1-5](\d\d|XX)|default)$/);
      expect(typeof op.summary, where).toBe('string');
      expect(ids.has(op.operationId as string), `duplicate operationId ${String(op.operationId)}`).toBe(false);
      ids.add(op.operationId as string);
      const params = (op.parameters ?? []) as Json[];
      const pathParams = params
        .filter((p) => p.in === 'path')
        .map((p) => p.name)
        .sort();
      const templated = [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]).sort();
      expect(pathParams, where).toEqual(templated);
      for (const p of params) {
        if (p.in === 'path') expect(p.required, `${where} ${String(p.name)}`).toBe(true);
        expect(p.schema, `${where} ${String(p.name)}`).toEqual(expect.any(Object));
      }
      for (const requirement of (op.security ?? []) as Json[]) for (const name of Object.keys(requirement)) expect(schemes, where).toContain(name);
    }
  });

  it('every $ref resolves', () => {
    const refs: string[] = [];
    const walk = (node: unknown) => {
      if (Array.isArray(node)) node.forEach(walk);
      else if (node && typeof node === 'object') {
        for (const [k, v] of Object.entries(node)) {
          if (k === '$ref' && typeof v === 'string') refs.push(v);
          else walk(v);
        }
      }
    };
    walk(doc);
    expect(refs.length).toBeGreaterThan(0);
    for (const r of refs) expect(resolve(r), r).toEqual(expect.any(Object));
  });

  it('lists exactly the routes the app registers — every lab route from the table and every route outside it', () => {
    const documented = operations()
      .map((o) => `${o.method} ${o.path}`)
      .sort();
    expect(documented).toEqual(registeredRoutes());
    const table = t.app.locals.labRoutes as LabRouteSummary[];
    for (const r of table) expect(documented).toContain(`${r.method} ${toTemplate(`/api/v1/labs/:lab${r.path}`)}`);
    for (const r of ['get /api/v1/me', 'post /api/v1/labs', 'post /api/v1/invitations/{lab}/{token}/accept', 'post /api/v1/ingest', 'get /healthz']) {
      expect(documented).toContain(r);
    }
  });

  it('documents bodies and queries from the zod schemas the routes validate with', () => {
    const tokens = paths()['/api/v1/labs/{lab}/tokens'].post;
    const body = ((tokens.requestBody as Json).content as Json)['application/json'] as { schema: { properties: Record<string, Json>; required: string[] } };
    // The bounds of the token schema in server/contract/tokens.ts (name 1–80 characters, expiresInDays 1–365 whole days).
    expect(body.schema.properties.name).toEqual(expect.objectContaining({ type: 'string', minLength: 1, maxLength: 80 }));
    expect(body.schema.properties.expiresInDays).toEqual(expect.objectContaining({ type: 'integer', minimum: 1, maximum: 365 }));
    expect(body.schema.required.sort()).toEqual(['expiresInDays', 'name']);

    const diagnostics = paths()['/api/v1/labs/{lab}/channels/{channelId}/diagnostics'].get;
    const query = (diagnostics.parameters as Json[]).filter((p) => p.in === 'query');
    expect(query.map((p) => p.name)).toEqual(expect.arrayContaining(['from', 'to', 'step', 'agg', 'maxLag', 'period', 'decomposition', 'alpha', 'ccfWith']));
    expect(query.find((p) => p.name === 'agg')!.schema).toEqual(expect.objectContaining({ enum: ['mean', 'median', 'last', 'min', 'max'], default: 'mean' }));

    const ingest = paths()['/api/v1/ingest'].post;
    expect(Object.keys((ingest.requestBody as Json).content as Json).sort()).toEqual(['application/json', 'text/csv']);
    const upload = paths()['/api/v1/labs/{lab}/loggers/{loggerId}/uploads'].post;
    expect(Object.keys((upload.requestBody as Json).content as Json)).toEqual(['text/csv']);
  });

  it('lists every status each route can answer, not a catch-all: the refusals beyond 400–404 included', () => {
    const statuses = (path: string, method: string) => Object.keys(paths()[path][method].responses as Json);
    for (const { method, path, op } of operations()) {
      const codes = Object.keys(op.responses as Json);
      expect(
        codes.filter((c) => /XX|default/.test(c)),
        `${method} ${path}`,
      ).toEqual([]);
      expect(codes, `${method} ${path}`).toContain('500');
      if (path !== '/api/v1/openapi.json') expect(codes, `${method} ${path}`).toContain('503');
    }
    // each of these statuses is one the route's service or middleware really throws (see the route files' `errors`)
    expect(statuses('/api/v1/ingest', 'post')).toEqual(expect.arrayContaining(['200', '400', '401', '402', '413', '415', '422', '429', '503']));
    expect(statuses('/api/v1/invitations/{lab}/{token}/accept', 'post')).toEqual(expect.arrayContaining(['404', '410']));
    expect(statuses('/api/v1/labs/{lab}/channels/{channelId}/comparison', 'get')).toEqual(expect.arrayContaining(['402', '422', '429']));
    expect(statuses('/api/v1/labs/{lab}/members/{userId}', 'patch')).toEqual(expect.arrayContaining(['200', '400', '401', '403', '404', '409']));
    expect(statuses('/api/v1/labs/{lab}/members/{userId}', 'delete')).toContain('204');
    expect(statuses('/api/v1/labs', 'post')).toEqual(expect.arrayContaining(['201', '403']));
    const busy = paths()['/api/v1/labs/{lab}/channels/{channelId}/diagnostics'].get.responses as Record<string, Json>;
    expect(busy['429'].headers).toEqual(expect.objectContaining({ 'Retry-After': expect.any(Object) }));
  });

  it('says which credential each route takes: personal tokens on the read routes only, the ingest key on ingestion only', () => {
    const schemesOf = (op: Json) => ((op.security ?? []) as Json[]).flatMap((s) => Object.keys(s)).sort();
    expect(schemesOf(paths()['/api/v1/labs/{lab}/channels'].get)).toEqual(['personalToken', 'sessionCookie']);
    expect(schemesOf(paths()['/api/v1/labs/{lab}/channels/{channelId}/readings.csv'].get)).toEqual(['personalToken', 'sessionCookie']);
    expect(schemesOf(paths()['/api/v1/labs/{lab}/loggers'].post)).toEqual(['sessionCookie']);
    expect(schemesOf(paths()['/api/v1/labs/{lab}/tokens'].get)).toEqual(['sessionCookie']);
    expect(schemesOf(paths()['/api/v1/labs/{lab}/members'].get)).toEqual(['sessionCookie']);
    expect(schemesOf(paths()['/api/v1/ingest'].post)).toEqual(['ingestKey']);
    expect(schemesOf(paths()['/api/v1/me'].get)).toEqual(['sessionCookie']);
    expect(paths()['/api/v1/openapi.json'].get.security).toEqual([]);
    for (const { method, op } of operations()) {
      if (method !== 'get') expect(schemesOf(op)).not.toContain('personalToken');
    }
  });
});

/** openapi-spec-validator (Python, a maintained OpenAPI validator), when the machine has it. */
const validator = (() => {
  try {
    execFileSync('python3', ['-c', 'import openapi_spec_validator'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();

describe.runIf(validator)('API document under openapi-spec-validator', () => {
  it('validates as OpenAPI 3.1', () => {
    const script = 'import json,sys\nfrom openapi_spec_validator import validate\nvalidate(json.load(sys.stdin))\nprint("valid")';
    const out = execFileSync('python3', ['-c', script], { input: JSON.stringify(doc), encoding: 'utf8' });
    expect(out.trim()).toBe('valid');
  });
});
