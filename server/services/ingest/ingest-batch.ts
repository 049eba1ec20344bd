import { randomBytes } from 'node:crypto';
import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { channelsIn } from '../../db/channels.repo.ts';
import { loggersIn } from '../../db/loggers.repo.ts';
import { readingsIn, type ReadingRow } from '../../db/readings.repo.ts';
import { quarantineIn, type QuarantineInput } from '../../db/quarantine.repo.ts';
import { parseReadingTime, type TimeFormat } from './parse-reading-time.ts';
import { isLockConflict } from '../../db/db-errors.ts';
import { channelStateIn } from '../../db/channel-state.repo.ts';
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
  source: 'api' | 'upload' | 'resubmit';
  batchRef?: string;
  timeFormat?: TimeFormat;
  timeZone?: string;
  now?: () => number;
  /** Plan limits, alerts and the like (see ingest-hooks.ts). */
  hooks?: IngestHooks;
}

/** Readings more than this far in the future are refused (a logger clock that is badly off). */
export const MAX_FUTURE_MS = 24 * 3600 * 1000;
const STRICT_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function readValue(raw: unknown): number | null {
  if (typeof raw === 'number') return Number.isFinite(raw) ? raw : null;
  if (typeof raw === 'string' && STRICT_NUMBER.test(raw.trim())) {
    const n = Number(raw.trim());
    return Number.isFinite(n) ? n : null;
  }
  return null;
}

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
 *   latest reading and data version are advanced (see `channelStateIn(...).advance`).
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
  const logger = await loggersIn(scope).find(target.loggerId, { lock: true });
  if (!logger) throw new Error(`ingestBatch: logger ${target.loggerId} not found in lab ${target.tenantId}`);
  const channels = new Map((await channelsIn(scope).listForLogger(target.loggerId, { includeRetired: true })).map((c) => [c.key, c]));

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
  const candidates: Array<ReadingRow & { row: IncomingReading }> = [];
  // Loggers send each channel's readings in time order: while a channel's times only rise, no
  // row can repeat an earlier one, so only its newest time is kept. The first time a channel's
  // times go back, its (time → value) map is built from the rows so far and used from then on.
  const newestOf = new Map<number, number>();
  const seenOf = new Map<number, Map<number, number>>();
  const seenFor = (channelId: number) => {
    let seen = seenOf.get(channelId);
    if (!seen) {
      seen = new Map();
      for (const c of candidates) if (c.channelId === channelId) seen.set(c.ts, c.value);
      seenOf.set(channelId, seen);
    }
    return seen;
  };
  let duplicatesInBatch = 0;
  const latestAllowed = now() + MAX_FUTURE_MS;
  const timeOptions = { format: opts.timeFormat, timeZone: opts.timeZone };
  for (const row of rows) {
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
      reject(row, 'bad_time', time.reason);
      continue;
    }
    if (time.ts < 0 || time.ts > latestAllowed) {
      reject(row, 'time_out_of_range', time.ts < 0 ? 'ts: before 1970' : 'ts: more than 24 hours in the future (check the logger clock)', time.ts);
      continue;
    }
    const value = readValue(row.value);
    if (value === null) {
      reject(row, 'bad_value', 'value: must be a finite number', time.ts);
      continue;
    }
    const newest = newestOf.get(channel.id);
    if (newest === undefined || time.ts > newest) {
      newestOf.set(channel.id, time.ts);
      seenOf.get(channel.id)?.set(time.ts, value);
    } else {
      const seen = seenFor(channel.id);
      const first = seen.get(time.ts);
      if (first !== undefined) {
        if (Object.is(first, value) || first === value) duplicatesInBatch++;
        else reject(row, 'conflict_in_batch', 'ts: this batch has another value for the same channel and time', time.ts);
        continue;
      }
      seen.set(time.ts, value);
    }
    candidates.push({ channelId: channel.id, ts: time.ts, value, row });
  }

  // 2. Insert what is new; only if some rows were already stored, find out which and why.
  const readings = readingsIn(scope, trx);
  // Primary-key order: each channel's rows go into one place of the index, not four.
  candidates.sort((a, b) => a.channelId - b.channelId || a.ts - b.ts);
  let accepted = 0;
  for (let i = 0; i < candidates.length; i += 5000) accepted += await readings.insertNew(candidates.slice(i, i + 5000));
  let duplicates = duplicatesInBatch;
  if (accepted < candidates.length) {
    const byChannel = new Map<number, typeof candidates>();
    for (const c of candidates) (byChannel.get(c.channelId) ?? byChannel.set(c.channelId, []).get(c.channelId)!).push(c);
    let conflicts = 0;
    for (const [channelId, list] of byChannel) {
      const stored = await readings.storedAt(channelId, list.map((c) => c.ts));
      for (const c of list) {
        const v = stored.get(c.ts);
        if (v !== undefined && v !== c.value) {
          conflicts++;
          reject(c.row, 'conflicts_with_stored', `value: ${c.value} differs from the value already stored for this time (${v}); the stored value was kept`, c.ts);
        }
      }
    }
    duplicates += candidates.length - accepted - conflicts;
  }

  // 3. Rollups, channel state, quarantine, last-seen — all in the same transaction.
  if (accepted > 0) {
    if (accepted === candidates.length) {
      // every candidate is a new row: fold them into their buckets without rescanning readings
      await readings.addToRollups(candidates);
    } else {
      // some rows were already stored: recompute the touched buckets from what is stored
      await readings.refreshRollups([...new Set(candidates.map((c) => c.channelId))], candidates.map((c) => c.ts));
    }
    // Candidates are sorted by channel then time: the last of each channel is its latest.
    // A channel whose rows were all duplicates still gets a version bump when another channel
    // of the batch stored something (a spare cache miss, never a stale answer).
    const latest = candidates.filter((c, i) => i + 1 === candidates.length || candidates[i + 1].channelId !== c.channelId);
    await channelStateIn(scope, trx).advance(latest.map((c) => ({ channelId: c.channelId, ts: c.ts })));
  }
  const stored: StoredBatch = { target, source: opts.source, accepted, channels: accepted > 0 ? channelSpans(candidates) : [] };
  // Last before the rows become final: a hook may still refuse the whole batch.
  if (opts.hooks?.beforeCommit) await opts.hooks.beforeCommit(trx, stored);
  if (quarantine.length) await quarantineIn(scope).add(quarantine);
  if (opts.source === 'api') await loggersIn(scope).markSeen(target.loggerId, now());

  out.sort((a, b) => a.index - b.index);
  return { outcome: { accepted, duplicates, quarantined: out }, stored };
}

/** Oldest and newest time per channel of candidates sorted by channel, then time. */
function channelSpans(sorted: ReadonlyArray<{ channelId: number; ts: number }>): StoredBatch['channels'] {
  const spans: StoredBatch['channels'] = [];
  for (const c of sorted) {
    const last = spans[spans.length - 1];
    if (last && last.channelId === c.channelId) last.newestTs = c.ts;
    else spans.push({ channelId: c.channelId, oldestTs: c.ts, newestTs: c.ts });
  }
  return spans;
}
