import type { Knex } from 'knex';

/**
 * Readings and rollups become page-compressed (`PAGE_COMPRESSED=1`, the server's
 * `innodb_compression_algorithm`, zlib) and partitioned by month of their time column
 * (`readings.ts`, `reading_rollups.bucket_start`): `p_before`, one `pYYYYMM` per month from the
 * oldest stored row's month (the current month when empty) to three months ahead, `p_future`.
 * A month then goes with `DROP PARTITION` in milliseconds and gives its space back, where a
 * `DELETE` took seconds, wrote redo and returned nothing; the storage maintenance job keeps
 * months ahead and rebuilds closed months once so they compress fully.
 *
 * Why now: partitioning an existing table is possible only as a copy of the whole table, and
 * the copy BLOCKS WRITES for its duration (≈ 23 s per 10 million readings measured here; reads go
 * on). Ingestion waits (or its loggers retry) meanwhile. The tables are young; later the copy only
 * gets longer.
 *
 * How: one `ALTER TABLE … ALGORITHM=COPY, LOCK=SHARED` per table. The server creates the new
 * partitioned table, copies every row and swaps it in atomically, holding off writers from the
 * first row copied to the swap, so no reading written meanwhile can be missed. (A hand-made
 * `readings_next` + `RENAME TABLE` cannot do that: MariaDB refuses RENAME TABLE while LOCK TABLES
 * holds the writers off, and without the lock readings stored during the copy would be lost.)
 * MariaDB's DDL is crash-safe: a server that dies mid-copy comes back with the old table intact and
 * the half-made copy removed, so rerunning this migration simply does the copy again; a table
 * already converted is left alone. Leftovers of an earlier attempt under `<table>_next` are dropped.
 */

// Self-contained (a landed migration never changes): the same layout and names as
// server/db/reading-partitions.ts builds — p_before, pYYYYMM (LESS THAN the next month's start in
// epoch ms UTC), p_future (MAXVALUE).
const PARTITIONED_TABLES = ['readings', 'reading_rollups'] as const;
type PartitionedTable = (typeof PARTITIONED_TABLES)[number];
const PARTITION_COLUMN: Record<PartitionedTable, string> = { readings: 'ts', reading_rollups: 'bucket_start' };

const monthStartOf = (ms: number): number => Date.UTC(new Date(ms).getUTCFullYear(), new Date(ms).getUTCMonth(), 1);
const addMonths = (ms: number, n: number): number => Date.UTC(new Date(ms).getUTCFullYear(), new Date(ms).getUTCMonth() + n, 1);
const monthName = (ms: number): string => `p${new Date(ms).getUTCFullYear()}${String(new Date(ms).getUTCMonth() + 1).padStart(2, '0')}`;

function partitionClause(table: PartitionedTable, first: number, last: number): string {
  const parts = [`PARTITION p_before VALUES LESS THAN (${first})`];
  for (let m = first; m <= last; m = addMonths(m, 1)) parts.push(`PARTITION ${monthName(m)} VALUES LESS THAN (${addMonths(m, 1)})`);
  parts.push('PARTITION p_future VALUES LESS THAN MAXVALUE');
  return `PARTITION BY RANGE (${PARTITION_COLUMN[table]}) (${parts.join(', ')})`;
}

/** Months kept in their own partition below "now" at most; older rows share `p_before`. */
const MAX_MONTHS_BACK = 240;
/** Months made ahead of the current month (the maintenance job keeps this up). */
const MONTHS_AHEAD = 3;

async function isConverted(knex: Knex, table: PartitionedTable): Promise<boolean> {
  const [rows] = (await knex.raw(
    `SELECT COUNT(*) AS n FROM information_schema.PARTITIONS WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND PARTITION_NAME IS NOT NULL`,
    [table],
  )) as [Array<{ n: number | string }>];
  return Number(rows[0]?.n ?? 0) > 0;
}

async function oldest(knex: Knex, table: PartitionedTable): Promise<number | null> {
  const column = PARTITION_COLUMN[table];
  const [rows] = (await knex.raw(`SELECT MIN(??) AS t FROM ??`, [column, table])) as [Array<{ t: number | string | null }>];
  const t = rows[0]?.t;
  return t === null || t === undefined ? null : Number(t);
}

export async function up(knex: Knex): Promise<void> {
  const now = Date.now();
  for (const table of PARTITIONED_TABLES) await knex.schema.dropTableIfExists(`${table}_next`);
  // One month range for both tables, so retention drops the same months from each.
  let first = monthStartOf(now);
  for (const table of PARTITIONED_TABLES) {
    if (await isConverted(knex, table)) continue;
    const t = await oldest(knex, table);
    if (t !== null && t < first) first = monthStartOf(t);
  }
  first = Math.max(first, addMonths(now, -MAX_MONTHS_BACK));
  const last = addMonths(now, MONTHS_AHEAD);
  // Page compression needs a tablespace per table; a server keeping every table in the system
  // tablespace (innodb_file_per_table=0) refuses the option, so there the tables are partitioned only.
  const [perTable] = (await knex.raw('SELECT @@innodb_file_per_table AS on_')) as [Array<{ on_: number | string }>];
  const compression = Number(perTable[0]?.on_ ?? 0) === 1 ? ', PAGE_COMPRESSED=1' : '';
  for (const table of PARTITIONED_TABLES) {
    if (await isConverted(knex, table)) continue;
    await knex.raw(`ALTER TABLE ?? ALGORITHM=COPY, LOCK=SHARED${compression} ${partitionClause(table, first, last)}`, [table]);
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const table of PARTITIONED_TABLES) {
    if (!(await isConverted(knex, table))) continue;
    await knex.raw(`ALTER TABLE ?? ALGORITHM=COPY, LOCK=SHARED, PAGE_COMPRESSED=DEFAULT REMOVE PARTITIONING`, [table]);
  }
}
