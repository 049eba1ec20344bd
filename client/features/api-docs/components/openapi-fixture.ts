import type { OpenApiDocument } from './openapi-types.ts';

/**
 * A small API document for the page's tests, written by hand in the shape Lagbook's server
 * generates (OpenAPI 3.1.0, zod-made JSON Schemas with nullable alternatives as `anyOf`,
 * zod's safe-integer bounds on an integer, a `$ref` to a component schema, every status an
 * operation answers, the standard ones as `$ref`s to `#/components/responses/…`).
 */
export const OPENAPI_FIXTURE: OpenApiDocument = {
  openapi: '3.1.0',
  info: { title: 'Lagbook API', version: '1', summary: 'Loggers, channels and diagnostics.', description: 'Lab routes live below `/api/v1/labs/{lab}`.' },
  servers: [{ url: 'http://127.0.0.1:5310' }],
  paths: {
    '/api/v1/labs/{lab}/tokens': {
      post: {
        operationId: 'postTokens',
        summary: 'Make a personal API token.',
        tags: ['tokens'],
        'x-lagbook-permission': 'tokens.manage-own',
        security: [{ sessionCookie: [] }],
        parameters: [
          { name: 'lab', in: 'path', required: true, schema: { type: 'string', pattern: '^[a-z0-9-]{1,64}$' }, description: "the lab's address (slug)" },
        ],
        requestBody: {
          required: true,
          content: {
            'application/json': {
              schema: {
                type: 'object',
                properties: { name: { type: 'string', minLength: 1, maxLength: 80 }, expiresInDays: { type: 'integer', minimum: 1, maximum: 365 } },
                required: ['name', 'expiresInDays'],
              },
            },
          },
        },
        responses: {
          '201': { description: 'The token, shown once.', content: { 'application/json': {} } },
          '400': { $ref: '#/components/responses/InvalidInput' },
          '403': { $ref: '#/components/responses/Forbidden' },
          '409': {
            description: '`token_limit_reached`: this person has as many tokens in the lab as one may hold.',
            content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
          },
          '503': { $ref: '#/components/responses/Unavailable' },
        },
      },
    },
    '/api/v1/labs/{lab}/channels': {
      get: {
        operationId: 'getChannels',
        summary: 'List the channels of the lab.',
        tags: ['channels'],
        'x-lagbook-permission': 'channels.read',
        security: [{ sessionCookie: [] }, { personalToken: [] }],
        parameters: [
          { name: 'lab', in: 'path', required: true, schema: { type: 'string' } },
          { name: 'page', in: 'query', required: false, schema: { type: 'integer', minimum: -9007199254740991, maximum: 9007199254740991, default: 1 } },
        ],
        responses: { '200': { description: 'One page of channels.', content: { 'application/json': {} } }, '404': { $ref: '#/components/responses/NotFound' } },
      },
    },
    '/api/v1/labs/{lab}/loggers': {
      post: {
        operationId: 'postLoggers',
        summary: 'Register a logger with its channels.',
        tags: ['loggers'],
        security: [{ sessionCookie: [] }],
        parameters: [{ name: 'lab', in: 'path', required: true, schema: { type: 'string' } }],
        requestBody: {
          content: {
            'application/json': {
              schema: {
                type: 'object',
                properties: {
                  site: { anyOf: [{ type: 'string', maxLength: 120 }, { type: 'null' }] },
                  format: { type: 'string', enum: ['long', 'wide'] },
                  channels: {
                    default: [],
                    maxItems: 64,
                    type: 'array',
                    items: {
                      type: 'object',
                      properties: { key: { type: 'string', pattern: '^[A-Za-z0-9][A-Za-z0-9_.-]{0,63}$' }, validMin: { type: ['number', 'null'] } },
                      required: ['key'],
                    },
                  },
                  owner: { $ref: '#/components/schemas/Person' },
                },
                required: ['channels'],
              },
            },
          },
        },
      },
    },
    '/api/v1/ingest': {
      post: {
        operationId: 'postIngest',
        summary: 'Post readings with an ingest key.',
        tags: ['ingest'],
        security: [{ ingestKey: [] }],
        requestBody: { content: { 'text/csv': { schema: { type: 'string', description: 'CSV text with the header channel,ts,value' } } } },
        responses: {
          '200': { description: 'Committed.', content: { 'application/json': {} } },
          '429': {
            description: '`rate_limited`: this logger posts too fast.',
            content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
            headers: { 'Retry-After': { description: 'Seconds to wait before trying again.', schema: { type: 'integer' } } },
          },
        },
      },
      get: { summary: 'Nothing here', tags: ['ingest'] },
    },
  },
  components: {
    securitySchemes: {
      sessionCookie: { type: 'apiKey', in: 'cookie', name: 'lagbook.sid', description: 'The session a browser gets by signing in.' },
      personalToken: { type: 'http', scheme: 'bearer', bearerFormat: 'lbt_<prefix>_<secret>', description: "A member's personal API token." },
      ingestKey: { type: 'http', scheme: 'bearer', bearerFormat: 'lbk_<prefix>_<secret>', description: "A logger's ingest key." },
    },
    schemas: {
      Person: { type: 'object', description: 'who owns it', properties: { email: { type: 'string', format: 'email' } }, required: ['email'] },
      Error: {
        type: 'object',
        required: ['error'],
        properties: { error: { type: 'object', properties: { code: { type: 'string' }, message: { type: 'string' } } } },
      },
    },
    responses: {
      InvalidInput: {
        description: 'The input failed validation (`invalid_input`).',
        content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
      },
      Forbidden: {
        description: 'The role does not allow this (`forbidden`).',
        content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
      },
      NotFound: { description: 'No such thing here (`not_found`).', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } },
      Unavailable: {
        description: 'The database is unreachable (`service_unavailable`).',
        content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
        headers: { 'Retry-After': { description: 'Seconds to wait before trying again.', schema: { type: 'integer' } } },
      },
    },
  },
};
