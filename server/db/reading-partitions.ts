import type { Db } from './create-db.ts';

/**
 * Month partitions of the time-ordered tables (issue #20 item 2).
 *
 * Both tables are `PARTITION BY RANGE` on their time column (epoch ms UTC): a catch-all
 * `p_before` below the first month, one `pYYYYMM` per calendar month (LESS THAN the next
 * month's start), and `p_future` (MAXVALUE) above the last. A month is dropped whole with
 * `DROP PARTITION` (milliseconds, space returned) instead of a row-by-row `DELETE`.
 * Partition names are built and parsed only here.
 */
export const PARTITIONED_TABLES = ['readings', 'reading_rollups'] as const;
export type PartitionedTable = (typeof PARTITIONED_TABLES)[number];

/** One month partition: [monthStart, monthEnd) in epoch ms UTC; `name` like 'p202611'. */
export interface MonthPartition {
  table: PartitionedTable;
  name: string;
  monthStart: number;
  monthEnd: number;
  approxRows: number;
}

/** The partition below the first month. */
export const BEFORE_PARTITION = 'p_before';
/** The partition above the last month (VALUES LESS THAN MAXVALUE). */
export const FUTURE_PARTITION = 'p_future';

/** The time column each table is partitioned on. */
export const PARTITION_COLUMN: Record<PartitionedTable, string> = { readings: 'ts', reading_rollups: 'bucket_start' };

const MONTH_NAME = /^p(\d{4})(\d{2})$/;

/** A partition name the primitives were asked to act on but that is not one of ours. */
export class PartitionNameError extends Error {
  constructor(readonly partitionName: string) {
    super(`not a month partition name: ${partitionName}`);
    this.name = 'PartitionNameError';
  }
}

/** Start (epoch ms UTC) of the calendar month holding `ms`. */
export function monthStartOf(ms: number): number {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1);
}

/** Start (epoch ms UTC) of the month after the one starting at (or holding) `ms`. */
export function nextMonthStart(ms: number): number {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
}

/** Start of the month `n` months after the one holding `ms` (n may be negative). */
export function addMonths(ms: number, n: number): number {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + n, 1);
}

/** 'pYYYYMM' for the month starting at (or holding) `monthStartMs`. */
export function monthPartitionName(monthStartMs: number): string {
  const d = new Date(monthStartMs);
  return `p${String(d.getUTCFullYear()).padStart(4, '0')}${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
}

/** The month start (epoch ms UTC) a 'pYYYYMM' name stands for, or null for any other name. */
export function parseMonthPartitionName(name: string): number | null {
  const m = MONTH_NAME.exec(name);
  if (!m) return null;
  const month = Number(m[2]);
  if (month < 1 || month > 12) return null;
  return Date.UTC(Number(m[1]), month - 1, 1);
}

/**
 * The `PARTITION BY RANGE (…) (…)` clause for a new table holding months
 * [firstMonthStart, lastMonthStart] (both included), with the two catch-alls.
 */
export function partitionClause(table: PartitionedTable, firstMonthStart: number, lastMonthStart: number): string {
  const first = monthStartOf(firstMonthStart);
  const last = monthStartOf(lastMonthStart);
  const parts = [`PARTITION ${BEFORE_PARTITION} VALUES LESS THAN (${first})`];
  for (let m = first; m <= last; m = nextMonthStart(m)) {
    parts.push(`PARTITION ${monthPartitionName(m)} VALUES LESS THAN (${nextMonthStart(m)})`);
  }
  parts.push(`PARTITION ${FUTURE_PARTITION} VALUES LESS THAN MAXVALUE`);
  return `PARTITION BY RANGE (${PARTITION_COLUMN[table]}) (\n  ${parts.join(',\n  ')}\n)`;
}

interface PartitionRow {
  name: string;
  bound: string | null;
  rows: number | string | null;
}

async function partitionRows(db: Db, table: PartitionedTable): Promise<PartitionRow[]> {
  const [rows] = (await db.raw(
    `SELECT PARTITION_NAME AS name, PARTITION_DESCRIPTION AS bound, TABLE_ROWS AS \`rows\`
       FROM information_schema.PARTITIONS
      WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND PARTITION_NAME IS NOT NULL
      ORDER BY PARTITION_ORDINAL_POSITION`,
    [table],
  )) as [PartitionRow[]];
  return rows;
}

