import { describe, expect, it } from 'vitest';
import type { Db } from './create-db.ts';
import type { DbOrTrx } from './tenant-scope.ts';
import { createReadReplica, isReaderUnavailable } from './read-replica.ts';

/**
 * The routing rule of read-replica.ts on stand-in connections: a stand-in answers the version
 * check with the rows it is given and records what ran on it. The same rule on two real
 * databases (a stale copy, a closed port) is tested in tests/api/read-replica.api.test.ts.
 */
function standIn(name: string, versions: Array<{ id: number; dataVersion: number }> = []) {
  const log: string[] = [];
  let failWith: Error | null = null;
  /** What the list check (one raw statement) finds: per table its count, newest id and edit sum. */
  let list = [
    { t: 'channels', n: 2, maxId: 9, edits: '1500' },
    { t: 'loggers', n: 1, maxId: 4, edits: '700' },
  ];
  const query = (table: string) => {
    const builder = {
      where: () => builder,
      whereIn: () => builder,
      select: () => {
        log.push(`select ${table}`);
        return Promise.resolve(versions);
      },
    };
    return builder;
  };
  const db = Object.assign(query, {
    label: name,
    transaction: async <T>(work: (trx: DbOrTrx) => Promise<T>): Promise<T> => {
      if (failWith) throw failWith;
      log.push('begin');
      return work(db as unknown as DbOrTrx);
    },
    raw: async (sql: string) => {
      if (failWith) throw failWith;
      if (sql === 'SELECT 1') return [[{ ok: 1 }]];
      log.push('list check');
      return [list];
    },
  });
  return {
    db: db as unknown as Db,
    log,
    fail(err: Error | null) {
      failWith = err;
    },
    /** A channel created (or edited) here and nowhere else yet. */
    addChannel() {
      list = list.map((r) => (r.t === 'channels' ? { ...r, n: r.n + 1, maxId: r.maxId + 1 } : r));
    },
  };
}

const connectionRefused = () => Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:9'), { code: 'ECONNREFUSED' });
/** The read under test: says which stand-in it ran on. */
const whoAnswers = async (db: DbOrTrx) => (db as unknown as { label: string }).label;

