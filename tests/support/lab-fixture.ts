import { join } from 'node:path';
import type { Knex } from 'knex';
import { buildLab, buildMember, type TestLab } from './factories.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';
import { newIngestKey } from '../../server/services/ingest-key-format.ts';
import { newPersonalToken } from '../../server/services/personal-token-format.ts';

let seq = 0;
const rid = () => Math.floor(Math.random() * 2 ** 40) + 1 + seq++;

/**
 * A lab with one of every lab-owned thing a route can address: a guest member, a pending
 * invitation, a logger with a channel and an ingest key, a quarantined row, a personal token of
 * the founder's, an alert rule with a subscription and a resolved alert. `params` maps each
 * route parameter name to the id of that lab's thing. With `rowInEveryTable`, the lab also gets
 * a row in every other lab-owned table (readings and their rollups, an audit event, a sent alert
 * mail, its billing row and a usage snapshot), so the isolation suite has something to compare
 * in each table of LAB_OWNED_TABLES.
 */
export async function buildLabWithEverything(db: Knex, { rowInEveryTable = false, ...overrides }: Partial<{ name: string; rowInEveryTable: boolean }> = {}) {
  const lab: TestLab = await buildLab(db, overrides);
  const founder = await buildMember(db, lab, { role: 'admin' });
  const guest = await buildMember(db, lab, { role: 'guest' });
  const invitationId = rid();
  await db('invitations').insert({
    tenant_id: lab.id,
    id: invitationId,
    email: `pending-${invitationId}@lab.example`,
    role: 'scientist',
    token_hash: invitationId.toString(16).padStart(64, 'f'),
    expires_at: new Date(Date.now() + 86400_000),
  });
  const loggerId = rid();
  await db('loggers').insert({ tenant_id: lab.id, id: loggerId, name: `Logger ${loggerId}`, timezone: 'UTC', expected_interval_s: 60 });
  const channelId = rid();
  await db('channels').insert({ tenant_id: lab.id, id: channelId, logger_id: loggerId, channel_key: 'air_t', label: 'Air temperature', unit: '°C' });
  const key = newIngestKey();
  const keyId = rid();
  await db('ingest_keys').insert({ tenant_id: lab.id, id: keyId, logger_id: loggerId, prefix: key.prefix, key_hash: key.hash });
  const quarantinedId = rid();
  await db('quarantined_rows').insert({
    tenant_id: lab.id,
    id: quarantinedId,
    logger_id: loggerId,
    source: 'api',
    row_index: 0,
    reason_code: 'bad_value',
    reason: 'value: must be a finite number',
    channel_key: 'air_t',
    ts_raw: '2026-01-01T00:00:00Z',
    value_raw: '"warm"',
  });
  // a finished bulk quarantine repair (discard of one row)
  const bulkRunId = rid();
  await db('quarantine_bulk_runs').insert({
    tenant_id: lab.id,
    id: bulkRunId,
    state: 'done',
    action: 'discard',
    request: JSON.stringify({ selection: { ids: [1] }, action: { kind: 'discard', reason: 'sensor unplugged' } }),
    started_by: founder.id,
    started_by_name: 'Founder',
    total: 1,
    done: 1,
    outcome: JSON.stringify({ selected: 1, stored: 0, alreadyStored: 0, stillQuarantined: 0, discarded: 1, reasons: [] }),
    finished_at: new Date(),
  });
  const personal = newPersonalToken();
  const tokenId = rid();
  await db('personal_tokens').insert({
    tenant_id: lab.id,
    id: tokenId,
    user_id: founder.id,
    name: 'Founder notebook',
    prefix: personal.prefix,
    token_hash: personal.hash,
    expires_at: new Date(Date.now() + 30 * 86400_000),
  });
  const ruleId = rid();
  await db('alert_rules').insert({
    tenant_id: lab.id,
    id: ruleId,
    name: 'Air too warm',
    kind: 'bounds',
    channel_id: channelId,
    params: JSON.stringify({ low: null, high: 30, holdS: 0 }),
    enabled: false,
    created_by: founder.id,
    watching_since: Date.now(),
  });
  await db('alert_subscriptions').insert({ tenant_id: lab.id, rule_id: ruleId, user_id: founder.id });
  const alertId = rid();
  await db('alerts').insert({
    tenant_id: lab.id,
    id: alertId,
    rule_id: ruleId,
    rule_name: 'Air too warm',
    kind: 'bounds',
    channel_id: channelId,
    opened_at: Date.now() - 3_600_000,
    opened_value: 31,
    opened_detail: '31 is above the high limit 30',
    resolved_at: Date.now() - 1_800_000,
    resolved_value: 29,
    resolved_detail: '29 is back within the limits',
    last_notified_at: Date.now() - 3_600_000,
  });
  // a note kind and a note on the channel (a probe cleaning left out of analysis)
  const noteKindId = rid();
  await db('note_kinds').insert({ tenant_id: lab.id, id: noteKindId, name: 'maintenance', position: 0 });
  const noteId = rid();
  await db('notes').insert({
    tenant_id: lab.id,
    id: noteId,
    logger_id: loggerId,
    channel_id: channelId,
    kind_id: noteKindId,
    body: 'Probe cleaned',
    start_ts: Date.UTC(2026, 0, 1, 6, 0, 0),
    end_ts: Date.UTC(2026, 0, 1, 6, 30, 0),
    exclude_from_analysis: true,
    created_by: founder.id,
    updated_by: founder.id,
  });
  // a test reading sent by the founder long ago: its 10-minute removal window is closed
  const testReadingId = rid();
  const testSentAt = Date.UTC(2026, 0, 1, 5, 0, 0);
  await db('test_readings').insert({
    tenant_id: lab.id,
    id: testReadingId,
    logger_id: loggerId,
    channel_id: channelId,
    ts: testSentAt,
    value: 4.2,
    sent_by: founder.id,
    sent_at: testSentAt,
  });
  if (rowInEveryTable) await addRowToEveryOtherTable(db, lab, { founderId: founder.id, channelId, alertId });
  return {
    lab,
    founder,
    guest,
    ingestKey: key.key,
    personalToken: personal.token,
    ids: { loggerId, channelId, keyId, quarantinedId, bulkRunId, invitationId, tokenId, ruleId, alertId, noteId, kindId: noteKindId, testReadingId },
    params: {
      userId: guest.id,
      id: invitationId,
      loggerId,
      channelId,
      keyId,
      runId: bulkRunId,
      tokenId,
      ruleId,
      alertId,
      noteId,
      kindId: noteKindId,
      testReadingId,
    } as Record<string, number>,
  };
}

