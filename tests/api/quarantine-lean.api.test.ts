/**
 * A quarantined row keeps its original text once (server/db/quarantine-copies.ts) and the table
 * is page-compressed: on the real MariaDB, the quarantine list and CSV export still give every
 * field exactly as it arrived (or, for a time that was read, as ISO 8601 UTC), the copies are
 * really not stored twice, and the migrations convert rows written the old way (every field in
 * its own column) and back. The bad rows are made up here (behaviour checks).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse as parseCsv } from 'csv-parse/sync';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { LagbookMigrationSource, migrationsDirectory } from '../../server/db/migration-source.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { quarantineRepo } from '../../server/db/quarantine.repo.ts';

const T = Math.floor(Date.now() / 60_000) * 60_000 - 3_600_000;
const iso = new Date(T).toISOString();

let t: TestApp;
let f: LabWithEverything;
let tech: string;

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).delete();
  const member = await buildMember(t.db, f.lab, { role: 'technician' });
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, member.id);
});
afterAll(async () => t.close());

/** What the quarantine should show for each bad row sent, by its raw text. */
const EXPECTED: Array<{ raw: string; channel: string | null; ts: string | null; value: string | null }> = [
  // an unknown channel's time is not read: it stays the text sent
  { raw: JSON.stringify({ channel: 'leaf_wetness', ts: T, value: 1.5 }), channel: 'leaf_wetness', ts: String(T), value: '1.5' },
  { raw: JSON.stringify({ channel: 'air_t', ts: T + 1000, value: 'n/a' }), channel: 'air_t', ts: new Date(T + 1000).toISOString(), value: 'n/a' },
  { raw: JSON.stringify({ channel: 'air_t', ts: 'yesterday', value: 2 }), channel: 'air_t', ts: 'yesterday', value: '2' },
  { raw: JSON.stringify({ channel: 'air_t', ts: T + 2000 }), channel: 'air_t', ts: new Date(T + 2000).toISOString(), value: null },
  { raw: '42', channel: null, ts: null, value: null },
  { raw: JSON.stringify({ channel: 'air_t', ts: { at: 'noon' }, value: [1, 2] }), channel: 'air_t', ts: '{"at":"noon"}', value: '[1,2]' },
  { raw: 'air_t,abc', channel: null, ts: null, value: null },
  { raw: `over,air_t,${T + 3000}`, channel: 'air_t', ts: new Date(T + 3000).toISOString(), value: 'over' },
  { raw: '3.5,air_t,yesterday noon', channel: 'air_t', ts: 'yesterday noon', value: '3.5' },
  { raw: `7.25,rh,${T + 4000}`, channel: 'rh', ts: String(T + 4000), value: '7.25' },
];

