import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, fillPath, validBodyFor, type LabWithEverything } from '../support/lab-fixture.ts';
import type { LabRouteSummary } from '../../server/http/routes/route.ts';

/**
 * Every refusal a person can read is in plain words. The test walks the lab route table (the
 * list the API document and the role matrix are built from); for every route that takes a JSON
 * body (the forms) an admin sends bad input made from the route's valid body and its schema in
 * the API document: an empty body, a list instead of the form, each field with a wrong type, a
 * text one character too long, a number just outside its bounds, a fraction for a whole number,
 * and the cross-field checks we know of. Query forms (filters, ranges) and the account routes get
 * their own bad inputs. Every 4xx answer's `message` must name no identifier: no camelCase, no
 * snake_case key, no dotted key path, no bare row id. Text the person typed (quoted) is theirs.
 */
type Json = Record<string, unknown>;
interface Sent {
  route: string;
  input: string;
  status: number;
  message: string;
}

const WRITE_METHODS = new Set(['post', 'patch', 'put']);
/** Routes whose body is no form (a file) or whose refusal is tested elsewhere. */
const NOT_FORMS = new Set(['POST /loggers/:loggerId/uploads']);

let t: TestApp;
let f: LabWithEverything;
let cookie: string;
let doc: Json;
const sent: Sent[] = [];

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  const admin = await buildMember(t.db, f.lab, { role: 'admin' });
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, admin.id);
  doc = (await request(t.app).get('/api/v1/openapi.json').expect(200)).body;
});
afterAll(async () => t.close());

