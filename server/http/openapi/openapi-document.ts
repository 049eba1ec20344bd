import { z } from 'zod';
import type { LabRouteSummary } from '../lab-routes.ts';
import { TOKEN_READ_PERMISSIONS } from '../middleware/lab-guard.ts';
import { SESSION_COOKIE } from '../middleware/session.ts';
import { PUBLIC_ROUTES, type PublicRoute } from './public-routes.ts';

type JsonObject = Record<string, unknown>;

/** Turns an Express path (`/loggers/:loggerId`) into an OpenAPI path template (`/loggers/{loggerId}`). */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z]+)/g, '{$1}');
}

/**
 * JSON Schema (2020-12, the dialect OpenAPI 3.1 uses) of what a zod schema accepts, from zod 4's
 * own `z.toJSONSchema`. `io: 'input'` describes what a client sends (before defaults and
 * transforms); checks JSON Schema cannot express (refinements) are left to the server.
 */
export function inputJsonSchema(schema: z.ZodType): JsonObject {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12' }) as JsonObject;
  return rest;
}

/** Query parameters from an object schema: one parameter per property. */
function queryParameters(schema: z.ZodType): JsonObject[] {
  const json = inputJsonSchema(schema);
  const props = (json.properties ?? {}) as Record<string, JsonObject>;
  const required = new Set((json.required ?? []) as string[]);
  return Object.entries(props).map(([name, s]) => ({ name, in: 'query', required: required.has(name), schema: s }));
}

/** Path parameters of a template; ids are positive integers, the lab is its address (slug). */
function pathParameters(template: string): JsonObject[] {
  return [...template.matchAll(/\{([A-Za-z]+)\}/g)].map(([, name]) => ({
    name,
    in: 'path',
    required: true,
    schema: name === 'lab' ? { type: 'string', pattern: '^[a-z0-9-]{1,64}$' } : name === 'token' ? { type: 'string' } : { type: 'integer', minimum: 1 },
    ...(name === 'lab' ? { description: "the lab's address (slug)" } : {}),
  }));
}

const ref = (kind: 'responses' | 'schemas', name: string) => ({ $ref: `#/components/${kind}/${name}` });
const errorBody = { content: { 'application/json': { schema: ref('schemas', 'Error') } } };

/** A route's own answers (status → description): errors carry the error body, 429/503 a Retry-After header. */
function routeResponses(responses: Record<string, string> = {}): JsonObject {
  return Object.fromEntries(
    Object.entries(responses).map(([status, description]) => [
      status,
      /^[45]/.test(status)
        ? { description, ...errorBody, ...(status === '429' || status === '503' ? { headers: { 'Retry-After': { description: 'Seconds to wait before trying again.', schema: { type: 'integer' } } } } : {}) }
        : { description },
    ]),
  );
}

/** The standard answers every operation may give, besides its success. */
function errorResponses(auth: 'none' | 'signed-in'): JsonObject {
  if (auth === 'none') return {};
  return { '400': ref('responses', 'InvalidInput'), '401': ref('responses', 'Unauthenticated'), '403': ref('responses', 'Forbidden'), '404': ref('responses', 'NotFound') };
}

function operationId(method: string, template: string): string {
  const words = template.split(/[^A-Za-z0-9]+/).filter(Boolean);
  return [method, ...words].map((w, i) => (i === 0 ? w : w[0].toUpperCase() + w.slice(1))).join('');
}

function labOperation(route: LabRouteSummary, template: string): JsonObject {
  const tokenReadable = route.method === 'get' && TOKEN_READ_PERMISSIONS.includes(route.permission);
  const op: JsonObject = {
    operationId: operationId(route.method, template),
    summary: route.summary,
    tags: [route.path.split('/')[1] || 'lab'],
    'x-lagbook-permission': route.permission,
    security: tokenReadable ? [{ sessionCookie: [] }, { personalToken: [] }] : [{ sessionCookie: [] }],
    parameters: [...pathParameters(template), ...(route.query ? queryParameters(route.query) : [])],
    responses: { '2XX': { description: 'Success.' }, ...errorResponses('signed-in'), ...routeResponses(route.responses) },
  };
  if (route.body) {
    op.requestBody = { required: true, content: { [route.bodyMediaType ?? 'application/json']: { schema: inputJsonSchema(route.body) } } };
  }
  return op;
}

