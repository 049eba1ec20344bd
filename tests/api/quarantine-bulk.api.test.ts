import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createQuarantineService } from '../../server/services/quarantine.service.ts';
import { quarantineCapHook } from '../../server/services/ingest/quarantine-cap.ts';
import type { IngestHooks } from '../../server/services/ingest/ingest-hooks.ts';
import type { BulkAction, BulkRequest, BulkRun } from '../../server/contract/quarantine.ts';
import type { Actor, LabContext } from '../../server/services/lab-context.ts';
import { readCopies } from '../../server/db/quarantine-copies.ts';

/**
 * Bulk quarantine repairs (issue 18 item 2): each action's preview equals what applying it does,
 * the accounting (stored + already stored + still quarantined + discarded = selected, checked
 * against the readings and quarantine tables), one transaction (an injected failure midway leaves
 * every row where it was), the refusals (400 `field: reason`, 403, 409), progress of a run over
 * thousands of rows, and a run left running by a dead process.
 */
let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t?.close());

// Readings within the free plan's history: 15-minute steps from midnight UTC three days ago.
const DAY0 = Math.floor(Date.now() / 86_400_000) * 86_400_000 - 3 * 86_400_000;
const STEP = 15 * 60_000;
const pad = (n: number) => String(n).padStart(2, '0');
/** `24.11.2026 00:15`: a day-first wall-clock text of an epoch ms in UTC (the fixture logger's zone). */
const dayFirst = (ms: number) => {
  const d = new Date(ms);
  return `${pad(d.getUTCDate())}.${pad(d.getUTCMonth() + 1)}.${d.getUTCFullYear()} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
};

interface Lab {
  f: LabWithEverything;
  tech: string;
  scientist: string;
  ctx: LabContext;
  actor: Actor;
  path: (p?: string) => string;
}

/** A lab whose quarantine starts empty (the fixture's hand-inserted row is removed). */
async function newLab(): Promise<Lab> {
  const f = await buildLabWithEverything(t.db);
  await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).delete();
  await t.db('quarantine_bulk_runs').where({ tenant_id: f.lab.id }).delete();
  const technician = await buildMember(t.db, f.lab, { role: 'technician' });
  const scientist = await buildMember(t.db, f.lab, { role: 'scientist' });
  return {
    f,
    tech: await sessionCookieFor(t.db, t.config.sessionSecret, technician.id),
    scientist: await sessionCookieFor(t.db, t.config.sessionSecret, scientist.id),
    ctx: { id: f.lab.id, slug: f.lab.slug, name: f.lab.name, description: '', createdAt: new Date(), role: 'technician' },
    actor: { id: technician.id, email: technician.email, emailVerified: true, displayName: technician.displayName },
    path: (p = '') => `/api/v1/labs/${f.lab.slug}${p}`,
  };
}

type Reading = { channel: string; ts: string | number; value: number | string };

/** Sends readings through the logger API, 1,000 a batch (the per-batch quarantine cap). */
async function ingest(lab: Lab, readings: Reading[]) {
  for (let i = 0; i < readings.length; i += 1000) {
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${lab.f.ingestKey}`)
      .send({ readings: readings.slice(i, i + 1000) });
    expect(res.status).toBe(200);
  }
}

/** `n` air_t rows whose times are day-first texts (quarantined as bad_time by the logger API). */
const dayFirstRows = (n: number, step = STEP): Reading[] =>
  Array.from({ length: n }, (_, i) => ({ channel: 'air_t', ts: dayFirst(DAY0 + i * step), value: 10 + i / 10 }));
/** An audit event's details (the driver may hand the JSON column over as text or parsed). */
const detailsOf = (event: { details: unknown }) => (typeof event.details === 'string' ? JSON.parse(event.details) : event.details);

const count = async (table: string, lab: Lab, where: Record<string, unknown> = {}) =>
  Number(
    (
      await t
        .db(table)
        .where({ tenant_id: lab.f.lab.id, ...where })
        .count({ n: '*' })
        .first()
    )?.n,
  );