/** True when `table` is partitioned (the migration has run). */
export async function isPartitioned(db: Db, table: PartitionedTable): Promise<boolean> {
  return (await partitionRows(db, table)).length > 0;
}

/**
 * Month partitions in time order; the catch-all partitions below the first and above the last
 * month come as kind 'before'/'future'. `approxRows` is InnoDB's estimate (information_schema),
 * good for progress and planning, never for counting.
 */
export async function listPartitions(db: Db, table: PartitionedTable): Promise<Array<MonthPartition & { kind: 'before' | 'month' | 'future' }>> {
  const rows = await partitionRows(db, table);
  const out: Array<MonthPartition & { kind: 'before' | 'month' | 'future' }> = [];
  let previousEnd = Number.MIN_SAFE_INTEGER;
  for (const r of rows) {
    const approxRows = Number(r.rows ?? 0);
    const bound = r.bound === null || r.bound === 'MAXVALUE' ? Number.MAX_SAFE_INTEGER : Number(r.bound);
    const monthStart = parseMonthPartitionName(r.name);
    const kind = r.name === FUTURE_PARTITION ? 'future' : r.name === BEFORE_PARTITION ? 'before' : monthStart !== null ? 'month' : null;
    if (kind === null) throw new PartitionNameError(r.name);
    out.push({ table, name: r.name, kind, monthStart: kind === 'month' ? (monthStart as number) : previousEnd, monthEnd: bound, approxRows });
    previousEnd = bound;
  }
  return out;
}

/**
 * Makes month partitions up to and including the month holding `untilMs` (splitting the
 * 'future' catch-all). Returns the names made (empty when they all exist). Splitting
 * `p_future` moves its rows, so it is done while `p_future` is empty — which it is, as long as
 * the job keeps months ahead of the clock (readings from the future are refused at ingestion).
 */
export async function ensureMonthsUpTo(db: Db, table: PartitionedTable, untilMs: number): Promise<string[]> {
  const parts = await listPartitions(db, table);
  const months = parts.filter((p) => p.kind === 'month');
  const lastEnd = months.length > 0 ? months[months.length - 1].monthEnd : (parts.find((p) => p.kind === 'before')?.monthEnd ?? monthStartOf(untilMs));
  const target = nextMonthStart(monthStartOf(untilMs));
  const made: string[] = [];
  const defs: string[] = [];
  for (let m = lastEnd; m < target; m = nextMonthStart(m)) {
    const name = monthPartitionName(m);
    made.push(name);
    defs.push(`PARTITION ${name} VALUES LESS THAN (${nextMonthStart(m)})`);
  }
  if (defs.length === 0) return [];
  await db.raw(`ALTER TABLE ?? REORGANIZE PARTITION ${FUTURE_PARTITION} INTO (${defs.join(', ')}, PARTITION ${FUTURE_PARTITION} VALUES LESS THAN MAXVALUE)`, [
    table,
  ]);
  return made;
}

/** The table a dropped month is detached into before its file is removed, e.g. `readings_gone_p202611`. */
export function detachedTableName(table: PartitionedTable, name: string): string {
  return `${table}_gone_${name}`;
}

/**
 * Drops one month partition (or empties the 'before' catch-all) — its rows go at once. A month is
 * first detached into a table of its own (`CONVERT PARTITION … TO TABLE`, a metadata change that
 * holds the partitioned table for milliseconds), then that table is dropped: removing a
 * page-compressed file can take seconds where the filesystem frees thousands of punched holes
 * one by one, and only the detached table waits for it, never ingestion. A crash between the two
 * leaves the detached table, which `dropDetachedLeftovers` removes.
 */
