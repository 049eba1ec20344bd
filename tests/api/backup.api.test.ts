import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { testConfig } from '../support/test-app.ts';
import { runOps } from '../support/run-ops.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';

/**
 * `ops backup` and `ops restore` end to end: a scratch database is seeded through the real
 * ingestion path, backed up, restored into a fresh database, and every reading, rollup and
 * quarantined row is found again (and MariaDB's own CHECKSUM TABLE agrees for every table).
 */
const config = testConfig();
const source = `${config.db.database}_bk${process.pid}`;
const restored = `${source}_restore`;
const env = { ...process.env, LAGBOOK_DB_NAME: source };

const ops = (...args: string[]) => runOps(args, env);

let admin: Db;
let src: Db;
let dst: Db;
let dir: string;
const labs: LabWithEverything[] = [];
const T0 = Date.UTC(2026, 0, 5);

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'lagbook-backup-'));
  admin = createDb(config.db);
  await admin.raw(`CREATE DATABASE \`${source}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  src = createDb({ ...config.db, database: source });
  dst = createDb({ ...config.db, database: restored });
  await migrateToLatest(src);
  for (let l = 0; l < 2; l++) {
    const f = await buildLabWithEverything(src);
    labs.push(f);
    // 1,500 readings a minute apart (several rollup buckets) plus two rows that go to quarantine.
    const rows: IncomingReading[] = Array.from({ length: 1500 }, (_, i) => ({
      index: i,
      channel: 'air_t',
      ts: T0 + i * 60_000,
      value: l * 100 + Math.sin(i / 40),
    }));
    rows.push({ index: 1500, channel: 'air_t', ts: T0, value: 'warm', raw: '{"value":"warm"}' });
    rows.push({ index: 1501, channel: 'no_such_channel', ts: T0, value: 1 });
    const outcome = await ingestBatch(src, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, rows, { source: 'api' });
    expect(outcome.accepted).toBe(1500);
    expect(outcome.quarantined).toHaveLength(2);
  }
}, 60_000);

afterAll(async () => {
  await src?.destroy();
  await dst?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${source}\``);
  await admin?.raw(`DROP DATABASE IF EXISTS \`${restored}\``);
  await admin?.destroy();
  rmSync(dir, { recursive: true, force: true });
});

async function tableNames(db: Db, schema: string): Promise<string[]> {
  const rows: Array<{ name: string }> = await db('information_schema.tables')
    .where({ table_schema: schema, table_type: 'BASE TABLE' })
    .select({ name: 'table_name' })
    .orderBy('table_name');
  return rows.map((r) => r.name);
}

async function checksums(db: Db, schema: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const name of await tableNames(db, schema)) {
    const [rows] = await db.raw(`CHECKSUM TABLE \`${schema}\`.\`${name}\` EXTENDED`);
    out[name] = String((rows as Array<{ Checksum: unknown }>)[0].Checksum);
  }
  return out;
}

const sorted = (db: Db, table: string, keys: string[]) =>
  db(table)
    .whereIn(
      'tenant_id',
      labs.map((f) => f.lab.id),
    )
    .orderBy(keys);

describe('ops backup and restore', () => {
  const file = () => join(dir, 'lagbook.sql.gz');

  it('backs up to a gzip file and restores into a fresh database with every reading, rollup and quarantined row', async () => {
    const b = await ops('backup', '--out', file());
    expect(b.stderr).toBe('');
    expect(b.code).toBe(0);
    expect(b.stdout).toContain(`Backed up database ${source} to ${file()}`);
    const sql = gunzipSync(readFileSync(file())).toString('utf8');
    expect(sql).toContain('CREATE TABLE `readings`');
    expect(sql).not.toMatch(/^USE /m); // restorable under any database name

    const r = await ops('restore', '--from', file(), '--database', restored, '--json');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual(expect.objectContaining({ database: restored, tables: (await tableNames(src, source)).length }));

    const readings = await sorted(dst, 'readings', ['tenant_id', 'channel_id', 'ts']);
    expect(readings).toHaveLength(3000);
    expect(readings).toEqual(await sorted(src, 'readings', ['tenant_id', 'channel_id', 'ts']));
    for (const f of labs) {
      const times = new Set(readings.filter((x: { tenant_id: number }) => x.tenant_id === f.lab.id).map((x: { ts: number }) => Number(x.ts)));
      for (let i = 0; i < 1500; i++) expect(times.has(T0 + i * 60_000)).toBe(true);
    }
    const rollups = await sorted(dst, 'reading_rollups', ['tenant_id', 'channel_id']);
    expect(rollups.length).toBeGreaterThan(0);
    expect(rollups).toEqual(await sorted(src, 'reading_rollups', ['tenant_id', 'channel_id']));
    const quarantined = await sorted(dst, 'quarantined_rows', ['tenant_id', 'id']);
    expect(quarantined).toHaveLength(2 * 3); // the fixture's one row and two from ingestion, per lab
    expect(quarantined).toEqual(await sorted(src, 'quarantined_rows', ['tenant_id', 'id']));

    // Every table, byte for byte as MariaDB sees it.
    expect(await checksums(dst, restored)).toEqual(await checksums(src, source));
  }, 120_000);

  it('refuses to overwrite a backup file or fill a database that holds tables, unless --force', async () => {
    const before = statSync(file()).mtimeMs;
    const again = await ops('backup', '--out', file());
    expect([again.code, again.stderr.trim()]).toEqual([2, `ops: ${file()} already exists; choose another file or pass --force to replace it.`]);
    expect(statSync(file()).mtimeMs).toBe(before);

    const over = await ops('restore', '--from', file(), '--database', restored);
    expect(over.code).toBe(2);
    expect(over.stderr).toMatch(new RegExp(`^ops: the database ${restored} already holds \\d+ tables; restore into an empty one`));

    // With --force both go ahead, and the restored data is still complete.
    expect((await ops('backup', '--out', file(), '--force')).code).toBe(0);
    expect((await ops('restore', '--from', file(), '--database', restored, '--force')).code).toBe(0);
    expect(await checksums(dst, restored)).toEqual(await checksums(src, source));
  }, 120_000);

  it('answers bad arguments with a clear message and exit code 2', async () => {
    const notGzip = join(dir, 'notes.txt');
    writeFileSync(notGzip, 'not a backup');
    const cases: Array<[string[], string]> = [
      [['backup'], 'ops: --out is required (see --help)'],
      [['restore'], 'ops: --from is required (see --help)'],
      [['restore', '--from', join(dir, 'missing.sql.gz')], `ops: ${join(dir, 'missing.sql.gz')} does not exist or is not a file.`],
      [['restore', '--from', notGzip, '--database', `${source}_x`], `ops: ${notGzip} is not a gzip file made by \`ops backup\`.`],
      [
        ['restore', '--from', file(), '--database', 'bad-name;drop'],
        'ops: --database: "bad-name;drop" is not a database name (letters, digits and _ only, at most 64).',
      ],
      [['backup', '--out', join(dir, 'no-such-folder', 'x.sql.gz')], `ops: the folder ${join(dir, 'no-such-folder')} does not exist.`],
    ];
    for (const [args, message] of cases) {
      const res = await ops(...args);
      expect([res.code, res.stderr.trim()], args.join(' ')).toEqual([2, message]);
    }
    const help = await ops('--help');
    expect(help.stdout).toContain('backup --out <file.sql.gz> [--force]');
    expect(help.stdout).toContain('restore --from <file.sql.gz> [--database <name>] [--force]');
  }, 120_000);
});
