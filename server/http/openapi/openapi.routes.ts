import { defineRoute, type Route } from '../routes/route.ts';

/**
 * `GET /api/v1/openapi.json`: the API document, public (no session, no token). The document is
 * built (at start, in app.ts) from the route table that contains this route, so it comes in as a
 * getter; its JSON text is made once, on the first request, and the same bytes are sent after.
 */
export function openApiRoutes(deps: { document: () => object }): Route[] {
  let body: string | null = null;
  return [
    defineRoute({
      method: 'get',
      path: '/api/v1/openapi.json',
      auth: 'none',
      tag: 'service',
      summary: 'This API document (OpenAPI 3.1).',
      response: { status: 200, description: 'The OpenAPI 3.1 document of every route, with every status each can answer. Cached for 5 minutes.' },
      usesDatabase: false,
      stream: true,
      handle: async ({ setHeader }, { res }) => {
        body ??= JSON.stringify(deps.document());
        setHeader('Cache-Control', 'public, max-age=300');
        res.type('application/json').send(body);
      },
    }),
  ];
}
