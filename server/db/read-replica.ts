import type { Db } from './create-db.ts';
import { inLab, type DbOrTrx } from './tenant-scope.ts';
import { isDatabaseUnavailable } from './db-errors.ts';

/** A channel and the data version the writer gave for it (the row the request loaded anyway). */
export interface ChannelVersion {
  id: number;
  dataVersion: number;
}

/** Which connection answered a read, and why the reader did not when it did not. */
export type ReadOutcome = 'reader' | 'writer' | 'stale' | 'unreachable';

/** How many reads each outcome had since start (for tests and the health answer). */
export type ReadCounts = Record<ReadOutcome, number>;

/**
 * Where lag-tolerant reads go: the reader (LAGBOOK_DB_READ_*) when it has caught up with what the
 * request already knows from the writer, else the writer. Services take one of these beside
 * their `db` and build the same `inLab` repos on whichever connection it hands them.
 */
export interface ReadReplica {
  /** True when a separate reader is configured. */
  readonly hasReader: boolean;
  /**
   * Runs `read` on the reader, in one read-only snapshot that first checks that the reader's
   * `channels.data_version` of every channel in `channels` is at least the writer's; when one is
   * older (or missing), or the reader cannot be reached, runs it on the writer instead.
   */
  channelRead<T>(labId: number, channels: readonly ChannelVersion[], read: (db: DbOrTrx) => Promise<T>): Promise<T>;
  /**
   * Runs a read of a lab's channel list on the reader when the reader's list of the lab's
   * channels and loggers is the writer's (same count, newest id and edit times, compared in
   * the reader's snapshot), else on the writer: a channel just created, renamed or retired is
   * never missing or old in the list its creator sees next.
   */
  listRead<T>(labId: number, read: (db: DbOrTrx) => Promise<T>): Promise<T>;
  /**
   * Whether the reader answers a trivial query within `timeoutMs` (default 1 s, so a health check
   * never waits on a dead address's connect timeout); null without a reader.
   */
  readerAnswers(timeoutMs?: number): Promise<boolean | null>;
  /** Reads by outcome since start. */
  counts(): ReadCounts;
}

/** After the reader failed to answer, reads skip it for this long before trying it again. */
export const READER_REST_MS = 5000;

/**
 * The reader is down or not serving: connection refused or lost, pool timeout, or a Galera node
 * that is not ready (1047 "WSREP has not yet prepared node for application use").
 */
export function isReaderUnavailable(err: unknown): boolean {
  const e = err as { code?: string; errno?: number } | null;
  return isDatabaseUnavailable(err) || e?.errno === 1047 || e?.code === 'ER_UNKNOWN_COM_ERROR' || e?.code === 'ENOTFOUND' || e?.code === 'EHOSTUNREACH';
}

const STALE = Symbol('stale');

/** The reader's data versions of `ids` in this lab (a channel the reader lacks is absent). */
async function versionsOn(db: DbOrTrx, labId: number, ids: readonly number[]): Promise<Map<number, number>> {
  const rows: Array<{ id: number; dataVersion: number }> = await inLab(db, labId)
    .table('channels')
    .whereIn('channels.id', [...ids])
    .select('channels.id as id', 'channels.data_version as dataVersion');
  return new Map(rows.map((r) => [Number(r.id), Number(r.dataVersion)]));
}

/**
 * What a lab's channel list is made of, in a few numbers: per table (channels, loggers) the row
 * count, the newest id and the sum of edit times (every form that changes a channel or logger
 * sets `updated_at`). Two copies with the same fingerprint list the same channels with the same
 * settings; the state ingestion keeps (last reading) may still lag, which a list tolerates.
 * TIMESTAMPDIFF from a fixed instant, not UNIX_TIMESTAMP: it ignores the session time zone, so
 * two servers with different defaults still agree.
 */
async function listFingerprint(db: DbOrTrx, labId: number): Promise<string> {
  const part = (table: 'channels' | 'loggers') =>
    `SELECT '${table}' AS t, COUNT(*) AS n, COALESCE(MAX(id), 0) AS maxId,
            COALESCE(SUM(TIMESTAMPDIFF(MICROSECOND, '2000-01-01', updated_at)), 0) AS edits
     FROM ${table} WHERE tenant_id = :lab`;
  const [rows] = (await inLab(db, labId).raw(`${part('channels')} UNION ALL ${part('loggers')}`)) as unknown as [
    Array<{ t: string; n: unknown; maxId: unknown; edits: unknown }>,
  ];
  return rows
    .map((r) => `${r.t}:${String(r.n)}:${String(r.maxId)}:${String(r.edits)}`)
    .sort()
    .join('|');
}

