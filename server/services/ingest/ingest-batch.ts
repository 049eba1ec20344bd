import { randomBytes } from 'node:crypto';
import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { channelsRepo } from '../../db/channels.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import { readingsRepo, sliceColumns } from '../../db/readings.repo.ts';
import { BatchCandidates } from './batch-candidates.ts';
import { quarantineRepo, type QuarantineInput, type ReadingSource } from '../../db/quarantine.repo.ts';
import { parseReadingValue } from './parse-reading-value.ts';
import { parseReadingTime, type TimeFormat } from './parse-reading-time.ts';
import { isLockConflict } from '../../db/db-errors.ts';
import { channelStateRepo } from '../../db/channel-state.repo.ts';
import type { IngestHooks, StoredBatch } from './ingest-hooks.ts';

/** One row as it arrived, before anything is checked. `index` is its position in the request. */
export interface IncomingReading {
  index: number;
  channel: unknown;
  ts: unknown;
  value: unknown;
  /**
   * The row as sent, kept in quarantine for review: a CSV line, or the JSON value itself, which
   * is rendered as text only if the row goes to quarantine (most rows never need it).
   */
  raw?: string | object;
}

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
  timeZone?: string;
  now?: () => number;
  /** Plan limits, alerts and the like (see ingest-hooks.ts). */
  hooks?: IngestHooks;
}

/** Readings more than this far in the future are refused (a logger clock that is badly off). */
export const MAX_FUTURE_MS = 24 * 3600 * 1000;
/** Rows checked between two yields to the event loop, so a large batch does not hold other requests up. */
const ROWS_PER_TURN = 10_000;

const text = (v: unknown): string | null => (v === undefined || v === null ? null : typeof v === 'string' ? v : JSON.stringify(v));

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
 * this resolves, i.e. after COMMIT. A deadlock (rare) retries the whole batch.
 */
export async function ingestBatch(db: Db, target: IngestTarget, rows: IncomingReading[], opts: IngestOptions): Promise<IngestOutcome> {
  for (let attempt = 1; ; attempt++) {
    try {
      // READ COMMITTED: the rollup INSERT … SELECT reads without gap locks (binary log is off),
      // so batches of different loggers never block each other; the logger-row lock already
      // serialises writers of the same channels.
      const { outcome, stored } = await db.transaction((trx) => applyBatch(trx as unknown as Db, target, rows, opts), { isolationLevel: 'read committed' });
      if (stored.accepted > 0) opts.hooks?.afterCommit?.(stored);
      return outcome;
    } catch (err) {
      if (attempt < 3 && isLockConflict(err)) continue;
      throw err;
    }
  }
}