/** The lab's quarantined rows, the time as received read back where it is kept only inside `raw` (quarantine-copies.ts). */
const quarantineIds = async (lab: Lab) =>
  (await t.db('quarantined_rows').where({ tenant_id: lab.f.lab.id }).orderBy('id').select('id', 'reason_code', 'ts_raw', 'raw', 'copied_fields')).map(
    ({ copied_fields: copiedFields, ...r }) => ({
      ...r,
      id: Number(r.id),
      ts_raw: readCopies({ raw: r.raw, tsRaw: r.ts_raw, valueRaw: null, copiedFields }).tsRaw,
    }),
  );

const preview = (lab: Lab, body: BulkRequest, cookie = lab.tech) => request(t.app).post(lab.path('/quarantine/bulk/preview')).set('Cookie', cookie).send(body);
const start = (lab: Lab, body: BulkRequest, cookie = lab.tech) => request(t.app).post(lab.path('/quarantine/bulk/runs')).set('Cookie', cookie).send(body);

/** Polls a run until it has ended (the test's own timeout bounds the wait). */
async function finished(lab: Lab, runId: number): Promise<BulkRun> {
  for (;;) {
    const res = await request(t.app)
      .get(lab.path(`/quarantine/bulk/runs/${runId}`))
      .set('Cookie', lab.tech);
    expect(res.status).toBe(200);
    if (res.body.state !== 'running') return res.body as BulkRun;
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Preview, then apply the same request; checks the accounting against the tables and answers both. */
async function previewThenApply(lab: Lab, body: BulkRequest) {
  const readingsBefore = await count('readings', lab);
  const quarantinedBefore = await count('quarantined_rows', lab);
  const p = await preview(lab, body);
  expect(p.status, JSON.stringify(p.body)).toBe(200);
  // the preview changed nothing
  expect(await count('readings', lab)).toBe(readingsBefore);
  expect(await count('quarantined_rows', lab)).toBe(quarantinedBefore);
  const s = await start(lab, body);
  expect(s.status, JSON.stringify(s.body)).toBe(202);
  expect(s.body).toMatchObject({ state: 'running', done: 0, total: p.body.selected });
  const run = await finished(lab, s.body.id);
  expect(run.state, run.error ?? '').toBe('done');
  const c = run.counts!;
  const { sample: _sample, ...previewCounts } = p.body;
  expect(c).toEqual(previewCounts);
  expect(c.stored + c.alreadyStored + c.stillQuarantined + c.discarded).toBe(c.selected);
  expect(run.done).toBe(c.selected);
  expect(await count('readings', lab)).toBe(readingsBefore + c.stored);
  expect(await count('quarantined_rows', lab)).toBe(quarantinedBefore - c.selected + c.stillQuarantined);
  return { preview: p.body, run };
}

describe('re-read times with another layout', () => {
  it('stores all 96 day-first rows of a day with the day-first layout; the preview said so row by row', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(96));
    expect(await count('quarantined_rows', lab, { reason_code: 'bad_time' })).toBe(96);
    const body: BulkRequest = { selection: { filter: { reason: 'bad_time' } }, action: { kind: 'reread', timeFormat: 'day-first-dot' } };
    const { preview: p, run } = await previewThenApply(lab, body);
    expect(p).toMatchObject({ selected: 96, stored: 96, alreadyStored: 0, stillQuarantined: 0, discarded: 0, reasons: [] });
    expect(p.sample).toHaveLength(20);
    // each sampled row: its text as received, and the instant it is stored at (UTC, the logger's zone)
    for (const row of p.sample) {
      expect(row.after.outcome).toBe('stored');
      const expected = new Date(Date.parse(row.after.ts)).toISOString();
      expect(dayFirst(Date.parse(expected))).toBe(row.before.ts);
    }
    expect(run.counts).toMatchObject({ stored: 96, stillQuarantined: 0 });
    expect(await count('quarantined_rows', lab)).toBe(0);
    const stored = await t.db('readings').where({ tenant_id: lab.f.lab.id, channel_id: lab.f.ids.channelId }).orderBy('ts').select('ts', 'value');
    // the fixture's lab has no other readings on air_t unless rowInEveryTable; the 96 are there at their instants
    expect(stored.map((r) => Number(r.ts))).toEqual(Array.from({ length: 96 }, (_, i) => DAY0 + i * STEP));
    expect(stored.map((r) => Number(r.value))).toEqual(Array.from({ length: 96 }, (_, i) => 10 + i / 10));
    const audit = await t.db('audit_events').where({ tenant_id: lab.f.lab.id, action: 'quarantine.bulk-reread' });
    expect(audit).toHaveLength(1);
    expect(detailsOf(audit[0])).toMatchObject({
      action: { kind: 'reread', timeFormat: 'day-first-dot' },
      selection: { filter: { reason: 'bad_time' } },
      counts: { stored: 96 },
    });
  });

  it('reads a custom pattern in a named zone; rows the pattern cannot read stay quarantined with their new reason and their text as received', async () => {
    const lab = await newLab();
    await ingest(lab, [...dayFirstRows(4), { channel: 'air_t', ts: 'yesterday noon', value: 3 }]);
    const before = await quarantineIds(lab);
    const { preview: p } = await previewThenApply(lab, {
      selection: { filter: {} },
      action: { kind: 'reread', timeFormat: 'pattern', timePattern: 'dd.MM.yyyy HH:mm', timeZone: 'Europe/Berlin' },
    });
    expect(p).toMatchObject({ selected: 5, stored: 4, stillQuarantined: 1, reasons: [{ code: 'bad_time', count: 1 }] });
    // Berlin is UTC+1 in winter and UTC+2 in summer (IANA tz database): the wall clock read there is 1–2 h before the UTC one
    const storedTs = (await t.db('readings').where({ tenant_id: lab.f.lab.id, channel_id: lab.f.ids.channelId }).orderBy('ts').pluck('ts')).map(Number);
    for (const [i, ts] of storedTs.entries()) expect([3_600_000, 7_200_000]).toContain(DAY0 + i * STEP - ts);
    const left = await quarantineIds(lab);
    expect(left).toHaveLength(1);
    const original = before.find((r) => r.ts_raw === 'yesterday noon')!;
    expect(left[0]).toMatchObject({ reason_code: 'bad_time', ts_raw: 'yesterday noon', raw: original.raw });
  });
});

