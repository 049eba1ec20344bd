import { constraintsOf, followPointer, schemaFields, typeText, type FieldRow } from './schema-fields.ts';
import type { OpenApiDocument, OpenApiOperation, OpenApiParameter, OpenApiRef, OpenApiResponse } from './openapi-types.ts';

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;
export type HttpMethod = (typeof METHODS)[number];

/** One operation as the API page shows it. */
export interface OperationView {
  id: string;
  method: HttpMethod;
  path: string;
  /** A short title in plain words (operationTitle). */
  title: string;
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

/** Operations that serve one task, in the order their paths sort. */
export interface OperationGroup {
  /** Stable anchor id of the task (`read`, `send` …). */
  id: string;
  /** The task in plain words ("Read readings and analyses"). */
  name: string;
  /** One sentence on what the task's operations are for. */
  intro: string;
  operations: OperationView[];
}

/**
 * The tasks the reference is arranged by — what a person wants to do, not how the server files
 * its routes — in page order. An operation belongs to the first task whose test matches its
 * path (lab routes without the `/api/v1/labs/{lab}` prefix) or its tag.
 */
export const TASKS: ReadonlyArray<{ id: string; name: string; intro: string; paths?: RegExp; tags?: readonly string[] }> = [
  {
    id: 'send',
    name: 'Send readings',
    intro: 'Deliver readings from a logger or a file, try a logger’s set-up with a test reading, and deal with rows that were refused.',
    paths: /^\/(loggers\/\{loggerId\}\/(uploads|test-reading)|channels\/\{channelId\}\/test-readings|quarantine)/,
    tags: ['ingest', 'quarantine'],
  },
  {
    id: 'read',
    name: 'Read readings and analyses',
    intro: 'Channels with their latest values, chart series, exports, diagnostics and before/after comparisons.',
    paths: /^\/(channels(\/\{channelId\}(\/(series|readings\.csv|diagnostics|diagnostics\.csv|comparison))?)?|overview|export\.zip)$/,
  },
  {
    id: 'notes',
    name: 'Note what happened',
    intro: 'Notes on loggers and channels (maintenance, calibration, spans to leave out of analysis) and the kinds of note a lab uses.',
    tags: ['notes', 'note-kinds'],
    paths: /\/notes(\.csv)?$|\/notes\/|^\/note-kinds/,
  },
  {
    id: 'loggers',
    name: 'Set up loggers and channels',
    intro: 'Register loggers, describe their channels and valid ranges, and issue or revoke the keys they send with.',
    tags: ['loggers'],
  },
  {
    id: 'alerts',
    name: 'Alerts',
    intro: 'Rules that watch a channel, the alerts they raise, and who is told.',
    tags: ['alert-rules', 'alerts'],
    paths: /\/alerts$/,
  },
  {
    id: 'lab',
    name: 'Lab, members and access',
    intro: 'The lab itself, its members and invitations, personal tokens, the audit log and your own account.',
    tags: ['lab', 'labs', 'members', 'membership', 'invitations', 'tokens', 'audit', 'deletion', 'account'],
  },
  { id: 'billing', name: 'Plan and billing', intro: 'The lab’s plan, invoices and changes of plan.', tags: ['billing'] },
];

/** Where operations no task claims are listed. */
const OTHER_TASK = { id: 'service', name: 'Service', intro: 'The service itself: its health and this document.' };

/** The path without the lab prefix, as the task tests read it. */
const labRelative = (path: string) => path.replace(/^\/api\/v1\/labs\/\{lab\}(?=\/)/, '');

/** The task an operation serves: the first of TASKS whose path test or tag matches. */
export function taskOf(path: string, tag: string): string {
  const rel = labRelative(path);
  return (TASKS.find((t) => t.paths?.test(rel)) ?? TASKS.find((t) => t.tags?.includes(tag)))?.id ?? OTHER_TASK.id;
}

/** Things a path segment names: [many, one] for collections, or one phrase for a single thing. */
const COLLECTIONS: Record<string, [many: string, one: string]> = {
  'alert-rules': ['alert rules', 'an alert rule'],
  alerts: ['alerts', 'an alert'],
  channels: ['channels', 'a channel'],
  loggers: ['loggers', 'a logger'],
  keys: ['ingest keys', 'an ingest key'],
  notes: ['notes', 'a note'],
  'note-kinds': ['note kinds', 'a note kind'],
  members: ['members', 'a member'],
  invitations: ['invitations', 'an invitation'],
  tokens: ['personal tokens', 'a personal token'],
  'test-readings': ['test readings', 'a test reading'],
  uploads: ['uploads', 'an upload'],
  runs: ['bulk repairs', 'a bulk repair'],
  invoices: ['invoices', 'an invoice'],
  labs: ['your labs', 'a lab'],
};
const THINGS: Record<string, string> = {
  overview: 'the lab overview',
  series: 'a chart series',
  diagnostics: 'diagnostics',
  comparison: 'a before/after comparison',
  'diagnostics.csv': 'diagnostics',
  'readings.csv': 'readings',
  'notes.csv': 'notes',
  'export.csv': 'refused rows',
  'export.zip': 'all of the lab’s data',
  audit: 'the audit log',
  billing: 'the plan and usage',
  membership: 'your membership',
  me: 'your account',
  deletion: 'the lab',
  quarantine: 'refused rows',
  healthz: 'the service’s health',
  'openapi.json': 'this API document',
  subscription: 'your subscription',
  'time-preview': 'how an upload’s times will be read',
  'test-reading': 'a test reading',
  ingest: 'readings',
  preview: 'what a bulk repair would change',
  discard: 'refused rows',
  resubmit: 'refused rows again',
};
/** Segments that are actions on the thing before them. */
const ACTIONS: Record<string, string> = { acknowledge: 'Acknowledge', retire: 'Retire', resend: 'Resend', accept: 'Accept' };
const VERBS: Record<HttpMethod, { many: string; one: string; thing: string }> = {
  get: { many: 'List', one: 'Read', thing: 'Read' },
  post: { many: 'Add', one: 'Act on', thing: 'Make' },
  put: { many: 'Replace', one: 'Replace', thing: 'Set' },
  patch: { many: 'Change', one: 'Change', thing: 'Change' },
  delete: { many: 'Remove', one: 'Delete', thing: 'Delete' },
};
/** Verbs that read better than the general ones for a particular segment and method. */
const SPECIAL: Record<string, string> = {
  'post ingest': 'Send readings',
  'post test-reading': 'Send a test reading',
  'post discard': 'Discard refused rows',
  'post resubmit': 'Send refused rows again',
  'post runs': 'Start a bulk repair',
  'post preview': 'Preview what a bulk repair would change',
  'post time-preview': 'Preview how an upload’s times will be read',
  'post subscription': 'Subscribe to an alert rule',
  'delete subscription': 'Unsubscribe from an alert rule',
  'delete membership': 'Leave the lab',
  'post deletion': 'Ask for the lab to be deleted',
  'delete deletion': 'Cancel the lab’s deletion',
  'get healthz': 'Check the service’s health',
  'post tokens': 'Make a personal token',
  'post uploads': 'Upload a file of readings',
  'post labs': 'Found a lab',
  'post checkout-session': 'Open a payment page',
  'post portal-session': 'Open the billing self-service page',
  'post plan-change': 'Change the plan',
  'delete tokens/one': 'Revoke a personal token',
  'delete keys/one': 'Revoke an ingest key',
  'post keys': 'Issue an ingest key for a logger',
  'post invitations': 'Invite someone to the lab',
  'delete invitations/one': 'Withdraw an invitation',
  'delete members/one': 'Remove a member from the lab',
};
/** Titles of the operations outside the lab whose paths the rules above do not read well. */
const BY_PATH: Record<string, string> = {
  'get /api/v1/invitations/{lab}/{token}': 'Read an invitation from its link',
  'post /api/v1/invitations/{lab}/{token}/accept': 'Accept an invitation',
};

/**
 * A short title for an operation in plain words, from its method and path ("List loggers",
 * "Read diagnostics of a channel", "Retire a logger"), so the reference reads as things to do;
 * the method and path are shown beside it as written.
 */
export function operationTitle(method: HttpMethod, path: string): string {
  if (BY_PATH[`${method} ${path}`]) return BY_PATH[`${method} ${path}`];
  const parts = labRelative(path)
    .replace(/^\/api\/v1/, '')
    .split('/')
    .filter(Boolean);
  const literal = (i: number) => (parts[i] && !parts[i].startsWith('{') ? parts[i] : undefined);
  const last = parts.length - 1;
  const endsWithId = parts[last]?.startsWith('{') ?? false;
  const noun = endsWithId ? literal(last - 1) : literal(last);
  if (noun === undefined) return `${method.toUpperCase()} ${path}`;
  const special = SPECIAL[`${method} ${noun}${endsWithId ? '/one' : ''}`];
  // the collection item this path hangs under ("of a channel"), when there is one
  const parentAt = endsWithId ? last - 3 : last - 2;
  const parent = parts[parentAt + 1]?.startsWith('{') ? COLLECTIONS[literal(parentAt) ?? ''] : undefined;
  const of = parent ? ` of ${parent[1]}` : '';
  if (special) return special;
  if (ACTIONS[noun] && parent) return `${ACTIONS[noun]} ${parent[1]}`;
  const collection = COLLECTIONS[noun];
  if (collection) {
    if (endsWithId) return `${VERBS[method].one} ${collection[1]}`;
    return method === 'post' ? `Add ${collection[1]}${of ? ` to ${parent![1]}` : ''}` : `${VERBS[method].many} ${collection[0]}${of}`;
  }
  const thing = THINGS[noun];
  if (thing) {
    const file = /\.(csv|zip)$/.exec(noun)?.[1];
    if (file) return `Download ${thing}${of} as ${file === 'csv' ? 'CSV' : 'one ZIP archive'}`;
    return `${VERBS[method].thing} ${thing}${of}`;
  }
  return `${VERBS[method].thing} ${noun.replace(/[-.]/g, ' ')}${of}`;
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
    title: operationTitle(method, path),
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
 * The document's operations grouped by task (TASKS, in that order, then "Service" for the rest;
 * empty tasks left out), operations by path and then in GET, POST, PUT, PATCH, DELETE order.
 */
export function groupOperations(doc: OpenApiDocument): OperationGroup[] {
  const byTask = new Map<string, OperationView[]>();
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method] as OpenApiOperation | undefined;
      if (!op) continue;
      const task = taskOf(path, op.tags?.[0] ?? '');
      (byTask.get(task) ?? byTask.set(task, []).get(task)!).push(viewOf(method, path, op, doc));
    }
  }
  return [...TASKS, OTHER_TASK]
    .filter((t) => byTask.has(t.id))
    .map((t) => ({
      id: t.id,
      name: t.name,
      intro: t.intro,
      operations: byTask.get(t.id)!.sort((a, b) => a.path.localeCompare(b.path) || METHODS.indexOf(a.method) - METHODS.indexOf(b.method)),
    }));
}
