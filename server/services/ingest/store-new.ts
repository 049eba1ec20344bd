import type { LabScope } from '../../db/tenant-scope.ts';
import { readingsRepo, sliceColumns } from '../../db/readings.repo.ts';
import { quarantineRepo, type QuarantineInput, type ReadingSource } from '../../db/quarantine.repo.ts';
import { channelStateRepo } from '../../db/channel-state.repo.ts';
import { rollbackToSavepoint, setSavepoint } from '../../db/savepoint.ts';
import type { SortedCandidates } from './batch-candidates.ts';
import type { IncomingReading, RejectedRow } from './check-rows.ts';

/** What storing a batch's candidates did. */
export interface StoredNew {
  /** Readings newly written. */
  accepted: number;
  /** Candidates already stored with the same value (a re-sent batch). */
  duplicates: number;
  /** Candidates whose time already holds another value: the stored value stays, these go to quarantine. */
  conflicts: RejectedRow[];
  /** Readings newly written per run of `sorted.runs` (same order). */
  addedPerRun: number[];
}

/** Where a batch's quarantined rows came from. */
export interface QuarantineOrigin {
  loggerId: number;
  source: ReadingSource;
  batchRef: string;
}

/** Readings written per statement. */
const INSERT_CHUNK = 5000;

/** Set before a batch's insert, so a batch that meets stored rows can insert again run by run. */
const BEFORE_INSERT = 'lagbook_store_new';

/** Inserts candidates from..to (new ones only), in statements of at most INSERT_CHUNK; returns how many were new. */
async function insertRange(readings: ReturnType<typeof readingsRepo>, columns: SortedCandidates['columns'], from: number, to: number): Promise<number> {
  let added = 0;
  for (let i = from; i < to; i += INSERT_CHUNK) added += await readings.insertNew(sliceColumns(columns, i, Math.min(i + INSERT_CHUNK, to)));
  return added;
}

/**
 * Writes the batch's candidates that are new, in primary-key order, on the scope's transaction
 * (a (channel, time) already stored is left as it is). Only when some candidates were already
 * stored does it read them back, to tell a duplicate (same value) from a conflict (another
 * value, which keeps the stored one and sends the newcomer to quarantine). `rows` are the rows
 * given to the batch, so a conflict names the row it came from.
 *
 * Each channel's stored-readings counter must move by exactly the rows it gained. When every
 * candidate was new (the usual case) that is each run's length, and `updateDerived` adds it in
 * the statement that advances the channel's version. When some were already stored (a re-sent
 * batch), the insert is undone to a savepoint and repeated one run at a time, which gives each
 * channel's own count, and the counters are moved here (`updateDerived` then adds nothing).
 * The usual case costs one SAVEPOINT statement more than before; a batch of one channel none.
 */
export async function storeNew(scope: LabScope, sorted: SortedCandidates, rows: readonly IncomingReading[]): Promise<StoredNew> {
  const readings = readingsRepo(scope);
  const { columns, rowAt, runs } = sorted;
  const conflicts: RejectedRow[] = [];
  if (columns.length === 0) return { accepted: 0, duplicates: 0, conflicts, addedPerRun: runs.map(() => 0) };
  const severalRuns = runs.length > 1;
  if (severalRuns) await setSavepoint(scope.db, BEFORE_INSERT);
  let accepted = await insertRange(readings, columns, 0, columns.length);
  if (accepted === columns.length) return { accepted, duplicates: 0, conflicts, addedPerRun: runs.map((r) => r.to - r.from) };

  // nothing new (a batch sent again whole): every run added nothing, no need to insert again
  let addedPerRun = accepted === 0 ? runs.map(() => 0) : [accepted];
  if (severalRuns && accepted > 0) {
    await rollbackToSavepoint(scope.db, BEFORE_INSERT);
    addedPerRun = [];
    for (const run of runs) addedPerRun.push(await insertRange(readings, columns, run.from, run.to));
    accepted = addedPerRun.reduce((a, b) => a + b, 0);
  }
  await channelStateRepo(scope).adjustStored(runs.map((r, i) => ({ channelId: r.channelId, delta: addedPerRun[i] })));

  for (const run of runs) {
    const stored = await readings.storedAt(run.channelId, Array.from(columns.ts.subarray(run.from, run.to)));
    for (let i = run.from; i < run.to; i++) {
      const v = stored.get(columns.ts[i]);
      if (v !== undefined && v !== columns.value[i]) {
        conflicts.push({
          row: rows[rowAt[i]],
          code: 'conflicts_with_stored',
          reason: `value: ${columns.value[i]} differs from the value already stored for this time (${v}); the stored value was kept`,
          ts: columns.ts[i],
        });
      }
    }
  }
  return { accepted, duplicates: columns.length - accepted - conflicts.length, conflicts, addedPerRun };
}

const text = (v: unknown): string | null => (v === undefined || v === null ? null : typeof v === 'string' ? v : JSON.stringify(v));

/** A rejected row as quarantine keeps it. */
function quarantineInput(rejected: RejectedRow, origin: QuarantineOrigin): QuarantineInput {
  const { row, code, reason, ts } = rejected;
  return {
    loggerId: origin.loggerId,
    source: origin.source,
    batchRef: origin.batchRef,
    rowIndex: row.index,
    reasonCode: code,
    reason,
    channelKey: text(row.channel),
    // a time that was read is kept as ISO 8601 UTC, so a fixed row re-submits without the
    // upload's time zone or format; the row as sent stays in `raw`
    tsRaw: ts !== undefined ? new Date(ts).toISOString() : text(row.ts),
    valueRaw: text(row.value),
    raw: row.raw === undefined ? null : typeof row.raw === 'string' ? row.raw : (JSON.stringify(row.raw) ?? null),
  };
}

/** Writes a batch's rejected rows to quarantine, in the order given, on the scope's transaction (nothing when there are none). */
export async function storeQuarantined(scope: LabScope, rejected: readonly RejectedRow[], origin: QuarantineOrigin): Promise<void> {
  if (rejected.length) await quarantineRepo(scope).add(rejected.map((r) => quarantineInput(r, origin)));
}