describe('shift times by a fixed offset', () => {
  it('moves rows of a clock that ran 26 hours ahead back into place; a row landing on a stored time with another value stays quarantined', async () => {
    const lab = await newLab();
    const ahead = 26 * 3_600_000;
    // stored already at DAY0: 5.0 (the shifted first row brings 7.5 there: a conflict)
    await ingest(lab, [{ channel: 'air_t', ts: DAY0, value: 5 }]);
    const future = Date.now() + ahead;
    const base = future - (future % STEP);
    await ingest(
      lab,
      Array.from({ length: 6 }, (_, i) => ({ channel: 'air_t', ts: new Date(base + i * STEP).toISOString(), value: 7.5 + i })),
    );
    expect(await count('quarantined_rows', lab, { reason_code: 'time_out_of_range' })).toBe(6);
    const offsetMinutes = -Math.round((base - DAY0) / 60_000);
    const { preview: p } = await previewThenApply(lab, { selection: { filter: { reason: 'time_out_of_range' } }, action: { kind: 'shift', offsetMinutes } });
    expect(p).toMatchObject({ selected: 6, stored: 5, stillQuarantined: 1, reasons: [{ code: 'conflicts_with_stored', count: 1 }] });
    expect((await t.db('readings').where({ tenant_id: lab.f.lab.id, channel_id: lab.f.ids.channelId, ts: DAY0 }).first()).value).toBe(5);
    expect(await count('audit_events', lab, { action: 'quarantine.bulk-shifted' })).toBe(1);
  });

  it('refuses an offset that would move rows into the future (400, nothing applied)', async () => {
    const lab = await newLab();
    await ingest(lab, [{ channel: 'air_t', ts: new Date(Date.now() + 30 * 3_600_000).toISOString(), value: 1 }]);
    const body: BulkRequest = { selection: { filter: {} }, action: { kind: 'shift', offsetMinutes: 60 } };
    for (const res of [await preview(lab, body), await start(lab, body)]) {
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/^Shift \(minutes\): would move 1 row into the future \(the latest by .+\); use a smaller shift/);
    }
    expect(await count('quarantined_rows', lab)).toBe(1);
    expect(await count('quarantine_bulk_runs', lab)).toBe(0);
  });
});

