import { permissionOf, type Route } from './route.ts';

/** The standard answers, by status, with the description the API document gives them. */
export const STANDARD_ANSWERS = {
  304: 'Not modified: the answer equals the one whose ETag the request sent in If-None-Match (no body).',
  400: 'The input failed validation (`invalid_input`; `fields` lists each refused field by key with its label and reason, and the message reads `Label: reason.` for people).',
  401: 'Not signed in, or the token or key is not valid (`unauthenticated`, `invalid_token`).',
  403: 'The role (or a personal token) does not allow this (`forbidden`, `token_not_allowed`), or a write came from another site (`cross_site_request`).',
  404: 'No such thing here — also the answer for another lab and its resources (`not_found`).',
  413: 'The request body is too large (`payload_too_large`).',
  415: 'The body is not in a media type, charset or Content-Encoding this route reads (`unsupported_media_type`, `unsupported_charset`, `unsupported_encoding`).',
  500: 'Something went wrong on our side (`internal`); nothing about it is told.',
  503: 'The database is unreachable, read-only or full (`service_unavailable`); nothing was saved. Retry-After says when to try again.',
} as const;

export type StandardStatus = keyof typeof STANDARD_ANSWERS;

/**
 * Every status a route can answer: its success, the standard answers its auth, input and database
 * use imply, and its own declared errors (whose description wins over the standard one).
 * Invalid input answers 400 on every route, whatever part of the request was wrong.
 */
export function answersOf(route: Route): Map<number, string> {
  const out = new Map<number, string>([[route.response.status, route.response.description]]);
  const standard = (status: StandardStatus) => out.set(status, STANDARD_ANSWERS[status]);
  // Express tags GET answers with an ETag and answers a matching If-None-Match with 304
  if (route.method === 'get') standard(304);
  if (route.params || route.query || route.body || route.bodyMediaTypes) standard(400);
  if (route.auth !== 'none' && route.auth !== 'webhook-signature') standard(401);
  if (permissionOf(route)) {
    standard(403);
    standard(404);
  } else if (route.auth === 'session' && route.method !== 'get') {
    // the same-origin check on writes made with a session cookie
    standard(403);
  }
  if (route.params) standard(404);
  if (route.body || route.bodyMediaTypes) {
    standard(413);
    standard(415);
  }
  standard(500);
  if (route.usesDatabase !== false) standard(503);
  for (const [status, description] of Object.entries(route.errors ?? {})) out.set(Number(status), description);
  return new Map([...out].sort(([a], [b]) => a - b));
}
