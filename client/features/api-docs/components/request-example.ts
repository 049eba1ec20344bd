import type { OperationView } from './api-outline.ts';
import type { FieldRow } from './schema-fields.ts';

/** What stands in for a secret or a value in an example, by security scheme (names as the document's). */
const AUTH_LINES: Record<string, string> = {
  personalToken: 'Authorization: Bearer <your personal token>',
  ingestKey: 'Authorization: Bearer <the logger’s ingest key>',
  sessionCookie: 'Cookie: <your browser session>',
};

/** A stand-in value of a field's type for an example body. */
function sampleValue(row: FieldRow): unknown {
  if (row.type.startsWith('array')) return [];
  if (row.type.startsWith('integer')) return 1;
  if (row.type.startsWith('number')) return 0;
  if (row.type.startsWith('boolean')) return false;
  if (row.type.startsWith('object')) return {};
  return `<${row.name}>`;
}

/**
 * An example request for an operation as plain HTTP text (request line, sign-in header, body),
 * with the parameters the caller must fill in left as `{name}` / `<name>`: the required query
 * parameters and the top-level body fields that must be sent. A person copies it and fills in.
 */
export function requestExample(op: OperationView): string {
  const query = op.queryParams
    .filter((p) => p.required)
    .map((p) => `${p.name}=<${p.name}>`)
    .join('&');
  const lines = [`${op.method.toUpperCase()} ${op.path}${query ? `?${query}` : ''}`];
  const auth = op.auth.find((a) => AUTH_LINES[a] && a !== 'sessionCookie') ?? op.auth.find((a) => AUTH_LINES[a]);
  if (auth) lines.push(AUTH_LINES[auth]);
  if (op.body) {
    lines.push(`Content-Type: ${op.body.mediaType}`, '');
    if (op.body.mediaType === 'application/json') {
      const top = op.body.fields.filter((f) => f.required && !/[.[]/.test(f.name));
      lines.push(JSON.stringify(Object.fromEntries(top.map((f) => [f.name, sampleValue(f)])), null, 2));
    } else {
      lines.push(`<${op.body.mediaType} body>`);
    }
  }
  return lines.join('\n');
}