export async function dropPartition(db: Db, table: PartitionedTable, name: string): Promise<void> {
  if (name !== BEFORE_PARTITION && parseMonthPartitionName(name) === null) throw new PartitionNameError(name);
  if (name === BEFORE_PARTITION) {
    // The catch-all is kept (an empty one) so rows older than the first month always have a
    // place; its rows go by TRUNCATE, which is as quick as a drop.
    await db.raw(`ALTER TABLE ?? TRUNCATE PARTITION ${BEFORE_PARTITION}`, [table]);
    return;
  }
  const detached = detachedTableName(table, name);
  await db.schema.dropTableIfExists(detached);
  await db.raw(`ALTER TABLE ?? CONVERT PARTITION ${name} TO TABLE ??`, [table, detached]);
  await db.schema.dropTableIfExists(detached);
}

/** Drops detached months a crash left behind (see `dropPartition`); returns their names. */
export async function dropDetachedLeftovers(db: Db): Promise<string[]> {
  const [rows] = (await db.raw(
    `SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND (TABLE_NAME LIKE 'readings\\_gone\\_p%' OR TABLE_NAME LIKE 'reading\\_rollups\\_gone\\_p%')`,
  )) as [Array<{ name: string }>];
  const names = rows
    .map((r) => r.name)
    .filter((n) => PARTITIONED_TABLES.some((t) => n.startsWith(`${t}_gone_`) && parseMonthPartitionName(n.slice(t.length + 6)) !== null));
  for (const n of names) await db.schema.dropTableIfExists(n);
  return names;
}

/** Rows per (lab, channel) in one partition (for counters before a drop). */
export async function rowsPerChannel(db: Db, table: 'readings', name: string): Promise<Array<{ tenantId: number; channelId: number; rows: number }>> {
  if (name !== BEFORE_PARTITION && name !== FUTURE_PARTITION && parseMonthPartitionName(name) === null) throw new PartitionNameError(name);
  const [rows] = (await db.raw(
    `SELECT tenant_id AS tenantId, channel_id AS channelId, COUNT(*) AS n FROM ?? PARTITION (${name}) GROUP BY tenant_id, channel_id ORDER BY tenant_id, channel_id`,
    [table],
  )) as [Array<{ tenantId: number | string; channelId: number | string; n: number | string }>];
  return rows.map((r) => ({ tenantId: Number(r.tenantId), channelId: Number(r.channelId), rows: Number(r.n) }));
}

/** A month counts as closed (its rebuild may start) once its end is this far in the past: late uploads settle first. */
export const REBUILD_GRACE_MS = 24 * 60 * 60 * 1000;

/**
 * Makes month partitions back to the month holding `fromMs` by splitting the 'before' catch-all
 * (for history loaded from before the first month, e.g. an import of last year's files). Returns
 * the names made. The split copies the catch-all's rows and holds off writers to the table while
 * it runs: instant while the catch-all is empty, as long as a copy of it otherwise.
 */
export async function ensureMonthsFrom(db: Db, table: PartitionedTable, fromMs: number): Promise<string[]> {
  const before = (await listPartitions(db, table)).find((p) => p.kind === 'before');
  if (!before) return [];
  const first = monthStartOf(fromMs);
  if (first >= before.monthEnd) return [];
  const made: string[] = [];
  const defs = [`PARTITION ${BEFORE_PARTITION} VALUES LESS THAN (${first})`];
  for (let m = first; m < before.monthEnd; m = nextMonthStart(m)) {
    made.push(monthPartitionName(m));
    defs.push(`PARTITION ${monthPartitionName(m)} VALUES LESS THAN (${nextMonthStart(m)})`);
  }
  await db.raw(`ALTER TABLE ?? REORGANIZE PARTITION ${BEFORE_PARTITION} INTO (${defs.join(', ')})`, [table]);
  return made;
}