describe('quarantined rows kept lean', () => {
  it('the list and the CSV export give every field as received; copies of raw are not stored again', async () => {
    const json = EXPECTED.slice(0, 6).map((e) => JSON.parse(e.raw) as unknown);
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings: json }).expect(200);
    const csv = ['value,channel,ts', ...EXPECTED.slice(6).map((e) => e.raw)].join('\n');
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'text/csv').send(csv).expect(200);

    const page = await request(t.app).get(`/api/v1/labs/${f.lab.slug}/quarantine?pageSize=100`).set('Cookie', tech).expect(200);
    const shown = page.body.rows.map((r: { raw: string; channel: string | null; ts: string | null; value: string | null }) => ({
      raw: r.raw,
      channel: r.channel,
      ts: r.ts,
      value: r.value,
    }));
    expect(shown.sort((a: { raw: string }, b: { raw: string }) => a.raw.localeCompare(b.raw))).toEqual(
      [...EXPECTED].sort((a, b) => a.raw.localeCompare(b.raw)),
    );

    const exported = parseCsv((await request(t.app).get(`/api/v1/labs/${f.lab.slug}/quarantine/export.csv`).set('Cookie', tech).expect(200)).text, {
      columns: true,
    }) as Array<Record<string, string>>;
    expect(exported).toHaveLength(EXPECTED.length);
    const cols = Object.keys(exported[0]);
    const [tsCol, valueCol, rawCol] = [cols[7], cols[8], cols[9]];
    for (const e of EXPECTED) {
      const line = exported.find((r) => r[rawCol] === e.raw)!;
      expect([line[tsCol], line[valueCol]]).toEqual([e.ts ?? '', e.value ?? '']);
    }

    // storage: a time or value that is a field of raw is kept only there; a time that was read keeps its ISO text
    const stored = await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).select('raw', 'ts_raw', 'value_raw', 'copied_fields');
    const byRaw = new Map(stored.map((r) => [r.raw, r]));
    expect(byRaw.get(EXPECTED[2].raw)).toMatchObject({ ts_raw: null, value_raw: null });
    expect(byRaw.get(EXPECTED[8].raw)).toMatchObject({ ts_raw: null, value_raw: null });
    expect(byRaw.get(EXPECTED[1].raw)).toMatchObject({ ts_raw: EXPECTED[1].ts, value_raw: null });
    expect(byRaw.get(EXPECTED[7].raw)).toMatchObject({ ts_raw: EXPECTED[7].ts, value_raw: null });
    expect(stored.filter((r) => r.value_raw !== null)).toEqual([]);
    const [[table]] = await t.db.raw(
      "SELECT create_options AS o FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'quarantined_rows'",
    );
    expect(String(table.o).toLowerCase()).toContain('page_compressed');
  });

  it('re-submitting a row whose time is kept only in raw stores it at that time', async () => {
    const row = (await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).select('id', 'raw')).find((r) => r.raw === EXPECTED[2].raw)!;
    const res = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/quarantine/resubmit`)
      .set('Cookie', tech)
      .send({ rows: [{ id: Number(row.id), channel: 'air_t', ts: iso, value: 2 }] })
      .expect(200);
    expect(res.body).toMatchObject({ accepted: 1 });
    expect(await t.db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId, ts: T }).first('value')).toEqual({ value: 2 });
  });
});

describe('migrations 20261204110300–110310 on rows written the old way', () => {
  class Upto extends LagbookMigrationSource {
    constructor(private readonly last: string) {
      super(migrationsDirectory());
    }
    override async getMigrations(): Promise<string[]> {
      return (await super.getMigrations()).filter((m) => m.slice(0, m.lastIndexOf('.')) <= this.last);
    }
  }
  let admin: Db;
  let db: Db;
  let name = '';
  afterAll(async () => {
    await db?.destroy();
    if (name) await admin?.raw(`DROP DATABASE IF EXISTS \`${name}\``);
    await admin?.destroy();
  });

  it('convert in batches, read back the same fields, rerun harmlessly, and go back', async () => {
    name = `${t.config.db.database}_quarantine_lean`;
    admin = createDb(t.config.db);
    await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``);
    await admin.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    db = createDb({ ...t.config.db, database: name });
    await db.migrate.latest({ migrationSource: new Upto('20261204110299'), tableName: 'knex_migrations' });
    const tenantId = 77;
    await db('labs').insert({ id: tenantId, slug: 'old-quarantine', name: 'Old quarantine' });
    // 2,500 rows (three conversion batches), every field in its own column as before
    const old = Array.from({ length: 2500 }, (_, i) => {
      const e = EXPECTED[i % EXPECTED.length];
      return {
        tenant_id: tenantId,
        id: i + 1,
        logger_id: 5,
        source: 'api',
        batch_ref: 'b1',
        row_index: i,
        reason_code: 'bad_value',
        reason: 'value: not a number',
        channel_key: e.channel,
        ts_raw: e.ts,
        value_raw: e.value,
        raw: e.raw,
      };
    });
    for (let i = 0; i < old.length; i += 500) await db('quarantined_rows').insert(old.slice(i, i + 500));
    const snapshot = async () =>
      (await db('quarantined_rows').where({ tenant_id: tenantId }).orderBy('id').select('id', 'channel_key', 'ts_raw', 'value_raw', 'raw')).map((r) => ({
        ...r,
        id: Number(r.id),
      }));
    const before = await snapshot();

    await db.migrate.latest({ migrationSource: new Upto('20261204110310'), tableName: 'knex_migrations' });
    const converted = await db('quarantined_rows').where({ tenant_id: tenantId }).orderBy('id').select('ts_raw', 'value_raw', 'copied_fields');
    // '42', 'air_t,abc' and the item without a value (its time was read: ISO text) hold no copy
    expect(converted.filter((r) => r.copied_fields > 0).length).toBe(2500 - 250 * 3);
    expect(converted.filter((r) => r.value_raw !== null)).toEqual([]);
    const read = await quarantineRepo(inLab(db, tenantId)).findMany(before.map((r) => r.id));
    expect(read.sort((a, b) => a.id - b.id).map((r) => ({ id: r.id, channel_key: r.channelKey, ts_raw: r.tsRaw, value_raw: r.valueRaw, raw: r.raw }))).toEqual(
      before,
    );

    const { up } = await import('../../migrations/20261204110305_backfill-quarantine-copied-fields.ts');
    await up(db);
    expect(await db('quarantined_rows').where({ tenant_id: tenantId }).orderBy('id').select('ts_raw', 'value_raw', 'copied_fields')).toEqual(converted);

    await db.migrate.down({ migrationSource: new Upto('20261204110310'), tableName: 'knex_migrations' });
    await db.migrate.down({ migrationSource: new Upto('20261204110310'), tableName: 'knex_migrations' });
    expect(await snapshot()).toEqual(before);
  });
});
