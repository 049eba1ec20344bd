import { constraintsOf, followPointer, schemaFields, typeText, type FieldRow } from './schema-fields.ts';
import type { OpenApiDocument, OpenApiOperation, OpenApiParameter, OpenApiRef, OpenApiResponse } from './openapi-types.ts';

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;
export type HttpMethod = (typeof METHODS)[number];

/** One operation as the API page shows it. */
export interface OperationView {
  id: string;
  method: HttpMethod;
  path: string;
  summary: string;
  /** The names of the security schemes that each alone let a caller in; empty for a public route. */
  auth: string[];
  permission?: string;
  pathParams: FieldRow[];
  queryParams: FieldRow[];
  body?: { mediaType: string; fields: FieldRow[] };
  /** Every answer the operation documents, by status in ascending order. */
  answers: AnswerView[];
}

/** One documented answer: its status (`200`, `404`, or a range such as `2XX`), what it means, its media types. */
export interface AnswerView {
  status: string;
  description: string;
  mediaTypes: string[];
  /** Response headers it carries (`Retry-After`). */
  headers: string[];
}

/** Operations that share a tag, in the order their paths sort. */
export interface OperationGroup {
  name: string;
  operations: OperationView[];
}

function parameterRow(p: OpenApiParameter, doc: OpenApiDocument): FieldRow {
  const schema = p.schema ?? {};
  return {
    name: p.name,
    type: typeText(schema, doc),
    required: p.required ?? false,
    constraints: constraintsOf(schema, doc),
    description: p.description ?? schema.description,
  };
}

/** An answer written out, or the shared one its `$ref` names (`#/components/responses/NotFound`). */
function resolveResponse(response: OpenApiResponse | OpenApiRef, doc: OpenApiDocument): OpenApiResponse {
  if (!('$ref' in response)) return response;
  return (followPointer(response.$ref, doc) as OpenApiResponse | undefined) ?? { description: `(see ${response.$ref})` };
}

/** The operation's answers with their references resolved, in status order (a range such as `2XX` first in its class). */
export function answersOf(op: OpenApiOperation, doc: OpenApiDocument): AnswerView[] {
  return Object.entries(op.responses ?? {})
    .map(([status, response]) => {
      const r = resolveResponse(response, doc);
      return { status, description: r.description ?? '', mediaTypes: Object.keys(r.content ?? {}), headers: Object.keys(r.headers ?? {}) };
    })
    .sort((a, b) => a.status.replace(/X/g, '0').localeCompare(b.status.replace(/X/g, '0')) || a.status.localeCompare(b.status));
}

function viewOf(method: HttpMethod, path: string, op: OpenApiOperation, doc: OpenApiDocument): OperationView {
  const params = op.parameters ?? [];
  const [mediaType, content] = Object.entries(op.requestBody?.content ?? {})[0] ?? [];
  return {
    id: op.operationId ?? `${method}-${path}`,
    method,
    path,
    summary: op.summary ?? op.description ?? '',
    auth: [...new Set((op.security ?? []).flatMap((requirement) => Object.keys(requirement)))],
    permission: op['x-lagbook-permission'],
    pathParams: params.filter((p) => p.in === 'path').map((p) => parameterRow(p, doc)),
    queryParams: params.filter((p) => p.in === 'query').map((p) => parameterRow(p, doc)),
    ...(mediaType ? { body: { mediaType, fields: content?.schema ? schemaFields(content.schema, doc) : [] } } : {}),
    answers: answersOf(op, doc),
  };
}

/**
 * The document's operations grouped by their first tag (or "other"), groups in alphabetical
 * order, operations by path and then in GET, POST, PUT, PATCH, DELETE order.
 */
export function groupOperations(doc: OpenApiDocument): OperationGroup[] {
  const groups = new Map<string, OperationView[]>();
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method] as OpenApiOperation | undefined;
      if (!op) continue;
      const name = op.tags?.[0] ?? 'other';
      (groups.get(name) ?? groups.set(name, []).get(name)!).push(viewOf(method, path, op, doc));
    }
  }
  return [...groups.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([name, operations]) => ({
      name,
      operations: operations.sort((a, b) => a.path.localeCompare(b.path) || METHODS.indexOf(a.method) - METHODS.indexOf(b.method)),
    }));
}
