/**
 * Notes on time ranges over HTTP on the real MariaDB: create, list (channel with its logger's
 * whole-logger notes, logger, lab), edit, delete, the lab's note kinds, who may do what, the bad
 * inputs, the CSV exports, the audit log, and what a note marked "leave out of analysis" does:
 * diagnostics of data with a spike inside such a note equal the diagnostics of the same data
 * with those cells missing and no note (and differ from the spike kept); the method section
 * names the note; a note change is never answered from the cache; the unusual-reading alert
 * rule leaves such a span out of its history. The readings are simulated (behaviour checks:
 * each comparison is between two runs of Lagbook's own engine on data that differ only as
 * described, so no outside reference value is involved).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer, type Mailer } from '../../server/integrations/mail/create-mailer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';
import type { DiagnosticsAnswer } from '../../server/contract/diagnostics.ts';

const STEP = 600_000; // 10-minute cells
const T0 = Date.UTC(2026, 9, 5);
const N = 4 * 144; // four days
const SPIKE = [300, 301, 302]; // cells of a 30-minute cleaning

let t: TestApp;
let f: LabWithEverything;
let other: LabWithEverything;
let admin: string;
let tech: string;
let scientist: string;
let guest: string;
let lab: string;
const ids: Record<'noted' | 'gapped' | 'kept', number> = { noted: 0, gapped: 0, kept: 0 };

/** A seeded generator (Numerical Recipes' LCG constants), so the simulated data repeat exactly. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

const iso = (ms: number) => new Date(ms).toISOString();

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  other = await buildLabWithEverything(t.db);
  await onLargestPlan(t.db, f.lab.id); // the simulated readings reach back further than the free plan shows
  lab = `/api/v1/labs/${f.lab.slug}`;
  admin = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'technician' })).id);
  scientist = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'scientist' })).id);
  guest = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);
  for (const key of ['noted', 'gapped', 'kept'] as const) {
    const made = await request(t.app)
      .post(`${lab}/loggers/${f.ids.loggerId}/channels`)
      .set('Cookie', admin)
      .send({ key: `probe_${key}`, label: `Probe (${key})`, unit: '°C' })
      .expect(201);
    ids[key] = made.body.channel.id;
  }
  // an AR(1) wander on a daily cycle; a cleaning spike of +25 °C in three cells
  const rnd = lcg(23);
  let e = 0;
  const rows: Array<{ channel: string; ts: number; value: number }> = [];
  for (let i = 0; i < N; i++) {
    e = 0.7 * e + rnd();
    const v = 12 + 3 * Math.sin((2 * Math.PI * i) / 144) + e;
    const spiked = SPIKE.includes(i) ? v + 25 : v;
    rows.push({ channel: 'probe_noted', ts: T0 + i * STEP, value: spiked });
    rows.push({ channel: 'probe_kept', ts: T0 + i * STEP, value: spiked });
    if (!SPIKE.includes(i)) rows.push({ channel: 'probe_gapped', ts: T0 + i * STEP, value: v });
  }
  await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings: rows }).expect(200);
});
afterAll(async () => t.close());

const post = (cookie: string, body: object) => request(t.app).post(`${lab}/notes`).set('Cookie', cookie).send(body);
const note = (over: object = {}) => ({
  channelId: f.ids.channelId,
  kindId: f.ids.kindId,
  text: 'Probe wiped with a damp cloth',
  start: '2026-10-06T08:00:00Z',
  end: '2026-10-06T08:20:00Z',
  ...over,
});

describe('note kinds', () => {
  it('a new lab starts with the default list; kinds are added, renamed and retired, and a retired kind stays on old notes', async () => {
    const fresh = await buildLab(t.db);
    const freshTech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, fresh, { role: 'technician' })).id);
    const base = `/api/v1/labs/${fresh.slug}`;
    const listed = await request(t.app).get(`${base}/note-kinds`).set('Cookie', freshTech).expect(200);
    expect(listed.body.kinds.map((k: { name: string }) => k.name)).toEqual(['maintenance', 'calibration', 'sensor change', 'disturbance', 'other']);
    const made = await request(t.app).post(`${base}/note-kinds`).set('Cookie', freshTech).send({ name: 'delivery' }).expect(201);
    expect(made.body.kind).toMatchObject({ name: 'delivery', retired: false, notes: 0 });
    const dup = await request(t.app).post(`${base}/note-kinds`).set('Cookie', freshTech).send({ name: 'delivery' }).expect(400);
    expect(dup.body.error.message).toBe('Name of the kind: the lab already has a kind called "delivery" (choose another name).');
    const renamed = await request(t.app).patch(`${base}/note-kinds/${made.body.kind.id}`).set('Cookie', freshTech).send({ name: 'door opened' }).expect(200);
    expect(renamed.body.kind.name).toBe('door opened');

    // in the fixture lab: a note of a kind that is then retired keeps it; new notes cannot take it
    const kind = (await request(t.app).post(`${lab}/note-kinds`).set('Cookie', tech).send({ name: 'frost' }).expect(201)).body.kind;
    const made2 = (await post(tech, note({ kindId: kind.id })).expect(201)).body.note;
    await request(t.app).patch(`${lab}/note-kinds/${kind.id}`).set('Cookie', tech).send({ retired: true }).expect(200);
    const listedNotes = (await request(t.app).get(`${lab}/notes`).set('Cookie', tech).expect(200)).body.notes;
    expect(listedNotes.find((n: { id: number }) => n.id === made2.id).kind).toEqual({ id: kind.id, name: 'frost', retired: true });
    const refused = await post(tech, note({ kindId: kind.id })).expect(400);
    expect(refused.body.error.message).toBe('Kind of note: the kind "frost" is retired (choose another kind, or bring it back first).');
    const kinds = (await request(t.app).get(`${lab}/note-kinds`).set('Cookie', guest).expect(200)).body.kinds;
    expect(kinds.find((k: { id: number }) => k.id === kind.id)).toMatchObject({ retired: true, notes: 1 });
    // another lab's kind in the path: 404; guests and scientists cannot edit kinds
    await request(t.app).patch(`${lab}/note-kinds/${other.ids.kindId}`).set('Cookie', tech).send({ name: 'x' }).expect(404);
    await request(t.app).post(`${lab}/note-kinds`).set('Cookie', scientist).send({ name: 'nope' }).expect(403);
  });
});

describe('notes', () => {
  it('technicians write; scientists and guests read; guests and scientists cannot add', async () => {
    await post(guest, note()).expect(403);
    await post(scientist, note()).expect(403);
    const made = await post(tech, note({ excludeFromAnalysis: true })).expect(201);
    expect(made.body.note).toMatchObject({
      channelId: f.ids.channelId,
      loggerId: f.ids.loggerId,
      kind: { id: f.ids.kindId, name: 'maintenance', retired: false },
      text: 'Probe wiped with a damp cloth',
      from: Date.UTC(2026, 9, 6, 8, 0),
      to: Date.UTC(2026, 9, 6, 8, 20),
      excludeFromAnalysis: true,
    });
    expect(made.body.note.createdBy.name).toBeTruthy();
    for (const cookie of [scientist, guest]) {
      const res = await request(t.app)
        .get(`${lab}/channels/${f.ids.channelId}/notes?from=2026-10-06T00:00:00Z&to=2026-10-07T00:00:00Z`)
        .set('Cookie', cookie)
        .expect(200);
      expect(res.body.notes.map((n: { id: number }) => n.id)).toContain(made.body.note.id);
    }
    const audit = await t.db('audit_events').where({ tenant_id: f.lab.id, action: 'note.created', target_id: String(made.body.note.id) });
    expect(audit).toHaveLength(1);
  });

  it('a channel lists its own notes and its logger’s whole-logger notes overlapping the range; the logger lists all of them', async () => {
    const onLogger = (
      await post(
        tech,
        note({ channelId: undefined, loggerId: f.ids.loggerId, text: 'Mast lowered for painting', start: '2026-11-02T09:00:00Z', end: '2026-11-02T12:00:00Z' }),
      ).expect(201)
    ).body.note;
    expect(onLogger.channelId).toBeNull();
    const onOther = (
      await post(tech, note({ channelId: ids.kept, text: 'Other channel', start: '2026-11-02T10:00:00Z', end: '2026-11-02T11:00:00Z' })).expect(201)
    ).body.note;
    const range = 'from=2026-11-02T00:00:00Z&to=2026-11-03T00:00:00Z';
    const ofChannel = (await request(t.app).get(`${lab}/channels/${f.ids.channelId}/notes?${range}`).set('Cookie', scientist).expect(200)).body.notes.map(
      (n: { id: number }) => n.id,
    );
    expect(ofChannel).toContain(onLogger.id);
    expect(ofChannel).not.toContain(onOther.id);
    const ofLogger = (await request(t.app).get(`${lab}/loggers/${f.ids.loggerId}/notes?${range}`).set('Cookie', scientist).expect(200)).body.notes.map(
      (n: { id: number }) => n.id,
    );
    expect(ofLogger).toEqual(expect.arrayContaining([onLogger.id, onOther.id]));
    // a range that ends when the note starts does not overlap it
    const before = (
      await request(t.app)
        .get(`${lab}/channels/${f.ids.channelId}/notes?from=2026-11-02T00:00:00Z&to=2026-11-02T09:00:00Z`)
        .set('Cookie', scientist)
        .expect(200)
    ).body.notes;
    expect(before.map((n: { id: number }) => n.id)).not.toContain(onLogger.id);
    const edited = await request(t.app)
      .patch(`${lab}/notes/${onLogger.id}`)
      .set('Cookie', tech)
      .send({ text: 'Mast lowered and painted', end: '2026-11-02T13:00:00Z' })
      .expect(200);
    expect(edited.body.note).toMatchObject({ text: 'Mast lowered and painted', to: Date.UTC(2026, 10, 2, 13) });
    await request(t.app).delete(`${lab}/notes/${onOther.id}`).set('Cookie', tech).expect(204);
    await request(t.app).delete(`${lab}/notes/${onOther.id}`).set('Cookie', tech).expect(404);
    const actions = (await t.db('audit_events').where({ tenant_id: f.lab.id }).whereIn('action', ['note.updated', 'note.deleted'])).map((r) => r.action);
    expect(actions).toEqual(expect.arrayContaining(['note.updated', 'note.deleted']));
  });

  it('bad input answers 400 naming the field and the fix; nothing is stored', async () => {
    const before = await t.db('notes').where({ tenant_id: f.lab.id }).count({ n: '*' });
    const cases: Array<[object, string]> = [
      [note({ end: '2026-10-06T08:00:00Z' }), 'End: must be after the start (a note covers at least one millisecond).'],
      [note({ end: '2026-10-06T07:00:00Z' }), 'End: must be after the start (a note covers at least one millisecond).'],
      [note({ text: '   ' }), 'Note: must not be empty (say what happened).'],
      [note({ kindId: 99 }), 'Kind of note: is not one of this lab’s kinds of note (choose one of them).'],
      [note({ kindId: other.ids.kindId }), 'Kind of note: is not one of this lab’s kinds of note (choose one of them).'],
      [note({ channelId: other.ids.channelId }), 'Channel: is not a channel of this lab (pick one of its channels).'],
      [note({ channelId: undefined, loggerId: other.ids.loggerId }), 'Logger: is not a logger of this lab (pick one of its loggers).'],
      [note({ loggerId: f.ids.loggerId }), 'Channel: choose either one channel or a whole logger, not both.'],
      [note({ start: '2026-02-30T00:00:00Z' }), 'Start:'],
    ];
    for (const [body, message] of cases) {
      const res = await post(tech, body).expect(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.message).toContain(message);
    }
    // retired channel and retired logger
    const retiredChannel = (
      await request(t.app).post(`${lab}/loggers/${f.ids.loggerId}/channels`).set('Cookie', admin).send({ key: 'old_probe', label: 'Old probe' }).expect(201)
    ).body.channel.id;
    await t.db('channels').where({ tenant_id: f.lab.id, id: retiredChannel }).update({ retired_at: new Date() });
    expect((await post(tech, note({ channelId: retiredChannel })).expect(400)).body.error.message).toBe(
      'Channel: the channel "Old probe" is retired (notes go on channels in use).',
    );
    const retiredLogger = (
      await request(t.app)
        .post(`${lab}/loggers`)
        .set('Cookie', admin)
        .send({ name: 'Retired mast', timezone: 'UTC', expectedIntervalS: 60, channels: [{ key: 'x', label: 'X' }] })
        .expect(201)
    ).body.logger.id;
    await t.db('loggers').where({ tenant_id: f.lab.id, id: retiredLogger }).update({ retired_at: new Date() });
    expect((await post(tech, note({ channelId: undefined, loggerId: retiredLogger })).expect(400)).body.error.message).toBe(
      'Logger: the logger "Retired mast" is retired (notes go on loggers in use).',
    );
    expect(await t.db('notes').where({ tenant_id: f.lab.id }).count({ n: '*' })).toEqual(before);
    // an edit that would end before the note starts
    const made = (await post(tech, note()).expect(201)).body.note;
    const res = await request(t.app).patch(`${lab}/notes/${made.id}`).set('Cookie', tech).send({ end: '2026-10-06T07:59:00Z' }).expect(400);
    expect(res.body.error.message).toBe('End: the note would end at or before it starts; move the end after the start.');
    // another lab's note in the path
    await request(t.app).patch(`${lab}/notes/${other.ids.noteId}`).set('Cookie', tech).send({ text: 'x' }).expect(404);
    await request(t.app).delete(`${lab}/notes/${other.ids.noteId}`).set('Cookie', tech).expect(404);
  });

  it('notes CSV per channel and lab-wide: scientists export, guests cannot; text cells carry the formula guard', async () => {
    await post(tech, note({ text: '=HYPERLINK("http://x.example")', start: '2026-12-01T00:00:00Z', end: '2026-12-01T01:00:00Z' })).expect(201);
    const csv = await request(t.app)
      .get(`${lab}/channels/${f.ids.channelId}/notes.csv?from=2026-12-01T00:00:00Z&to=2026-12-02T00:00:00Z`)
      .set('Cookie', scientist)
      .expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe(
      'note_id,logger,channel,kind,text,from_utc,to_utc,from_epoch_ms,to_epoch_ms,leave_out_of_analysis,created_by,updated_by,updated_at_utc',
    );
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(`"'=HYPERLINK(""http://x.example"")"`);
    expect(lines[1]).toContain(',2026-12-01T00:00:00.000Z,2026-12-01T01:00:00.000Z,');
    const all = await request(t.app).get(`${lab}/notes.csv`).set('Cookie', scientist).expect(200);
    const total = Number((await t.db('notes').where({ tenant_id: f.lab.id }).count({ n: '*' }))[0].n);
    expect(all.text.trim().split('\r\n')).toHaveLength(total + 1);
    await request(t.app).get(`${lab}/notes.csv`).set('Cookie', guest).expect(403);
  });
});

describe('diagnostics leave noted spans out', () => {
  const range = `from=${iso(T0)}&to=${iso(T0 + N * STEP)}&step=600`;
  const diag = (channelId: number) => request(t.app).get(`${lab}/channels/${channelId}/diagnostics?${range}`).set('Cookie', scientist).expect(200);
  /** The numbers of a report that do not mention the channel by name. */
  const figures = (r: DiagnosticsAnswer) => ({
    series: { ...r.series },
    analysed: r.analysed,
    period: r.period.used,
    acf: r.acf.values,
    pacf: r.pacf.values,
    ljungBox: r.ljungBox,
    ess: r.effectiveSampleSize,
    bands: r.bands,
  });
  let noteId = 0;

  it('a spike inside an excluded note no longer changes the ACF: equal to the same data with those cells missing, different from the spike kept', async () => {
    const made = await post(tech, {
      channelId: ids.noted,
      kindId: f.ids.kindId,
      text: 'Probe cleaned; readings off while it dried',
      start: iso(T0 + SPIKE[0] * STEP),
      end: iso(T0 + (SPIKE.at(-1)! + 1) * STEP),
      excludeFromAnalysis: true,
    }).expect(201);
    noteId = made.body.note.id;
    // one after another: a person may have two runs in flight at most
    const noted = await diag(ids.noted);
    const gapped = await diag(ids.gapped);
    const kept = await diag(ids.kept);
    expect(figures(noted.body)).toEqual(figures(gapped.body));
    expect(noted.body.series.emptyCells).toEqual(SPIKE);
    expect(kept.body.series.missing).toBe(0);
    // the spike moves the lag-1 autocorrelation and the Ljung–Box statistic visibly
    expect(Math.abs(kept.body.acf.values[1] - noted.body.acf.values[1])).toBeGreaterThan(0.01);
    expect(figures(kept.body).acf).not.toEqual(figures(noted.body).acf);
  });

  it('the method section names the note: kind, text, span and the cells removed', async () => {
    const r = (await diag(ids.noted)).body;
    expect(r.method.excludedNotes).toEqual([
      {
        id: noteId,
        kind: 'maintenance',
        text: 'Probe cleaned; readings off while it dried',
        channelId: ids.noted,
        removedFrom: ids.noted,
        from: T0 + 300 * STEP,
        to: T0 + 303 * STEP,
        cellsRemoved: 3,
      },
    ]);
    expect(r.method.notes.join('\n')).toContain(
      `Left out of the analysis by 1 note marked "leave out of analysis" (3 cells with readings made missing; a cell partly under a note goes whole): maintenance [${iso(T0 + 300 * STEP)}, ${iso(T0 + 303 * STEP)}): 3 cells — “Probe cleaned; readings off while it dried”.`,
    );
    expect((await diag(ids.gapped)).body.method.excludedNotes).toEqual([]);
  });

  it('a note change is never answered from the cache: editing, un-flagging and deleting each give a fresh result', async () => {
    const first = await diag(ids.noted);
    const again = await diag(ids.noted);
    expect(again.body.cached).toBe(true);
    expect(first.body.method.excludedNotes).toHaveLength(1);
    await request(t.app).patch(`${lab}/notes/${noteId}`).set('Cookie', tech).send({ text: 'Probe cleaned (wet)' }).expect(200);
    const edited = await diag(ids.noted);
    expect(edited.body.cached).toBe(false);
    expect(edited.body.method.excludedNotes[0].text).toBe('Probe cleaned (wet)');
    await request(t.app).patch(`${lab}/notes/${noteId}`).set('Cookie', tech).send({ excludeFromAnalysis: false }).expect(200);
    const unflagged = await diag(ids.noted);
    expect(unflagged.body.cached).toBe(false);
    expect(unflagged.body.method.excludedNotes).toEqual([]);
    const kept = await diag(ids.kept);
    expect(figures(unflagged.body)).toEqual(figures(kept.body));
    await request(t.app).patch(`${lab}/notes/${noteId}`).set('Cookie', tech).send({ excludeFromAnalysis: true }).expect(200);
    expect(figures((await diag(ids.noted)).body)).toEqual(figures((await diag(ids.gapped)).body));
    await request(t.app).delete(`${lab}/notes/${noteId}`).set('Cookie', tech).expect(204);
    // deleted: the same state as un-flagged above (no note applies), whose result may be served again
    const deleted = await diag(ids.noted);
    expect(deleted.body.method.excludedNotes).toEqual([]);
    expect(figures(deleted.body)).toEqual(figures(kept.body));
  });

  it('a whole-logger note applies to every channel of the logger, and the range comparison leaves it out too', async () => {
    const made = await post(tech, {
      loggerId: f.ids.loggerId,
      kindId: f.ids.kindId,
      text: 'Mast serviced',
      start: iso(T0 + SPIKE[0] * STEP),
      end: iso(T0 + (SPIKE.at(-1)! + 1) * STEP),
      excludeFromAnalysis: true,
    }).expect(201);
    const r = (await diag(ids.noted)).body;
    expect(r.method.excludedNotes).toEqual([expect.objectContaining({ id: made.body.note.id, channelId: null, removedFrom: ids.noted, cellsRemoved: 3 })]);
    expect(figures(r)).toEqual(figures((await diag(ids.gapped)).body));
    const q = `aFrom=${iso(T0)}&aTo=${iso(T0 + 2 * 144 * STEP)}&bFrom=${iso(T0 + 2 * 144 * STEP)}&bTo=${iso(T0 + N * STEP)}&step=600`;
    const compare = (id: number) => request(t.app).get(`${lab}/channels/${id}/comparison?${q}`).set('Cookie', scientist).expect(200);
    const noted = await compare(ids.noted);
    const gapped = await compare(ids.gapped);
    // the cleaning (cells 300–302) lies in range b
    expect(noted.body.b).toEqual(gapped.body.b);
    expect(noted.body.difference).toBe(gapped.body.difference);
    expect(noted.body.method.excludedNotes.b).toEqual([expect.objectContaining({ id: made.body.note.id, cellsRemoved: 3 })]);
    expect(noted.body.method.excludedNotes.a).toEqual([]);
    expect(noted.body.method.statement).toContain('Range b: Left out of the analysis by 1 note');
    await request(t.app).delete(`${lab}/notes/${made.body.note.id}`).set('Cookie', tech).expect(204);
  });
});

