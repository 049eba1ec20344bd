import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { dropPartition, listPartitions, rowsPerChannel, type PartitionedTable } from '../../db/reading-partitions.ts';
import { retentionLabRepo } from '../../db/retention.repo.ts';
import { retentionRecordsRepo, type OpenPartitionDrop } from '../../db/retention.repo.ts';
import { partitionMayGo, type PartitionForPlan } from './retention-plan.ts';

/**
 * Dropping a month partition of `readings` (and the same month of `reading_rollups`) while
 * keeping the per-channel stored-readings counters exact across a crash.
 *
 * `DROP PARTITION` commits on its own, so it cannot share a transaction with the counters. The
 * order is: (1) count the partition's rows per (lab, channel) and write them to the journal;
 * (2) drop the readings partition, then the rollups partition; (3) in one transaction lower the
 * counters by the journaled rows and mark the journal row settled. Counters are lowered only
 * once the rows are surely gone, so they never count less than is stored:
 * - a crash between (1) and (2) leaves the rows and counters untouched; the next run finds the
 *   readings partition still holding rows, cancels the journal row and decides afresh (a lab's
 *   plan may have changed meanwhile, so the old decision is not replayed);
 * - a crash between (2) and (3) leaves the rows gone and the counters high; the next run finds the
 *   readings partition gone (or, for the kept catch-all, empty), drops the rollups partition if
 *   still there and lowers the counters from the journal.
 * Every reading stays readable until (2), and (2) removes only readings every one of whose labs
 * is past the partition's end.
 */

/** Step (1): counts the rows per channel and journals the drop, or answers null when the partition may not go (any longer). */
export async function journalPartitionDrop(
  db: Db,
  runId: number,
  partition: Pick<PartitionForPlan, 'name' | 'kind' | 'monthEnd'>,
  horizons: ReadonlyMap<number, number>,
  at: Date,
): Promise<OpenPartitionDrop | null> {
  const channelRows = await rowsPerChannel(db, 'readings', partition.name);
  const labIds = [...new Set(channelRows.map((c) => c.tenantId))];
  // decided again on the exact count: a reading may have arrived since the labs were listed
  if (!partitionMayGo({ ...partition, labIds }, horizons)) return null;
  const records = retentionRecordsRepo(db);
  const id = await records.journalDrop(runId, partition.name, partition.monthEnd, channelRows, at);
  return { id, runId, partitionName: partition.name, monthEnd: partition.monthEnd, channelRows, readings: channelRows.reduce((s, c) => s + c.rows, 0) };
}

/** The partition of `table` with this name, or undefined when it is gone. */
async function findPartition(db: Db, table: PartitionedTable, name: string) {
  return (await listPartitions(db, table)).find((p) => p.name === name);
}

/**
 * Step (2): drops the journaled month from `readings`, then from `reading_rollups` — the rollups
 * partition only when it ends no later than the readings partition and every lab with rollups
 * in it is past its end (otherwise its rows before each removing lab's horizon go with the
 * per-lab pruning).
 */
export async function dropJournaledPartition(db: Db, drop: OpenPartitionDrop, horizons: ReadonlyMap<number, number>): Promise<void> {
  if (await findPartition(db, 'readings', drop.partitionName)) await dropPartition(db, 'readings', drop.partitionName);
  await dropRollupsPartition(db, drop, horizons);
}

async function dropRollupsPartition(db: Db, drop: OpenPartitionDrop, horizons: ReadonlyMap<number, number>): Promise<void> {
  const rollups = await findPartition(db, 'reading_rollups', drop.partitionName);
  if (!rollups || rollups.monthEnd > drop.monthEnd) return;
  const labIds = await retentionRecordsRepo(db).labsInPartition('reading_rollups', drop.partitionName);
  if (labIds.length === 0) return;
  if (partitionMayGo({ name: rollups.name, kind: rollups.kind, monthEnd: rollups.monthEnd, labIds }, horizons)) {
    await dropPartition(db, 'reading_rollups', drop.partitionName);
  }
}

/** Step (3): lowers each channel's and lab's stored-readings counter by the journaled rows and settles the journal row, in one transaction. */
export async function settlePartitionDrop(db: Db, drop: OpenPartitionDrop, at: Date): Promise<void> {
  await db.transaction(async (trx) => {
    // settle first: a second settler (a stale lease holder) finds nothing to settle and lowers nothing
    if (!(await retentionRecordsRepo(trx).settleDrop(drop.id, at))) return;
    const perLab = new Map<number, number>();
    for (const c of drop.channelRows) {
      await retentionLabRepo(inLab(trx, c.tenantId)).lowerChannelCount(c.channelId, c.rows);
      perLab.set(c.tenantId, (perLab.get(c.tenantId) ?? 0) + c.rows);
    }
    for (const [labId, rows] of perLab) await retentionLabRepo(inLab(trx, labId)).lowerLabCount(rows);
  });
}

/**
 * Finishes what a run that died left in the journal (see the file comment): a drop whose readings
 * are gone is settled (rollups dropped too when due); a drop whose partition still holds
 * readings is cancelled, to be decided afresh. Returns how many of each, and the readings settled.
 */
export async function resolveOpenDrops(
  db: Db,
  horizons: ReadonlyMap<number, number>,
  at: Date,
  beforeEach: () => Promise<void> = async () => {},
): Promise<{ settled: number; cancelled: number; readings: number }> {
  const records = retentionRecordsRepo(db);
  const outcome = { settled: 0, cancelled: 0, readings: 0 };
  for (const drop of await records.openDrops()) {
    await beforeEach();
    const readings = await findPartition(db, 'readings', drop.partitionName);
    const stillHolds = readings !== undefined && (await records.labsInPartition('readings', drop.partitionName)).length > 0;
    if (stillHolds) {
      await records.cancelDrop(drop.id, at);
      outcome.cancelled++;
      continue;
    }
    await dropRollupsPartition(db, drop, horizons);
    await settlePartitionDrop(db, drop, at);
    outcome.settled++;
    outcome.readings += drop.readings;
  }
  return outcome;
}