describe('createReadReplica', () => {
  it('without a reader every read runs on the writer and nothing checks versions', async () => {
    const writer = standIn('writer');
    const reads = createReadReplica({ writer: writer.db });
    expect(reads.hasReader).toBe(false);
    expect(await reads.channelRead(1, [{ id: 5, dataVersion: 3 }], whoAnswers)).toBe('writer');
    expect(writer.log).toEqual([]);
    expect(await reads.readerAnswers()).toBeNull();
    expect(reads.counts()).toEqual({ reader: 0, writer: 1, stale: 0, unreachable: 0 });
  });

  it('reads on the reader when its data version of every channel is at least the writer’s, in one transaction', async () => {
    const writer = standIn('writer');
    const reader = standIn('reader', [
      { id: 5, dataVersion: 3 },
      { id: 6, dataVersion: 9 },
    ]);
    const reads = createReadReplica({ writer: writer.db, reader: reader.db });
    const channels = [
      { id: 5, dataVersion: 3 },
      { id: 6, dataVersion: 8 },
    ];
    expect(await reads.channelRead(1, channels, whoAnswers)).toBe('reader');
    expect(reader.log).toEqual(['begin', 'select channels']);
    expect(reads.counts().reader).toBe(1);
  });

  it('falls back to the writer when the reader’s version of one channel is older or the channel is missing there', async () => {
    const writer = standIn('writer');
    const reader = standIn('reader', [{ id: 5, dataVersion: 2 }]);
    const reads = createReadReplica({ writer: writer.db, reader: reader.db });
    expect(await reads.channelRead(1, [{ id: 5, dataVersion: 3 }], whoAnswers)).toBe('writer');
    expect(await reads.channelRead(1, [{ id: 7, dataVersion: 0 }], whoAnswers)).toBe('writer');
    expect(reads.counts()).toEqual({ reader: 0, writer: 0, stale: 2, unreachable: 0 });
  });

  it('falls back to the writer when the reader does not answer, rests it, and tries it again after the rest', async () => {
    let clock = 1000;
    const downs: unknown[] = [];
    const writer = standIn('writer');
    const reader = standIn('reader', [{ id: 5, dataVersion: 3 }]);
    const reads = createReadReplica({ writer: writer.db, reader: reader.db, now: () => clock, restMs: 5000, onReaderDown: (e) => downs.push(e) });
    const channels = [{ id: 5, dataVersion: 3 }];
    reader.fail(connectionRefused());
    expect(await reads.channelRead(1, channels, whoAnswers)).toBe('writer');
    expect(downs).toHaveLength(1);
    reader.fail(null);
    clock += 4999; // still resting: the reader is not asked
    expect(await reads.channelRead(1, channels, whoAnswers)).toBe('writer');
    expect(reader.log).toEqual([]);
    clock += 1;
    expect(await reads.channelRead(1, channels, whoAnswers)).toBe('reader');
    expect(reads.counts()).toEqual({ reader: 1, writer: 0, stale: 0, unreachable: 2 });
    expect(downs).toHaveLength(1);
  });

  it('passes on an error of the read itself instead of retrying it on the writer', async () => {
    const writer = standIn('writer');
    const reader = standIn('reader', [{ id: 5, dataVersion: 3 }]);
    const reads = createReadReplica({ writer: writer.db, reader: reader.db });
    const refused = new Error('no such channel');
    await expect(
      reads.channelRead(1, [{ id: 5, dataVersion: 3 }], async () => {
        throw refused;
      }),
    ).rejects.toBe(refused);
    expect(reads.counts()).toEqual({ reader: 0, writer: 0, stale: 0, unreachable: 0 });
  });

  it('lists on the reader when its channels and loggers are the writer’s, and on the writer when the writer has one more', async () => {
    const writer = standIn('writer');
    const reader = standIn('reader');
    const reads = createReadReplica({ writer: writer.db, reader: reader.db });
    expect(await reads.listRead(1, whoAnswers)).toBe('reader');
    expect(writer.log).toEqual(['list check']);
    expect(reader.log).toEqual(['begin', 'list check']);
    writer.addChannel();
    expect(await reads.listRead(1, whoAnswers)).toBe('writer');
    expect(reads.counts()).toEqual({ reader: 1, writer: 0, stale: 1, unreachable: 0 });
  });

  it('reports whether the reader answers', async () => {
    const reader = standIn('reader');
    const reads = createReadReplica({ writer: standIn('writer').db, reader: reader.db });
    expect(await reads.readerAnswers()).toBe(true);
    reader.fail(connectionRefused());
    expect(await reads.readerAnswers()).toBe(false);
  });

  it('says the reader does not answer when it stays silent past the timeout', async () => {
    const silent = Object.assign(standIn('reader').db, { raw: () => new Promise(() => undefined) });
    const reads = createReadReplica({ writer: standIn('writer').db, reader: silent as Db });
    expect(await reads.readerAnswers(20)).toBe(false);
  });
});

describe('isReaderUnavailable', () => {
  it('counts refused and lost connections, pool timeouts and a Galera node not ready as the reader being down', () => {
    expect(isReaderUnavailable(connectionRefused())).toBe(true);
    expect(isReaderUnavailable(Object.assign(new Error('lost'), { code: 'PROTOCOL_CONNECTION_LOST' }))).toBe(true);
    expect(isReaderUnavailable(Object.assign(new Error('timeout'), { name: 'KnexTimeoutError' }))).toBe(true);
    // MariaDB error 1047 on a Galera node that has left the primary component (MariaDB error reference, ER_UNKNOWN_COM_ERROR)
    expect(
      isReaderUnavailable(Object.assign(new Error('WSREP has not yet prepared node for application use'), { errno: 1047, code: 'ER_UNKNOWN_COM_ERROR' })),
    ).toBe(true);
    expect(isReaderUnavailable(Object.assign(new Error('syntax'), { code: 'ER_PARSE_ERROR', errno: 1064 }))).toBe(false);
    expect(isReaderUnavailable(new Error('no such channel'))).toBe(false);
  });
});