export type LabWithEverything = Awaited<ReturnType<typeof buildLabWithEverything>>;

const PLANS_FILE = join(import.meta.dirname, '..', '..', 'tenants', 'plans.json');

/**
 * The lab-owned rows buildLabWithEverything does not make by default: three readings of the
 * channel within one minute with their minute, hour and day rollups, an audit event, a sent
 * alert mail, the billing row on the free plan (counting those readings and the quarantined
 * row) and one usage snapshot.
 */
async function addRowToEveryOtherTable(db: Knex, lab: TestLab, at: { founderId: number; channelId: number; alertId: number }) {
  const t0 = Date.UTC(2026, 0, 1, 6, 0, 0);
  const values = [4.25, 4.5, 4.75];
  await db('readings').insert(values.map((value, i) => ({ tenant_id: lab.id, channel_id: at.channelId, ts: t0 + i * 10_000, value })));
  await db('reading_rollups').insert(
    [60, 3600, 86400].map((resolution) => ({
      tenant_id: lab.id,
      channel_id: at.channelId,
      resolution_s: resolution,
      bucket_start: t0 - (t0 % (resolution * 1000)),
      min_value: 4.25,
      max_value: 4.75,
      sum_value: 13.5,
      count_value: 3,
    })),
  );
  await db('channels').where({ tenant_id: lab.id, id: at.channelId }).update({ stored_readings: values.length });
  await db('audit_events').insert({
    tenant_id: lab.id,
    id: rid(),
    actor_user_id: at.founderId,
    action: 'logger.created',
    target_type: 'logger',
    summary: 'Fixture: the logger was registered',
  });
  await db('notification_outbox').insert({
    tenant_id: lab.id,
    id: rid(),
    alert_id: at.alertId,
    user_id: at.founderId,
    kind: 'opened',
    sequence: 0,
    to_address: `founder-${lab.id}@lab.example`,
    subject: 'Air too warm',
    body_text: 'Air too warm: 31 is above the high limit 30.',
    body_html: '',
    next_attempt_at: t0,
    sent_at: t0,
  });
  await db('lab_billing').insert({ tenant_id: lab.id, plan_key: loadPlanCatalog(PLANS_FILE).free.key, readings_count: values.length, quarantined_count: 1 });
  await db('usage_snapshots').insert({ tenant_id: lab.id, day: '2026-01-01', readings: values.length, loggers: 1, members: 2 });
}