describe('map an unknown channel name to a channel', () => {
  it("stores rows sent as air_temp under the logger's air_t", async () => {
    const lab = await newLab();
    await ingest(
      lab,
      Array.from({ length: 8 }, (_, i) => ({ channel: 'air_temp', ts: DAY0 + i * STEP, value: i })),
    );
    const body: BulkRequest = { selection: { filter: { channel: 'air_temp' } }, action: { kind: 'map-channel', channelId: lab.f.ids.channelId } };
    const { preview: p } = await previewThenApply(lab, body);
    expect(p).toMatchObject({ selected: 8, stored: 8, stillQuarantined: 0 });
    expect(p.sample[0]).toMatchObject({ before: { channel: 'air_temp', reasonCode: 'unknown_channel' }, after: { outcome: 'stored', channel: 'air_t' } });
    expect(await count('readings', lab, { channel_id: lab.f.ids.channelId })).toBe(8);
  });

  it('refuses a channel of another logger, a retired channel and an unknown id with 400 channelId: …', async () => {
    const lab = await newLab();
    await ingest(lab, [{ channel: 'air_temp', ts: DAY0, value: 1 }]);
    const otherLogger = lab.f.ids.loggerId + 1;
    await t.db('loggers').insert({ tenant_id: lab.f.lab.id, id: otherLogger, name: 'Greenhouse 2', timezone: 'UTC', expected_interval_s: 60 });
    const elsewhere = lab.f.ids.channelId + 1;
    const retired = lab.f.ids.channelId + 2;
    await t.db('channels').insert([
      { tenant_id: lab.f.lab.id, id: elsewhere, logger_id: otherLogger, channel_key: 'air_t', label: 'Air', unit: '°C' },
      { tenant_id: lab.f.lab.id, id: retired, logger_id: lab.f.ids.loggerId, channel_key: 'old_air', label: 'Old', unit: '°C', retired_at: new Date() },
    ]);
    const ask = (channelId: number) => preview(lab, { selection: { filter: {} }, action: { kind: 'map-channel', channelId } });
    const other = await ask(elsewhere);
    expect(other.status).toBe(400);
    expect(other.body.error.message).toBe(
      'Channel to store them under: "air_t" belongs to logger "Greenhouse 2", but 1 selected row comes from another logger; filter the selection by that logger first.',
    );
    const old = await ask(retired);
    expect(old.status).toBe(400);
    expect(old.body.error.message).toBe('Channel to store them under: "old_air" is retired; choose a channel of the logger that is in use.');
    const none = await ask(elsewhere + 1000);
    expect(none.status).toBe(400);
    expect(none.body.error.message).toBe("Channel to store them under: is not a channel of this lab; choose one of the logger's channels.");
    expect(await count('quarantined_rows', lab)).toBe(1);
  });
});

describe('discard with a reason', () => {
  it('discards the chosen rows and records who and why in the audit log', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(5));
    const ids = (await quarantineIds(lab)).map((r) => r.id).slice(0, 3);
    const { run } = await previewThenApply(lab, { selection: { ids }, action: { kind: 'discard', reason: 'probe unplugged during the move' } });
    expect(run.counts).toMatchObject({ selected: 3, discarded: 3, stored: 0 });
    expect(run.startedBy).toBeTruthy();
    const remaining = (await quarantineIds(lab)).map((r) => r.id);
    expect(remaining.filter((id) => ids.includes(id))).toEqual([]);
    const [event] = await t.db('audit_events').where({ tenant_id: lab.f.lab.id, action: 'quarantine.bulk-discarded' });
    expect(Number(event.actor_user_id)).toBe(lab.actor.id);
    expect(event.summary).toContain('probe unplugged during the move');
    expect(detailsOf(event)).toMatchObject({ action: { kind: 'discard', reason: 'probe unplugged during the move' }, counts: { discarded: 3 } });
  });
});