function publicOperation(route: PublicRoute, template: string): JsonObject {
  const security = route.auth === 'none' ? [] : route.auth === 'session' ? [{ sessionCookie: [] }] : [{ ingestKey: [] }];
  const op: JsonObject = {
    operationId: operationId(route.method, template),
    summary: route.summary,
    tags: [route.auth === 'ingest-key' ? 'ingest' : route.auth === 'none' ? 'service' : 'account'],
    security,
    parameters: pathParameters(template),
    responses: { '2XX': { description: 'Success.' }, ...errorResponses(route.auth === 'none' ? 'none' : 'signed-in'), ...routeResponses(route.responses) },
  };
  if (route.bodies) {
    const content = Object.fromEntries(Object.entries(route.bodies).map(([type, schema]) => [type, { schema: inputJsonSchema(schema) }]));
    op.requestBody = { required: true, content };
  }
  return op;
}

/**
 * Lagbook's OpenAPI 3.1 document, generated from the lab route table (each route's permission,
 * summary and the zod schemas its handler validates with) plus the routes outside it
 * (`PUBLIC_ROUTES`). Built once at start; the same object is served every time.
 */
export function buildOpenApiDocument(labRoutes: LabRouteSummary[], opts: { serverUrl?: string } = {}): JsonObject {
  const paths: Record<string, Record<string, JsonObject>> = {};
  const add = (method: string, template: string, op: JsonObject) => {
    (paths[template] ??= {})[method] = op;
  };
  for (const r of labRoutes) {
    const template = openApiPath(`/api/v1/labs/:lab${r.path}`);
    add(r.method, template, labOperation(r, template));
  }
  for (const r of PUBLIC_ROUTES) {
    const template = openApiPath(r.path);
    add(r.method, template, publicOperation(r, template));
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lagbook API',
      version: '1',
      summary: "Research labs' data loggers: ingestion, channels, diagnostics and exports.",
      description:
        'Every lab route lives below /api/v1/labs/{lab} and needs a session or, for the read routes marked with personalToken, `Authorization: Bearer lbt_…`. A lab one is not a member of answers 404. Errors are `{ "error": { "code", "message" } }`; validation messages read `field: reason`.',
    },
    ...(opts.serverUrl ? { servers: [{ url: opts.serverUrl }] } : {}),
    paths,
    components: {
      securitySchemes: {
        sessionCookie: { type: 'apiKey', in: 'cookie', name: SESSION_COOKIE, description: 'The session a browser gets by signing in (OpenID Connect).' },
        ingestKey: { type: 'http', scheme: 'bearer', bearerFormat: 'lbk_<prefix>_<secret>', description: "A logger's ingest key; accepted only by POST /api/v1/ingest." },
        personalToken: { type: 'http', scheme: 'bearer', bearerFormat: 'lbt_<prefix>_<secret>', description: "A member's personal API token; read routes of its own lab only, with its owner's current role." },
      },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: { error: { type: 'object', required: ['code', 'message'], properties: { code: { type: 'string' }, message: { type: 'string' } } } },
        },
      },
      responses: {
        InvalidInput: { description: 'The input failed validation (`invalid_input`, message `field: reason`).', ...errorBody },
        Unauthenticated: { description: 'Not signed in, or the token or key is not valid (`unauthenticated`, `invalid_token`).', ...errorBody },
        Forbidden: { description: 'The role (or a personal token) does not allow this (`forbidden`, `token_not_allowed`).', ...errorBody },
        NotFound: { description: 'No such thing here — also the answer for another lab and its resources (`not_found`).', ...errorBody },
      },
    },
  };
}