describe('unusual-reading alerts leave noted spans out of their history', () => {
  let mailer: Mailer;
  beforeAll(() => {
    mailer = createMailer(t.config.smtp);
  });
  afterAll(() => mailer.close());

  /**
   * Four days of hourly readings on a daily cycle whose last 16 hours read 10 °C high (the
   * probe sat in a calibration bath), then three ordinary readings. Kept in the history, the
   * high stretch lifts the rule's baseline, so the ordinary readings look unusually low;
   * under a note marked "leave out of analysis" it is no baseline and nothing opens.
   */
  async function run(withNote: boolean): Promise<number> {
    const g = await buildLabWithEverything(t.db);
    await t.db('alert_rules').where({ tenant_id: g.lab.id }).delete();
    await t.db('channels').where({ tenant_id: g.lab.id, id: g.ids.channelId }).update({ expected_interval_s: 3600 });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, g.lab, { role: 'technician' })).id);
    let seed = 11;
    const noise = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32 - 0.5) * 0.4;
    const day0 = Math.floor(Date.now() / 86_400_000) * 86_400_000 - 6 * 86_400_000;
    const H = 3_600_000;
    const usual = Array.from({ length: 99 }, (_, h) => 21 + 3 * Math.cos((2 * Math.PI * (h - 15)) / 24) + noise());
    const history = usual.slice(0, 96).map((v, h) => (h >= 80 ? v + 10 : v));
    await request(t.app)
      .post(`/api/v1/labs/${g.lab.slug}/alert-rules`)
      .set('Cookie', cookie)
      .send({ name: 'Growth room odd', kind: 'unusual', channelId: g.ids.channelId, params: { periodH: 24, k: 5, historyCycles: 4 } })
      .expect(201);
    const store = (start: number, values: number[]) =>
      ingestBatch(
        t.db,
        { tenantId: g.lab.id, loggerId: g.ids.loggerId },
        values.map((value, i) => ({ index: i, channel: 'air_t', ts: start + i * H, value })),
        { source: 'api' },
      );
    const evaluator = createAlertEvaluator({ db: t.db, mailer, logger: createLogWriter({ silent: true }), publicUrl: t.config.publicUrl, reminderAfterMin: 0 });
    await store(day0, history);
    await evaluator.runOnce(day0 + 96 * H);
    if (withNote) {
      const kindId = (await request(t.app).get(`/api/v1/labs/${g.lab.slug}/note-kinds`).set('Cookie', cookie).expect(200)).body.kinds[0].id;
      await request(t.app)
        .post(`/api/v1/labs/${g.lab.slug}/notes`)
        .set('Cookie', cookie)
        .send({
          channelId: g.ids.channelId,
          kindId,
          text: 'Probe in the calibration bath',
          start: day0 + 80 * H,
          end: day0 + 96 * H,
          excludeFromAnalysis: true,
        })
        .expect(201);
    }
    await t.db('alerts').where({ tenant_id: g.lab.id }).delete();
    await store(day0 + 96 * H, usual.slice(96, 99));
    await evaluator.runOnce(day0 + 99 * H);
    return Number((await t.db('alerts').where({ tenant_id: g.lab.id }).count({ n: '*' }))[0].n);
  }

  it('ordinary readings after a noted calibration stretch open nothing; without the note the same readings open an alert', async () => {
    expect(await run(false)).toBe(1);
    expect(await run(true)).toBe(0);
  });
});
