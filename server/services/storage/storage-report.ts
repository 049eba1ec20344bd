import type { Db } from '../../db/create-db.ts';
import { isPartitioned, listPartitions, PARTITIONED_TABLES } from '../../db/reading-partitions.ts';
import { storageRebuildsRepo, type RebuildRecord } from '../../db/storage-rebuilds.repo.ts';
import { pendingRebuildMonths } from './storage-maintenance-job.ts';

/** The storage state for operators (`npm run ops -- storage`): partitions per table and the rebuild of closed months. */
export interface StorageReport {
  tables: Array<{ table: string; partitioned: boolean; partitions: Array<{ name: string; kind: string; approxRows: number }> }>;
  rebuilds: RebuildRecord[];
  pending: string[];
}

/** Gathers the report; `now` decides which months count as closed. */
export async function storageReport(db: Db, now: Date): Promise<StorageReport> {
  const tables: StorageReport['tables'] = [];
  for (const table of PARTITIONED_TABLES) {
    const partitioned = await isPartitioned(db, table);
    const partitions = partitioned ? (await listPartitions(db, table)).map((p) => ({ name: p.name, kind: p.kind, approxRows: p.approxRows })) : [];
    tables.push({ table, partitioned, partitions });
  }
  return { tables, rebuilds: await storageRebuildsRepo(db).all(), pending: await pendingRebuildMonths(db, now) };
}

/** Plain text of the report, one line per partition and per rebuild (times in UTC, ISO 8601: an operator's log format). */
export function storageReportText(r: StorageReport): string {
  const out: string[] = [];
  for (const t of r.tables) {
    if (!t.partitioned) {
      out.push(`${t.table}: not partitioned (run the migrations)`);
      continue;
    }
    const months = t.partitions.filter((p) => p.kind === 'month');
    out.push(`${t.table}: ${months.length} month partitions, ${months[0]?.name ?? '-'} to ${months[months.length - 1]?.name ?? '-'}`);
    for (const p of t.partitions) out.push(`  ${p.name.padEnd(9)} ~${p.approxRows} rows`);
  }
  out.push('rebuilds of closed months (readings):');
  if (r.rebuilds.length === 0) out.push('  none yet');
  for (const b of r.rebuilds) {
    const times = `started ${b.startedAt.toISOString()}${b.finishedAt ? `, finished ${b.finishedAt.toISOString()}` : ''}`;
    out.push(
      `  ${b.partitionName.padEnd(9)} ${b.status.padEnd(8)} ${b.rowsCopied} copied, ${b.rowsPutBack} put back; ${times}${b.lastError ? `; last error: ${b.lastError}` : ''}`,
    );
  }
  out.push(`waiting: ${r.pending.length === 0 ? 'none' : r.pending.join(', ')}`);
  return out.join('\n');
}
