/**
 * `npx tsx tests/bench/quarantine-storage.bench.ts` — bytes per quarantined row on disk.
 *
 * Posts BENCH_BAD_ROWS (default 50,000) bad rows through POST /api/v1/ingest — half as JSON
 * items, half as CSV lines, each batch 1,000 bad rows (the per-batch cap) beside a few good
 * readings — with the usual mistakes: an unknown channel, a value that is no number, an
 * unreadable time, a line with the wrong number of fields, an item that is not an object, a
 * field missing. Then prints the `quarantined_rows` table's size: data + index (after ANALYZE
 * TABLE) and the file's allocated bytes (what the disk holds; page compression shows only
 * there), per row. For comparison it copies the same rows into variants of the table in the
 * same run: page-compressed (zlib) and with the `raw` column compressed. The bad rows are
 * generated here (a fictional lab's mistakes); reports, asserts nothing.
 */
import { statSync } from 'node:fs';
import http from 'node:http';
import { join } from 'node:path';
import { startBenchStack, type BenchStack } from './support/bench-stack.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';

const BAD_ROWS = Number(process.env.BENCH_BAD_ROWS ?? 50_000);
const PER_BATCH = 1000;
const T0 = Date.UTC(2026, 10, 1);

/** Bad row number `i` as a JSON item. */
function badItem(i: number): unknown {
  const ts = T0 + i * 60_000;
  switch (i % 6) {
    case 0:
      return { channel: 'leaf_wetness', ts, value: Math.round(Math.sin(i) * 1000) / 100 };
    case 1:
      return { channel: 'air_t', ts, value: i % 12 === 1 ? 'n/a' : '--' };
    case 2:
      return { channel: 'air_t', ts: `${(i % 28) + 1}.11.2026 ${i % 24}h`, value: 21.5 };
    case 3:
      return { channel: 'rh', ts: new Date(ts).toISOString(), value: 'ERR' };
    case 4:
      return i % 2;
    default:
      return { channel: 'air_t', value: 19.25 };
  }
}

/** Bad row number `i` as a CSV line (header channel,ts,value). */
function badLine(i: number): string {
  const ts = new Date(T0 + i * 60_000).toISOString().replace('T', ' ').slice(0, 19);
  switch (i % 5) {
    case 0:
      return `leaf_wetness,${ts},${(i % 97) / 10}`;
    case 1:
      return `air_t,${ts},${i % 3 === 0 ? 'NaN?' : 'over'}`;
    case 2:
      return `air_t,${ts}`;
    case 3:
      return `air_t,32/13/2026 25:61,20.1`;
    default:
      return `air_t,${ts},21.4,extra,fields`;
  }
}

function post(url: string, key: string, body: string, contentType: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method: 'POST', headers: { Authorization: `Bearer ${key}`, 'Content-Type': contentType } }, (res) => {
      res.resume();
      res.on('end', () => resolve(res.statusCode ?? 0));
    });
    req.on('error', reject);
    req.end(body);
  });
}

/**
 * data + index bytes (after ANALYZE), and the table file's logical size and the bytes the disk
 * allocates for it (`stat` blocks, as `du` shows them: page compression returns space only
 * there, by punching holes), after FLUSH TABLES … FOR EXPORT has written every dirty page.
 */
async function sizeOf(stack: BenchStack, table: string): Promise<{ rows: number; dataIndex: number; allocated: number; file: number }> {
  const database = stack.dbConfig.database;
  await stack.db.raw(`ANALYZE TABLE ${table}`);
  const [[t]] = await stack.db.raw('SELECT data_length + index_length AS di FROM information_schema.tables WHERE table_schema = ? AND table_name = ?', [
    database,
    table,
  ]);
  const [[n]] = await stack.db.raw(`SELECT COUNT(*) AS n FROM ${table}`);
  const [[dir]] = await stack.db.raw('SELECT @@datadir AS d');
  // one connection: the export lock belongs to the session that takes it
  const st = await stack.db.transaction(async (trx) => {
    await trx.raw(`FLUSH TABLES ${table} FOR EXPORT`);
    try {
      return statSync(join(dir.d, database, `${table}.ibd`));
    } finally {
      await trx.raw('UNLOCK TABLES');
    }
  });
  return { rows: Number(n.n), dataIndex: Number(t.di), allocated: st.blocks * 512, file: st.size };
}

