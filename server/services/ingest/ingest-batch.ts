import { randomBytes } from 'node:crypto';
import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { channelsRepo } from '../../db/channels.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import type { ReadingSource } from '../../db/quarantine.repo.ts';
import type { TimeFormat } from './parse-reading-time.ts';
import type { TimeLayout } from './time-layouts.ts';
import { retryTransaction } from '../../db/retry-transaction.ts';
import type { IngestHooks, StoredBatch } from './ingest-hooks.ts';
import { checkRows, type IncomingReading } from './check-rows.ts';
import { storeNew, storeQuarantined } from './store-new.ts';
import { updateDerived } from './update-derived.ts';

export type { IncomingReading } from './check-rows.ts';

export interface QuarantinedEntry {
  index: number;
  code: string;
  reason: string;
}

export interface IngestOutcome {
  accepted: number;
  duplicates: number;
  quarantined: QuarantinedEntry[];
}

export interface IngestTarget {
  tenantId: number;
  loggerId: number;
}

export interface IngestOptions {
  source: ReadingSource;
  batchRef?: string;
  timeFormat?: TimeFormat;
  /** A layout chosen for the batch's times (uploads); see RowCheckOptions. */
  timeLayout?: TimeLayout;
  timeZone?: string;
  /** Added to every time once read (signed ms; quarantine repairs of a clock that ran off). */
  timeShiftMs?: number;
  now?: () => number;
  /** Plan limits, alerts and the like (see ingest-hooks.ts). */
  hooks?: IngestHooks;
}

/**
 * Stores one batch of a logger's readings, all or nothing, and accounts for every row:
 * `accepted + duplicates + quarantined.length` equals the number of rows given.
 *
 * - A row whose channel, time or value cannot be read goes to quarantine with its reason.
 * - A row already stored with the same value is a duplicate (re-sent batches change nothing).
 * - A row for a time already stored with a different value keeps the stored value; the
 *   newcomer is quarantined (also for two different values at one time in the same batch).
 * - Rollups of the touched buckets are recomputed in the same transaction, and each channel's
 *   latest reading and data version are advanced (see `channelStateRepo(...).advance`).
 *
 * The logger's row is locked for the transaction, so batches of one logger are applied one
 * at a time; batches of different loggers run side by side. The caller answers 2xx only after
 * this resolves, i.e. after COMMIT. A lock conflict retries the whole batch (`retryTransaction`).
 */
export async function ingestBatch(db: Db, target: IngestTarget, rows: IncomingReading[], opts: IngestOptions): Promise<IngestOutcome> {
  // READ COMMITTED: the rollup INSERT … SELECT reads without gap locks, so batches of different
  // loggers never block each other; the logger-row lock already serialises writers of the same
  // channels. A lock conflict (a deadlock, or under Galera a certification failure because another
  // node changed the logger, channel or usage row first) rolls the whole batch back: it is run
  // again with jittered back-off, and what still fails answers 503 (nothing of it was stored).
  const { outcome, stored } = await retryTransaction(() =>
    db.transaction((trx) => ingestBatchInTransaction(trx as unknown as Db, target, rows, opts), { isolationLevel: 'read committed' }),
  );
  if (stored.accepted > 0) opts.hooks?.afterCommit?.(stored);
  return outcome;
}

/**
 * One batch inside the caller's transaction (`ingestBatch` opens one per batch; a quarantine
 * repair runs many batches in one, so they commit or roll back together): lock the logger,
 * check the rows (`checkRows`, no database), write the new readings (`storeNew`), bring
 * rollups, channel state and last-seen up to date (`updateDerived`), let the `beforeCommit`
 * hooks refuse the batch, then write its quarantine rows last (plan limits hold the lab's usage
 * row from their hook until COMMIT, so as little as possible follows). The `afterCommit` hooks
 * are the caller's to run with `stored` once its transaction has committed.
 */
export async function ingestBatchInTransaction(
  trx: Db,
  target: IngestTarget,
  rows: IncomingReading[],
  opts: IngestOptions,
): Promise<{ outcome: IngestOutcome; stored: StoredBatch }> {
  const now = opts.now ?? Date.now;
  const batchRef = opts.batchRef ?? randomBytes(8).toString('hex');
  const scope = inLab(trx, target.tenantId);
  const logger = await loggersRepo(scope).find(target.loggerId, { lock: true });
  if (!logger) throw new Error(`ingestBatch: logger ${target.loggerId} not found in lab ${target.tenantId}`);
  const channels = new Map((await channelsRepo(scope).listForLogger(target.loggerId, { includeRetired: true })).map((c) => [c.key, c]));

  // 1. Read and check each row; keep the first value per (channel, ts) in this batch.
  const checked = await checkRows(rows, channels, {
    now: now(),
    timeFormat: opts.timeFormat,
    timeLayout: opts.timeLayout,
    timeZone: opts.timeZone,
    timeShiftMs: opts.timeShiftMs,
  });
  // 2. Insert what is new, in primary-key order; only if some rows were already stored, find out which and why.
  const sorted = checked.candidates.sorted();
  const { accepted, duplicates, conflicts } = await storeNew(scope, sorted, rows);
  const rejected = checked.rejected.concat(conflicts);
  // 3. Rollups, channel state, last-seen — all in the same transaction.
  await updateDerived(scope, { loggerId: target.loggerId, source: opts.source, sorted, accepted }, now);

  const { columns, runs } = sorted;
  const spans = runs.map((r) => ({ channelId: r.channelId, oldestTs: columns.ts[r.from], newestTs: columns.ts[r.to - 1] }));
  const stored: StoredBatch = { target, source: opts.source, accepted, quarantined: rejected.length, channels: accepted > 0 ? spans : [] };
  // Last before the rows become final: a hook may still refuse the whole batch. Plan limits
  // lock the lab's usage row here until COMMIT, so as little as possible follows (only the
  // quarantine rows, which the hooks must see counted before they are written).
  if (opts.hooks?.beforeCommit) await opts.hooks.beforeCommit(trx, stored);
  await storeQuarantined(scope, rejected, { loggerId: target.loggerId, source: opts.source, batchRef });

  const quarantined = rejected.map(({ row, code, reason }) => ({ index: row.index, code, reason })).sort((a, b) => a.index - b.index);
  return { outcome: { accepted, duplicates: checked.duplicatesInBatch + duplicates, quarantined }, stored };
}