describe('refusals', () => {
  it('answers 400 in plain words for an empty selection, an unreadable pattern and bad input, and applies nothing', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(2));
    const cases: Array<[unknown, string]> = [
      [
        { selection: { filter: { reason: 'unknown_channel' } }, action: { kind: 'discard', reason: 'gone' } },
        'Rows to repair: no quarantined rows match; change the filters or choose rows.',
      ],
      [{ selection: { filter: {} }, action: { kind: 'reread', timeFormat: 'pattern', timePattern: 'dd.QQ.yyyy' } }, 'Pattern of the times: '],
      [{ selection: { filter: {} }, action: { kind: 'shift', offsetMinutes: 0 } }, 'Shift (minutes): must not be 0'],
      [{ selection: { filter: {} }, action: { kind: 'discard', reason: '' } }, 'Why they are discarded: say why'],
      [{ selection: {}, action: { kind: 'discard', reason: 'gone' } }, 'Rows matching the filters: choose rows either by the filters or one by one, not both'],
      [{ selection: { filter: {} }, action: { kind: 'reread', timeFormat: 'pattern' } }, 'Pattern of the times: give the pattern'],
    ];
    for (const [body, message] of cases) {
      for (const res of [await preview(lab, body as BulkRequest), await start(lab, body as BulkRequest)]) {
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(res.body.error.message).toContain(message);
      }
    }
    expect(await count('quarantined_rows', lab)).toBe(2);
    expect(await count('quarantine_bulk_runs', lab)).toBe(0);
  });

  it('refuses a scientist (403), another lab (404) and ids not in this quarantine (404)', async () => {
    const lab = await newLab();
    const other = await newLab();
    await ingest(lab, dayFirstRows(1));
    const body: BulkRequest = { selection: { filter: {} }, action: { kind: 'discard', reason: 'not ours' } };
    expect((await preview(lab, body, lab.scientist)).status).toBe(403);
    expect((await start(lab, body, lab.scientist)).status).toBe(403);
    expect((await request(t.app).get(lab.path('/quarantine/bulk/runs')).set('Cookie', lab.scientist)).status).toBe(403);
    expect((await start(lab, body, other.tech)).status).toBe(404);
    const ids = (await quarantineIds(lab)).map((r) => r.id);
    const foreign = await preview(other, { selection: { ids }, action: { kind: 'discard', reason: 'not ours' } }, other.tech);
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.message).toBe(
      'One of the chosen rows is no longer in quarantine (repaired or discarded meanwhile?); reload the list and choose again.',
    );
    expect(await count('quarantined_rows', lab)).toBe(1);
  });
});

/** The quarantine service on the test database with hooks of the test's own (failures, pauses). */
const serviceWith = (hooks: IngestHooks) => createQuarantineService({ db: t.db, hooks });

describe('one transaction', () => {
  it('an injected failure in the third batch leaves every row where it was, and the run says it failed', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(1200, 60_000));
    const before = await quarantineIds(lab);
    const readingsBefore = await count('readings', lab);
    const auditBefore = await count('audit_events', lab);
    let batches = 0;
    const quarantine = serviceWith({
      async beforeCommit() {
        if (++batches === 3) throw new Error('injected failure in the third batch');
      },
    });
    const action: BulkAction = { kind: 'reread', timeFormat: 'day-first-dot' };
    const { run, whenDone } = await quarantine.bulk.start(lab.ctx, lab.actor, { selection: { filter: {} }, action });
    await whenDone;
    expect(batches).toBe(3);
    const after = await quarantine.bulk.get(lab.ctx, run.id);
    expect(after).toMatchObject({ state: 'failed', counts: null });
    expect(after.error).toMatch(/nothing was applied/);
    expect(await quarantineIds(lab)).toEqual(before);
    expect(await count('readings', lab)).toBe(readingsBefore);
    expect(await count('audit_events', lab)).toBe(auditBefore);
    // the slot is free again: the same repair now runs through
    const again = await serviceWith({}).bulk.start(lab.ctx, lab.actor, { selection: { filter: {} }, action });
    await again.whenDone;
    expect((await serviceWith({}).bulk.get(lab.ctx, again.run.id)).counts).toMatchObject({ selected: 1200, stored: 1200 });
  });

  it('re-submitting rows is one transaction too: a refusal leaves the originals in quarantine', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(3));
    const before = await quarantineIds(lab);
    const quarantine = serviceWith({
      async beforeCommit() {
        throw new Error('injected refusal');
      },
    });
    const rows = before.map((r, i) => ({ id: r.id, channel: 'air_t', ts: DAY0 + i * STEP, value: i }));
    await expect(quarantine.resubmit(lab.ctx, lab.actor, rows)).rejects.toThrow('injected refusal');
    expect(await quarantineIds(lab)).toEqual(before);
    expect(await count('readings', lab)).toBe(0);
  });

  it('the quarantine cap counts the net growth: rows failing again replace their originals', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(600, 60_000));
    // a cap of 0 new rows: 600 rows failing again (ISO does not read day-first texts) add nothing net
    const quarantine = serviceWith(quarantineCapHook(0));
    const p = await quarantine.bulk.preview(lab.ctx, lab.actor, { selection: { filter: {} }, action: { kind: 'reread', timeFormat: 'iso' } });
    expect(p).toMatchObject({ selected: 600, stillQuarantined: 600, reasons: [{ code: 'bad_time', count: 600 }] });
  });
});