/** The problems of a message for people: identifiers a scientist should never read. */
function identifiersIn(message: string): string[] {
  // what the person typed or chose by name is quoted and is theirs ("air_t", "Roof")
  const ours = message.replace(/"[^"]*"|“[^”]*”/g, '""');
  const found = [
    ...(ours.match(/\b[a-z]+[A-Z][A-Za-z0-9]*\b/g) ?? []).map((m) => `camelCase ${m}`),
    ...(ours.match(/\b[a-z0-9]+_[a-z0-9_]+\b/g) ?? []).map((m) => `snake_case ${m}`),
    ...(ours.match(/\bbody\.|\b[a-z][A-Za-z0-9]+\.[a-z][A-Za-z0-9]*(\.[A-Za-z0-9]+)*\b/g) ?? [])
      .filter((m) => !/^e\.g$/.test(m))
      .map((m) => `dotted path ${m}`),
    ...(ours.match(/\b(?:row|id)\s*#?\s*\d+\b|\b\d{6,}\b/gi) ?? []).map((m) => `row id ${m}`),
  ];
  return found;
}

/** Follows a local `$ref` of the API document. */
function deref(schema: unknown): Json {
  let s = schema as Json;
  for (let i = 0; i < 10 && s && typeof s.$ref === 'string'; i++) {
    s = (s.$ref as string)
      .slice(2)
      .split('/')
      .reduce<unknown>((node, key) => (node as Json)?.[key], doc) as Json;
  }
  return s ?? {};
}

/** The properties of an object schema, the variants of a union merged (first variant wins a key). */
function propertiesOf(schema: unknown): Record<string, Json> {
  const s = deref(schema);
  const variants = [s, ...((s.anyOf ?? s.oneOf ?? s.allOf ?? []) as unknown[]).map(deref)];
  const out: Record<string, Json> = {};
  for (const v of variants) for (const [k, p] of Object.entries((v.properties ?? {}) as Record<string, unknown>)) out[k] ??= deref(p);
  return out;
}

/** The type a property schema names (the first non-null of a union). */
function typeOf(p: Json): string | undefined {
  if (typeof p.type === 'string') return p.type;
  if (Array.isArray(p.type)) return (p.type as string[]).find((x) => x !== 'null');
  for (const v of (p.anyOf ?? p.oneOf ?? []) as unknown[]) {
    const t2 = typeOf(deref(v));
    if (t2 && t2 !== 'null') return t2;
  }
  return undefined;
}

/** A value of the wrong type for a property. */
function wrongType(type: string | undefined, current: unknown): unknown {
  switch (type ?? typeof current) {
    case 'string':
      return 42;
    case 'number':
    case 'integer':
      return 'twelve';
    case 'boolean':
      return 'perhaps';
    case 'array':
      return 'several';
    case 'object':
      return 7;
    default:
      return { unexpected: true };
  }
}

/** The bad variants of one field (by name) of a form, from its schema and current value. */
function badValuesOf(p: Json, current: unknown): Array<[string, unknown]> {
  const type = typeOf(p);
  const out: Array<[string, unknown]> = [['wrong type', wrongType(type, current)]];
  const variant = (p.anyOf ?? p.oneOf ?? []) as unknown[];
  const flat = variant.length ? { ...p, ...deref(variant.find((v) => typeOf(deref(v)) === type)) } : p;
  if (type === 'string' && typeof flat.maxLength === 'number') out.push([`${flat.maxLength + 1} characters`, 'x'.repeat(flat.maxLength + 1)]);
  if (type === 'string' && typeof flat.minLength === 'number' && flat.minLength > 0) out.push(['too short', '']);
  if (type === 'number' || type === 'integer') {
    if (typeof flat.maximum === 'number') out.push(['above the maximum', flat.maximum + 1]);
    if (typeof flat.exclusiveMaximum === 'number') out.push(['at the exclusive maximum', flat.exclusiveMaximum]);
    if (typeof flat.minimum === 'number') out.push(['below the minimum', flat.minimum - 1]);
    if (typeof flat.exclusiveMinimum === 'number') out.push(['at the exclusive minimum', flat.exclusiveMinimum]);
    if (type === 'integer') out.push(['a fraction', 1.5]);
  }
  if (type === 'array') {
    if (typeof flat.minItems === 'number' && flat.minItems > 0) out.push(['an empty list', []]);
    out.push(['a list of wrong things', [{ unexpected: true }]]);
  }
  return out;
}

/** The bad bodies of a form: made from its valid body and its schema, one change at a time. */
function badBodiesOf(schema: unknown, valid: Json): Array<[string, unknown]> {
  const out: Array<[string, unknown]> = [
    ['an empty form', {}],
    ['a list instead of the form', [1, 2]],
  ];
  // only a strict form refuses a field it does not have (others drop it, and the valid rest would be applied)
  if (deref(schema).additionalProperties === false) out.push(['an unknown field', { ...valid, colourCode: 'teal' }]);
  const props = propertiesOf(schema);
  for (const [name, p] of Object.entries(props)) {
    for (const [what, value] of badValuesOf(p, valid[name])) out.push([`${name}: ${what}`, { ...valid, [name]: value }]);
    // one level down (rule settings, a bulk repair's selection and action)
    const inner = valid[name];
    if (inner && typeof inner === 'object' && !Array.isArray(inner)) {
      for (const [innerName, ip] of Object.entries(propertiesOf(p))) {
        for (const [what, value] of badValuesOf(ip, (inner as Json)[innerName])) {
          out.push([`${name}.${innerName}: ${what}`, { ...valid, [name]: { ...(inner as Json), [innerName]: value } }]);
        }
      }
    }
  }
  return out;
}

/** Cross-field checks of the forms that the schema of one field cannot show. */
function crossFieldBodies(): Array<{ method: 'post' | 'patch'; path: string; input: string; body: Json }> {
  return [
    {
      method: 'post',
      path: '/loggers/:loggerId/channels',
      input: 'lowest valid value above the highest',
      body: { key: 'probe9', label: 'Probe', validMin: 10, validMax: 5 },
    },
    { method: 'patch', path: '/loggers/:loggerId/channels/:channelId', input: 'lowest valid value above the highest', body: { validMin: 10, validMax: 5 } },
    {
      method: 'post',
      path: '/loggers',
      input: 'two channels with one key',
      body: {
        name: 'Twin',
        timezone: 'UTC',
        expectedIntervalS: 60,
        channels: [
          { key: 'a', label: 'A' },
          { key: 'a', label: 'B' },
        ],
      },
    },
    {
      method: 'post',
      path: '/loggers',
      input: "a channel's range reversed",
      body: { name: 'Rev', timezone: 'UTC', expectedIntervalS: 60, channels: [{ key: 'a', label: 'A', validMin: 3, validMax: 1 }] },
    },
    {
      method: 'post',
      path: '/alert-rules',
      input: 'low limit above high limit',
      body: { name: 'Band', kind: 'bounds', channelId: f.ids.channelId, params: { low: 9, high: 2 } },
    },
    { method: 'post', path: '/alert-rules', input: 'no limit at all', body: { name: 'Band', kind: 'bounds', channelId: f.ids.channelId, params: {} } },
    {
      method: 'post',
      path: '/alert-rules',
      input: 'silence on a channel and a logger',
      body: { name: 'Quiet', kind: 'silence', channelId: f.ids.channelId, loggerId: f.params.loggerId, params: { factor: 3 } },
    },
    { method: 'post', path: '/alert-rules', input: 'a value rule with no channel chosen', body: { name: 'Watch', kind: 'bounds', params: { high: 3 } } },
    { method: 'post', path: '/alert-rules', input: 'an unknown kind', body: { name: 'X', kind: 'sometimes', channelId: f.ids.channelId, params: {} } },
    { method: 'patch', path: '/alert-rules/:ruleId', input: 'settings of another kind', body: { params: { low: 10, high: 8 } } },
    {
      method: 'post',
      path: '/notes',
      input: 'end before start',
      body: { channelId: f.ids.channelId, kindId: f.ids.kindId, text: 'x', start: '2026-01-02T08:00:00Z', end: '2026-01-02T07:00:00Z' },
    },
    {
      method: 'post',
      path: '/notes',
      input: 'a channel and a logger',
      body: {
        channelId: f.ids.channelId,
        loggerId: f.params.loggerId,
        kindId: f.ids.kindId,
        text: 'x',
        start: '2026-01-02T08:00:00Z',
        end: '2026-01-02T09:00:00Z',
      },
    },
    {
      method: 'post',
      path: '/notes',
      input: 'a kind of another lab',
      body: { channelId: f.ids.channelId, kindId: 999_999_999, text: 'x', start: '2026-01-02T08:00:00Z', end: '2026-01-02T09:00:00Z' },
    },
    { method: 'patch', path: '/notes/:noteId', input: 'end moved before start', body: { end: '1990-01-01T00:00:00Z' } },
    {
      method: 'post',
      path: '/quarantine/bulk/preview',
      input: 'filters and rows at once',
      body: { selection: { filter: {}, ids: [f.ids.quarantinedId] }, action: { kind: 'discard', reason: 'both' } },
    },
    {
      method: 'post',
      path: '/quarantine/bulk/preview',
      input: 'received-until before received-from',
      body: {
        selection: { filter: { receivedFrom: '2026-01-02T00:00:00Z', receivedTo: '2026-01-01T00:00:00Z' } },
        action: { kind: 'discard', reason: 'order' },
      },
    },
    {
      method: 'post',
      path: '/quarantine/bulk/preview',
      input: 'a shift of nothing',
      body: { selection: { ids: [f.ids.quarantinedId] }, action: { kind: 'shift', offsetMinutes: 0 } },
    },
    {
      method: 'post',
      path: '/quarantine/bulk/preview',
      input: 'a pattern layout without a pattern',
      body: { selection: { ids: [f.ids.quarantinedId] }, action: { kind: 'reread', timeFormat: 'pattern' } },
    },
    {
      method: 'post',
      path: '/quarantine/bulk/preview',
      input: 'a channel of no logger here',
      body: { selection: { ids: [f.ids.quarantinedId] }, action: { kind: 'map-channel', channelId: 999_999_999 } },
    },
    { method: 'post', path: '/quarantine/discard', input: 'a row that is not in quarantine', body: { ids: [987_654_321] } },
    {
      method: 'post',
      path: '/loggers/:loggerId/uploads/time-preview',
      input: 'a pattern layout without a pattern',
      body: { samples: ['24.11.2026 00:00'], timeZone: 'UTC', timeFormat: 'pattern' },
    },
    { method: 'post', path: '/loggers/:loggerId/test-reading', input: 'a value far outside the valid range', body: { channel: 'air_t', value: -99_999 } },
    { method: 'post', path: '/billing/checkout-session', input: 'a plan not offered', body: { plan: 'no-such-plan' } },
    { method: 'patch', path: '', input: 'nothing to change', body: {} },
    { method: 'post', path: '/deletion', input: 'the wrong lab name', body: { confirmName: 'Another lab' } },
  ];
}

/** Bad query strings of the list and range routes (filters people type into). */
const QUERIES: Array<[string, string]> = [
  ['/audit', '?pageSize=0'],
  ['/audit', '?pageSize=500&from=yesterday'],
  ['/alerts', '?days=0&status=closed'],
  ['/alerts', '?channelId=abc'],
  ['/quarantine', '?page=2'],
  ['/quarantine', '?cursor=not-a-cursor&pageSize=9999'],
  ['/quarantine', '?receivedFrom=2026-01-02T00:00:00Z&receivedTo=2026-01-01'],
  ['/channels/:channelId/series', '?points=3&from=yesterday'],
  ['/channels/:channelId/series', '?from=2026-01-02T00:00:00Z&to=2026-01-01T00:00:00Z'],
  ['/channels/:channelId/readings.csv', '?from=1990-01-01T00:00:00Z&to=2026-01-01T00:00:00Z'],
  ['/channels/:channelId/alerts', '?from=soon'],
  ['/notes', '?from=2026-01-02T00:00:00Z&to=2026-01-01T00:00:00Z'],
  ['/loggers/not-a-number', ''],
  ['/channels/0/series', ''],
];

async function send(method: string, path: string, input: string, body: unknown, query = ''): Promise<void> {
  const url = path.startsWith('/api/') ? path : `/api/v1/labs/${f.lab.slug}${fillPath(path, f.params)}${query}`;
  const req = request(t.app)[method as 'post'](url).set('Cookie', cookie);
  const res = body === undefined ? await req : await req.send(body as object);
  if (res.status >= 400 && res.status < 500 && res.body?.error) {
    sent.push({ route: `${method.toUpperCase()} ${path}${query}`, input, status: res.status, message: String(res.body.error.message) });
  }
}

describe('the words of every refusal', () => {
  it('no 4xx message of any form names an identifier', async () => {
    const routes = (t.app.locals.labRoutes as LabRouteSummary[]).filter((r) => WRITE_METHODS.has(r.method));
    const forms = new Set<string>();
    for (const route of routes) {
      const key = `${route.method.toUpperCase()} ${route.path}`;
      if (NOT_FORMS.has(key)) continue;
      const template = `/api/v1/labs/{lab}${route.path.replace(/:([A-Za-z]+)/g, '{$1}')}`;
      const op = ((doc.paths as Record<string, Record<string, Json>>)[template] ?? {})[route.method];
      const schema = (op?.requestBody as Json | undefined)?.content as Record<string, Json> | undefined;
      if (!schema?.['application/json']) continue;
      forms.add(key);
      const valid = (validBodyFor(route.method, route.path, f) ?? {}) as Json;
      for (const [input, body] of badBodiesOf(schema['application/json'].schema, valid)) await send(route.method, route.path, input, body);
    }
    for (const c of crossFieldBodies()) {
      forms.add(`${c.method.toUpperCase()} ${c.path}`);
      await send(c.method, c.path, c.input, c.body);
    }
    // the forms outside a lab: a new lab, the person's own settings
    for (const [input, body] of [
      ['an empty form', {}],
      ['a one-letter name', { name: 'x' }],
      ['a bad address', { name: 'Good name', slug: 'Bad Slug' }],
      ['a name with no letters', { name: '!!' }],
      ['a number as name', { name: 42 }],
    ] as Array<[string, unknown]>) {
      await send('post', '/api/v1/labs', input, body);
    }
    for (const [input, body] of [
      ['an unknown zone', { timeZone: 'Mars/Olympus' }],
      ['a number as zone', { timeZone: 5 }],
      ['an empty form', {}],
    ] as Array<[string, unknown]>) {
      await send('patch', '/api/v1/me', input, body);
    }
    forms.add('POST /api/v1/labs').add('PATCH /api/v1/me');
    for (const [path, query] of QUERIES) await send('get', path, `query ${query || '(path)'}`, undefined, query);

    const bad = sent.flatMap((s) => identifiersIn(s.message).map((problem) => `${s.route} [${s.input}] ${s.status}: ${problem} in "${s.message}"`));
    // LAGBOOK_WORDING_DUMP=1 prints every refusal read, for reviewing the wording as a whole
    if (process.env.LAGBOOK_WORDING_DUMP) console.info(sent.map((x) => `${x.route} [${x.input}] ${x.status}: ${x.message}`).join('\n'));
    console.info(`wording: ${forms.size} forms and ${QUERIES.length} queries checked, ${sent.length} refusals read, ${bad.length} with identifiers`);
    expect(bad).toEqual([]);
    // the walk reaches the forms: if the route table or the document stop feeding it, this fails
    expect(forms.size).toBeGreaterThanOrEqual(25);
    expect(sent.length).toBeGreaterThanOrEqual(250);
  });

  it('flags the identifiers it is meant to catch, and not plain words', () => {
    // checks of the checker itself, on messages in the old style (before the catalogues)
    expect(identifiersIn('validMin must be below validMax')).toEqual(['camelCase validMin', 'camelCase validMax']);
    expect(identifiersIn('body: Unrecognized key: "kind"; expected wrong_type')).toEqual(['snake_case wrong_type']);
    expect(identifiersIn('params.low: must be below the high limit')).toEqual(['dotted path params.low']);
    expect(identifiersIn('Row 224987835399788 is back in quarantine')).toEqual(['row id Row 224987835399788']);
    expect(identifiersIn('Channel to store them under: "old_air" is retired; choose a channel, e.g. the one in use.')).toEqual([]);
    expect(identifiersIn('Start: must be a date and time with its zone, e.g. 2026-03-01T14:00:00+01:00.')).toEqual([]);
  });
});
