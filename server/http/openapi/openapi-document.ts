import { z } from 'zod';
import { fullPathOf, permissionOf, type Route } from '../routes/route.ts';
import { answersOf, STANDARD_ANSWERS, type StandardStatus } from '../routes/standard-answers.ts';
import { TOKEN_READ_PERMISSIONS } from '../middleware/lab-guard.ts';
import { SESSION_COOKIE } from '../middleware/session.ts';

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
const retryAfter = { 'Retry-After': { description: 'Seconds to wait before trying again.', schema: { type: 'integer' } } };

/** The shared description of a standard answer (a `$ref`), when the route keeps the standard wording. */
const STANDARD_REFS: Record<number, string> = {
  400: 'InvalidInput',
  401: 'Unauthenticated',
  403: 'Forbidden',
  404: 'NotFound',
  500: 'Internal',
  503: 'Unavailable',
};

/** Every answer of a route: success with its media type, errors with the error body, 429/503 with Retry-After. */
function responsesOf(route: Route): JsonObject {
  const out: JsonObject = {};
  for (const [status, description] of answersOf(route)) {
    const standardRef = STANDARD_REFS[status];
    if (standardRef && description === STANDARD_ANSWERS[status as StandardStatus]) out[String(status)] = ref('responses', standardRef);
    else if (status >= 400) out[String(status)] = { description, ...errorBody, ...(status === 429 || status === 503 ? { headers: retryAfter } : {}) };
    else if (status === 204 || status === 304) out[String(status)] = { description };
    else out[String(status)] = { description, content: { [route.response.mediaType ?? 'application/json']: {} } };
  }
  return out;
}

function operationId(method: string, template: string): string {
  const words = template.split(/[^A-Za-z0-9]+/).filter(Boolean);
  return [method, ...words].map((w, i) => (i === 0 ? w : w[0].toUpperCase() + w.slice(1))).join('');
}

/** Who may call a route, as OpenAPI security requirements. */
function securityOf(route: Route): JsonObject[] {
  const permission = permissionOf(route);
  if (permission) {
    const tokenReadable = route.method === 'get' && TOKEN_READ_PERMISSIONS.includes(permission);
    return tokenReadable ? [{ sessionCookie: [] }, { personalToken: [] }] : [{ sessionCookie: [] }];
  }
  if (route.auth === 'session') return [{ sessionCookie: [] }];
  if (route.auth === 'ingest-key') return [{ ingestKey: [] }];
  return [];
}

function tagOf(route: Route): string {
  if (route.tag) return route.tag;
  if (permissionOf(route)) return route.path.split('/')[1] || 'lab';
  if (route.auth === 'ingest-key') return 'ingest';
  if (route.auth === 'session') return 'account';
  return 'service';
}

function operationOf(route: Route, template: string): JsonObject {
  const permission = permissionOf(route);
  const op: JsonObject = {
    operationId: operationId(route.method, template),
    summary: route.summary,
    tags: [tagOf(route)],
    ...(permission ? { 'x-lagbook-permission': permission } : {}),
    security: securityOf(route),
    parameters: [...pathParameters(template), ...(route.query ? queryParameters(route.query) : [])],
    responses: responsesOf(route),
  };
  const bodies = route.bodyMediaTypes ?? (route.body ? { 'application/json': route.body } : null);
  if (bodies) {
    op.requestBody = {
      required: true,
      content: Object.fromEntries(Object.entries(bodies).map(([type, schema]) => [type, { schema: inputJsonSchema(schema) }])),
    };
  }
  return op;
}

/**
 * Lagbook's OpenAPI 3.1 document, generated from the route table: each route's auth, summary,
 * the zod schemas its input is parsed with, and every status it can answer (standard-answers.ts).
 * Built once at start; the same object is served every time.
 */
export function buildOpenApiDocument(routes: readonly Route[], opts: { serverUrl?: string } = {}): JsonObject {
  const paths: Record<string, Record<string, JsonObject>> = {};
  const add = (method: string, template: string, op: JsonObject) => {
    (paths[template] ??= {})[method] = op;
  };
  for (const r of routes) {
    const template = openApiPath(fullPathOf(r));
    add(r.method, template, operationOf(r, template));
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lagbook API',
      version: '1',
      summary: "Research labs' data loggers: ingestion, channels, diagnostics and exports.",
      description:
        'Every lab route lives below /api/v1/labs/{lab} and needs a session or, for the read routes marked with personalToken, `Authorization: Bearer lbt_…`. A lab one is not a member of answers 404. Errors are `{ "error": { "code", "message" } }`; invalid input adds `fields` (each refused field by key, with its label and the reason) and its message reads `Label: reason.` for people.',
    },
    ...(opts.serverUrl ? { servers: [{ url: opts.serverUrl }] } : {}),
    paths,
    components: {
      securitySchemes: {
        sessionCookie: { type: 'apiKey', in: 'cookie', name: SESSION_COOKIE, description: 'The session a browser gets by signing in (OpenID Connect).' },
        ingestKey: {
          type: 'http',
          scheme: 'bearer',
          bearerFormat: 'lbk_<prefix>_<secret>',
          description: "A logger's ingest key; accepted only by POST /api/v1/ingest.",
        },
        personalToken: {
          type: 'http',
          scheme: 'bearer',
          bearerFormat: 'lbt_<prefix>_<secret>',
          description: "A member's personal API token; read routes of its own lab only, with its owner's current role.",
        },
      },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: {
            error: {
              type: 'object',
              required: ['code', 'message'],
              properties: {
                code: { type: 'string', description: 'Stable; programs branch on it.' },
                message: { type: 'string', description: 'For people, in plain words (it may change); one `Label: reason.` per refused field.' },
                fields: {
                  type: 'array',
                  description: 'Invalid input (400): each refused field by its key path, for programs and forms.',
                  items: {
                    type: 'object',
                    required: ['field', 'label', 'reason'],
                    properties: {
                      field: {
                        type: 'string',
                        description: "The field's key path as sent, dotted (`validMax`, `channels.2.key`); empty for the request as a whole.",
                      },
                      label: { type: 'string', description: 'The field as the forms name it.' },
                      reason: { type: 'string', description: 'Why it was refused, in plain words.' },
                    },
                  },
                },
                sample: { type: 'array', description: 'A batch refused whole: the first rows that could not be read.', items: {} },
              },
            },
          },
        },
      },
      responses: {
        InvalidInput: { description: STANDARD_ANSWERS[400], ...errorBody },
        Unauthenticated: { description: STANDARD_ANSWERS[401], ...errorBody },
        Forbidden: { description: STANDARD_ANSWERS[403], ...errorBody },
        NotFound: { description: STANDARD_ANSWERS[404], ...errorBody },
        Internal: { description: STANDARD_ANSWERS[500], ...errorBody },
        Unavailable: { description: STANDARD_ANSWERS[503], ...errorBody, headers: retryAfter },
      },
    },
  };
}