describe('runs', () => {
  it('one run per lab: a second start while one works answers 409', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(10));
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const quarantine = serviceWith({ beforeCommit: () => gate });
    const first = await quarantine.bulk.start(lab.ctx, lab.actor, { selection: { filter: {} }, action: { kind: 'reread', timeFormat: 'day-first-dot' } });
    const body: BulkRequest = { selection: { filter: {} }, action: { kind: 'discard', reason: 'duplicate export' } };
    const second = await start(lab, body);
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('bulk_run_active');
    expect((await preview(lab, body)).status).toBe(409);
    release();
    await first.whenDone;
    expect((await quarantine.bulk.get(lab.ctx, first.run.id)).state).toBe('done');
  });

  it('a run over 5,000 rows chosen by id records its progress batch by batch and ends with every row accounted for', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(5000, 60_000));
    const ids = (await quarantineIds(lab)).map((r) => r.id);
    const seen: number[] = [];
    let runId = 0;
    // each batch's hook reads the run's progress from outside the run's transaction
    const quarantine = serviceWith({
      async beforeCommit() {
        const row = await t.db('quarantine_bulk_runs').where({ tenant_id: lab.f.lab.id, id: runId }).first('done', 'state');
        seen.push(Number(row.done));
        expect(row.state).toBe('running');
      },
    });
    const started = await quarantine.bulk.start(lab.ctx, lab.actor, { selection: { ids }, action: { kind: 'reread', timeFormat: 'day-first-dot' } });
    runId = started.run.id;
    expect(started.run).toMatchObject({ state: 'running', total: 5000, done: 0 });
    // the request naming 5,000 ids (more than 64 KB as JSON) is kept whole
    expect((started.run.selection.ids ?? []).length).toBe(5000);
    await started.whenDone;
    expect(seen).toEqual(Array.from({ length: 10 }, (_, i) => i * 500));
    const run = await quarantine.bulk.get(lab.ctx, runId);
    expect(run).toMatchObject({ state: 'done', done: 5000, total: 5000, counts: { selected: 5000, stored: 5000, stillQuarantined: 0 } });
    expect(await count('readings', lab)).toBe(5000);
    expect(await count('quarantined_rows', lab)).toBe(0);
    const list = await request(t.app).get(lab.path('/quarantine/bulk/runs')).set('Cookie', lab.tech);
    expect(list.body.runs[0]).toMatchObject({ id: runId, state: 'done' });
  });

  it('a run left running by a process that died is marked failed once its heartbeat is two minutes old, and frees the lab', async () => {
    const lab = await newLab();
    await ingest(lab, dayFirstRows(2));
    const id = lab.f.ids.bulkRunId + 7;
    const old = new Date(Date.now() - 3 * 60_000);
    await t.db('quarantine_bulk_runs').insert({
      tenant_id: lab.f.lab.id,
      id,
      state: 'running',
      running_slot: 1,
      action: 'discard',
      request: JSON.stringify({ selection: { filter: {} }, action: { kind: 'discard', reason: 'x' } }),
      total: 2,
      started_at: old,
      heartbeat_at: old,
    });
    const res = await request(t.app)
      .get(lab.path(`/quarantine/bulk/runs/${id}`))
      .set('Cookie', lab.tech);
    expect(res.body).toMatchObject({ state: 'failed' });
    expect(res.body.error).toMatch(/server stopped/);
    const s = await start(lab, { selection: { filter: {} }, action: { kind: 'reread', timeFormat: 'day-first-dot' } });
    expect(s.status).toBe(202);
    expect((await finished(lab, s.body.id)).state).toBe('done');
  });
});