/**
 * The read/write split. A read that tolerates a replica's lag runs on the reader only when the
 * reader provably holds at least what the writer told this request: the channel row a request
 * loads from the writer carries `data_version` (ingestion raises it in the batch's transaction),
 * and the read starts with the reader's `data_version` of the same channels inside its own
 * transaction — the reader session is REPEATABLE READ, READ ONLY (createDb's `reader`), so the
 * check and the readings read after it see one snapshot. When the reader's version is older, the
 * read runs on the writer: the answer is never older than the version the caches key it by
 * (a diagnostics cache entry stored under version V always holds readings of V or later).
 *
 * Why fall back rather than `wsrep_sync_wait`: that setting makes a Galera node wait until it has
 * applied everything committed cluster-wide before it answers, so under write load every chart
 * read waits for the slowest node, and a plain asynchronous replica has no such setting at all.
 * Falling back costs one read on the writer only in the moment a reader lags, and works with
 * either kind of replica.
 *
 * A reader that does not answer (refused, lost, pool timeout, Galera node not ready) never
 * breaks browsing: the read runs on the writer, and reads skip the reader for READER_REST_MS
 * so a dead address does not add its timeout to every request. Errors of the read itself
 * (a refusal, a bad query) are passed on as they are.
 */
export function createReadReplica(deps: {
  writer: Db;
  reader?: Db | null;
  /** Told once per rest period when the reader stops answering. */
  onReaderDown?: (err: unknown) => void;
  now?: () => number;
  restMs?: number;
}): ReadReplica {
  const { writer } = deps;
  const reader = deps.reader && deps.reader !== deps.writer ? deps.reader : null;
  const now = deps.now ?? Date.now;
  const restMs = deps.restMs ?? READER_REST_MS;
  const counts: ReadCounts = { reader: 0, writer: 0, stale: 0, unreachable: 0 };
  let restingUntil = 0;

  /** On the writer, counted under `why` ('writer' when there is no reader to prefer). */
  const onWriter = <T>(why: ReadOutcome, read: (db: DbOrTrx) => Promise<T>): Promise<T> => {
    counts[why]++;
    return read(writer);
  };

  /** Tries `attempt` in a reader transaction; STALE or an unreachable reader sends `read` to the writer. */
  async function viaReader<T>(attempt: (trx: DbOrTrx) => Promise<T | typeof STALE>, read: (db: DbOrTrx) => Promise<T>): Promise<T> {
    if (!reader) return onWriter('writer', read);
    if (now() < restingUntil) return onWriter('unreachable', read);
    let outcome: T | typeof STALE;
    try {
      outcome = await reader.transaction((trx) => attempt(trx));
    } catch (err) {
      if (!isReaderUnavailable(err)) throw err;
      restingUntil = now() + restMs;
      deps.onReaderDown?.(err);
      return onWriter('unreachable', read);
    }
    if (outcome === STALE) return onWriter('stale', read);
    counts.reader++;
    return outcome;
  }

  return {
    hasReader: reader !== null,

    channelRead(labId, channels, read) {
      return viaReader(async (trx) => {
        if (channels.length > 0) {
          const seen = await versionsOn(trx, labId, [...new Set(channels.map((c) => c.id))]);
          if (channels.some((c) => (seen.get(c.id) ?? -1) < c.dataVersion)) return STALE;
        }
        return read(trx);
      }, read);
    },

    async listRead(labId, read) {
      if (!reader || now() < restingUntil) return viaReader(read, read);
      // the writer's first: a reader snapshot taken after it must hold at least the same list
      const writers = await listFingerprint(writer, labId);
      return viaReader(async (trx) => ((await listFingerprint(trx, labId)) === writers ? read(trx) : STALE), read);
    },

    async readerAnswers(timeoutMs = 1000) {
      if (!reader) return null;
      let timer: NodeJS.Timeout | undefined;
      const late = new Promise<boolean>((resolve) => {
        timer = setTimeout(() => resolve(false), timeoutMs);
      });
      const answer = reader.raw('SELECT 1').then(
        () => true,
        () => false,
      );
      try {
        return await Promise.race([answer, late]);
      } finally {
        clearTimeout(timer);
      }
    },

    counts: () => ({ ...counts }),
  };
}