async function applyBatch(trx: Db, target: IngestTarget, rows: IncomingReading[], opts: IngestOptions): Promise<{ outcome: IngestOutcome; stored: StoredBatch }> {
  const now = opts.now ?? Date.now;
  const batchRef = opts.batchRef ?? randomBytes(8).toString('hex');
  const scope = inLab(trx, target.tenantId);
  const logger = await loggersRepo(scope).find(target.loggerId, { lock: true });
  if (!logger) throw new Error(`ingestBatch: logger ${target.loggerId} not found in lab ${target.tenantId}`);
  const channels = new Map((await channelsRepo(scope).listForLogger(target.loggerId, { includeRetired: true })).map((c) => [c.key, c]));

  const quarantine: QuarantineInput[] = [];
  const out: QuarantinedEntry[] = [];
  const reject = (row: IncomingReading, code: string, reason: string, parsedTs?: number) => {
    out.push({ index: row.index, code, reason });
    quarantine.push({
      loggerId: target.loggerId,
      source: opts.source,
      batchRef,
      rowIndex: row.index,
      reasonCode: code,
      reason,
      channelKey: text(row.channel),
      // a time that was read is kept as ISO 8601 UTC, so a fixed row re-submits without the
      // upload's time zone or format; the row as sent stays in `raw`
      tsRaw: parsedTs !== undefined ? new Date(parsedTs).toISOString() : text(row.ts),
      valueRaw: text(row.value),
      raw: row.raw === undefined ? null : typeof row.raw === 'string' ? row.raw : (JSON.stringify(row.raw) ?? null),
    });
  };

  // 1. Read and check each row; keep the first value per (channel, ts) in this batch.
  const offered = new BatchCandidates(rows.length);
  let duplicatesInBatch = 0;
  const latestAllowed = now() + MAX_FUTURE_MS;
  const timeOptions = { format: opts.timeFormat, timeZone: opts.timeZone };
  for (let at = 0; at < rows.length; at++) {
    if (at > 0 && at % ROWS_PER_TURN === 0) await new Promise<void>((resolve) => setImmediate(resolve));
    const row = rows[at];
    const key = typeof row.channel === 'string' ? row.channel.trim() : null;
    if (!key) {
      reject(row, 'missing_channel', 'channel: missing');
      continue;
    }
    const channel = channels.get(key);
    if (!channel) {
      reject(row, 'unknown_channel', `channel: no channel "${key.slice(0, 64)}" on this logger`);
      continue;
    }
    if (channel.retiredAt) {
      reject(row, 'retired_channel', `channel: "${key}" is retired`);
      continue;
    }
    const time = parseReadingTime(row.ts, timeOptions);
    if (!time.ok) {
      reject(row, time.code, time.reason);
      continue;
    }
    if (time.ts < 0 || time.ts > latestAllowed) {
      reject(row, 'time_out_of_range', time.ts < 0 ? 'ts: before 1970' : 'ts: more than 24 hours in the future (check the logger clock)', time.ts);
      continue;
    }
    const value = parseReadingValue(row.value);
    if (!value.ok) {
      reject(row, 'bad_value', value.reason, time.ts);
      continue;
    }
    const offer = offered.offer(channel.id, time.ts, value.value, at);
    if (offer === 'duplicate') duplicatesInBatch++;
    else if (offer === 'conflict') reject(row, 'conflict_in_batch', 'ts: this batch has another value for the same channel and time', time.ts);
  }

  // 2. Insert what is new, in primary-key order; only if some rows were already stored, find out which and why.
  const readings = readingsRepo(scope);
  const { columns, rowAt, runs } = offered.sorted();
  let accepted = 0;
  for (let i = 0; i < columns.length; i += 5000) accepted += await readings.insertNew(sliceColumns(columns, i, Math.min(i + 5000, columns.length)));
  let duplicates = duplicatesInBatch;
  if (accepted < columns.length) {
    let conflicts = 0;
    for (const run of runs) {
      const stored = await readings.storedAt(run.channelId, Array.from(columns.ts.subarray(run.from, run.to)));
      for (let i = run.from; i < run.to; i++) {
        const v = stored.get(columns.ts[i]);
        if (v !== undefined && v !== columns.value[i]) {
          conflicts++;
          reject(rows[rowAt[i]], 'conflicts_with_stored', `value: ${columns.value[i]} differs from the value already stored for this time (${v}); the stored value was kept`, columns.ts[i]);
        }
      }
    }
    duplicates += columns.length - accepted - conflicts;
  }

  // 3. Rollups, channel state, quarantine, last-seen — all in the same transaction.
  if (accepted > 0) {
    if (accepted === columns.length) {
      // every candidate is a new row: fold them into their buckets without rescanning readings
      await readings.addToRollups(columns);
    } else {
      // some rows were already stored: recompute the touched buckets from what is stored
      await readings.refreshRollups(runs.map((r) => r.channelId), Array.from(columns.ts));
    }
    // Each channel's run ends with its latest time. A channel whose rows were all duplicates
    // still gets a version bump when another channel of the batch stored something (a spare
    // cache miss, never a stale answer).
    await channelStateRepo(scope).advance(runs.map((r) => ({ channelId: r.channelId, ts: columns.ts[r.to - 1] })));
  }
  const spans = runs.map((r) => ({ channelId: r.channelId, oldestTs: columns.ts[r.from], newestTs: columns.ts[r.to - 1] }));
  const stored: StoredBatch = { target, source: opts.source, accepted, quarantined: quarantine.length, channels: accepted > 0 ? spans : [] };
  if (opts.source === 'api') await loggersRepo(scope).markSeen(target.loggerId, now());
  // Last before the rows become final: a hook may still refuse the whole batch. Plan limits
  // lock the lab's usage row here until COMMIT, so as little as possible follows (only the
  // quarantine rows, which the hooks must see counted before they are written).
  if (opts.hooks?.beforeCommit) await opts.hooks.beforeCommit(trx, stored);
  if (quarantine.length) await quarantineRepo(scope).add(quarantine);

  out.sort((a, b) => a.index - b.index);
  return { outcome: { accepted, duplicates, quarantined: out }, stored };
}