function report(name: string, s: { rows: number; dataIndex: number; allocated: number; file: number }) {
  console.log(
    `${name.padEnd(44)} ${s.rows.toLocaleString('en')} rows: data+index ${(s.dataIndex / s.rows).toFixed(0)} B/row, file ${(s.file / s.rows).toFixed(0)} B/row, allocated on disk ${(s.allocated / s.rows).toFixed(0)} B/row`,
  );
}

async function main() {
  const stack = await startBenchStack();
  try {
    const lab = await labsRepo(stack.db).insert({ slug: 'quarantine-bench', name: 'Quarantine bench' });
    await onLargestPlan(stack.db, lab.id);
    const service = createLoggersService({ db: stack.db });
    const { issued } = await service.register({ ...lab, role: 'admin' as const }, null, {
      name: 'Greenhouse 3',
      timezone: 'UTC',
      expectedIntervalS: 60,
      channels: [
        { key: 'air_t', label: 'Air temperature' },
        { key: 'rh', label: 'Relative humidity' },
      ],
    });
    const url = `${stack.appUrl}/api/v1/ingest`;
    const started = Date.now();
    for (let b = 0; b * PER_BATCH < BAD_ROWS; b++) {
      const from = b * PER_BATCH;
      const n = Math.min(PER_BATCH, BAD_ROWS - from);
      const good = Array.from({ length: 5 }, (_, k) => ({ channel: 'air_t', ts: T0 + (b * 5 + k) * 60_000, value: 20 + k / 10 }));
      let status: number;
      if (b % 2 === 0) {
        const readings = [...good, ...Array.from({ length: n }, (_, k) => badItem(from + k))];
        status = await post(url, issued.key, JSON.stringify({ readings }), 'application/json');
      } else {
        const lines = ['channel,ts,value', ...good.map((g) => `${g.channel},${new Date(g.ts).toISOString()},${g.value}`)];
        for (let k = 0; k < n; k++) lines.push(badLine(from + k));
        status = await post(url, issued.key, `${lines.join('\n')}\n`, 'text/csv');
      }
      if (status !== 200) throw new Error(`batch ${b} answered ${status}`);
    }
    console.log(`posted ${BAD_ROWS.toLocaleString('en')} bad rows in ${((Date.now() - started) / 1000).toFixed(1)} s`);
    report('quarantined_rows (as migrated)', await sizeOf(stack, 'quarantined_rows'));

    // Variants of the same rows, copied in 1,000-row statements like ingestion writes them.
    const variants: Array<[string, string]> = [
      ['copy, uncompressed', 'ALTER TABLE q_variant PAGE_COMPRESSED=0'],
      ['copy, page-compressed (zlib)', 'ALTER TABLE q_variant PAGE_COMPRESSED=1'],
      ['copy, raw COMPRESSED column only', 'ALTER TABLE q_variant PAGE_COMPRESSED=0, MODIFY raw TEXT COMPRESSED NULL'],
      ['copy, page-compressed + raw COMPRESSED', 'ALTER TABLE q_variant PAGE_COMPRESSED=1, MODIFY raw TEXT COMPRESSED NULL'],
    ];
    for (const [name, alter] of variants) {
      await stack.db.raw('DROP TABLE IF EXISTS q_variant');
      await stack.db.raw('CREATE TABLE q_variant LIKE quarantined_rows');
      await stack.db.raw(alter);
      const [[{ lo, hi }]] = await stack.db.raw('SELECT MIN(id) AS lo, MAX(id) AS hi FROM quarantined_rows');
      let after = BigInt(lo) - 1n;
      for (;;) {
        const [rows] = await stack.db.raw('SELECT id FROM quarantined_rows WHERE id > ? ORDER BY id LIMIT 1 OFFSET 999', [after.toString()]);
        const upto = (rows as Array<{ id: string | number }>).length ? BigInt((rows as Array<{ id: string | number }>)[0].id) : BigInt(hi);
        await stack.db.raw('INSERT INTO q_variant SELECT * FROM quarantined_rows WHERE id > ? AND id <= ?', [after.toString(), upto.toString()]);
        after = upto;
        if (upto >= BigInt(hi)) break;
      }
      report(name, await sizeOf(stack, 'q_variant'));
    }
    await stack.db.raw('DROP TABLE IF EXISTS q_variant');
  } finally {
    await stack.stop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