/** A route path with its parameters filled from `params`. */
export function fillPath(path: string, params: Record<string, number>): string {
  return path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
    if (!(name in params)) throw new Error(`no fixture value for route parameter :${name}`);
    return String(params[name]);
  });
}

/** Query string and raw body for routes that take a file rather than JSON. */
export function rawRequestFor(method: string, path: string): { query: string; body: string; contentType: string } | undefined {
  if (`${method.toUpperCase()} ${path}` !== 'POST /loggers/:loggerId/uploads') return undefined;
  const options = { format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' };
  return {
    query: `?options=${encodeURIComponent(JSON.stringify(options))}`,
    body: 'channel,ts,value\nair_t,2026-01-02T00:00:00Z,3.5\n',
    contentType: 'text/csv',
  };
}

/** A request body that is valid for the route (so the matrix tests permissions, not validation). */
export function validBodyFor(method: string, path: string, f: LabWithEverything): object | undefined {
  const key = `${method.toUpperCase()} ${path}`;
  const unique = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 8)}`;
  const bodies: Record<string, object> = {
    'PATCH ': { description: 'Soil and air plots by the lower meadow.' },
    // the fixture's own name: a permitted caller deletes the (fresh) lab
    'POST /deletion': { confirmName: f.lab.name },
    'PATCH /members/:userId': { role: 'scientist' },
    'POST /invitations': { email: `new-${unique}@lab.example`, role: 'guest' },
    'POST /loggers': { name: `Logger ${unique}`, timezone: 'UTC', expectedIntervalS: 60, channels: [{ key: 'rh', label: 'Humidity', unit: '%' }] },
    'PATCH /loggers/:loggerId': { site: 'North plot' },
    'POST /loggers/:loggerId/channels': { key: `c${unique}`.slice(0, 20), label: 'New channel' },
    'PATCH /loggers/:loggerId/channels/:channelId': { label: 'Air temperature (shaded)' },
    'POST /loggers/:loggerId/keys': { rotate: false },
    'POST /loggers/:loggerId/test-reading': { channel: 'air_t', value: 4.2 },
    'POST /loggers/:loggerId/uploads/time-preview': { samples: ['24.11.2026 00:00'], timeZone: 'UTC' },
    'POST /quarantine/discard': { ids: [f.ids.quarantinedId] },
    'POST /tokens': { name: `Notebook ${unique}`, expiresInDays: 30 },
    'POST /alert-rules': { name: `Rule ${unique}`, kind: 'bounds', channelId: f.ids.channelId, params: { high: 35, holdS: 60 } },
    'PATCH /alert-rules/:ruleId': { name: 'Air far too warm' },
    'POST /alerts/:alertId/acknowledge': { note: 'Door was open; closed it.' },
    'POST /notes': { channelId: f.ids.channelId, kindId: f.ids.kindId, text: 'Probe wiped', start: '2026-01-02T08:00:00Z', end: '2026-01-02T08:20:00Z' },
    'PATCH /notes/:noteId': { text: 'Probe cleaned and dried' },
    'POST /note-kinds': { name: `kind ${unique}`.slice(0, 40) },
    'PATCH /note-kinds/:kindId': { name: `upkeep ${unique}`.slice(0, 40) },
    'POST /quarantine/resubmit': { rows: [{ id: f.ids.quarantinedId, channel: 'air_t', ts: '2026-01-01T00:00:00Z', value: 4.5 }] },
    'POST /quarantine/bulk/preview': { selection: { ids: [f.ids.quarantinedId] }, action: { kind: 'discard', reason: 'matrix check' } },
    'POST /quarantine/bulk/runs': { selection: { ids: [f.ids.quarantinedId] }, action: { kind: 'discard', reason: 'matrix check' } },
    // a paid plan of tenants/plans.json
    'POST /billing/checkout-session': { plan: 'transect' },
    'POST /billing/plan-change': { plan: 'watershed' },
  };
  return bodies[key];
}
