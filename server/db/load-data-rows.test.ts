import { describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { loadDataRows } from './load-data-rows.ts';

/** A Knex stand-in whose one connection answers LOAD DATA with `answer` and records what it was sent. */
function fakeDb(answer: (sql: string, body: string) => { err?: Error & { code?: string }; affectedRows?: number }) {
  const sent: Array<{ sql: string; body: string }> = [];
  let released = 0;
  const conn = {
    query(opts: { sql: string; infileStreamFactory: () => AsyncIterable<Buffer> }, cb: (err: unknown, r: unknown) => void) {
      void (async () => {
        let body = '';
        for await (const chunk of opts.infileStreamFactory()) body += chunk.toString();
        sent.push({ sql: opts.sql, body });
        const a = answer(opts.sql, body);
        cb(a.err ?? null, { affectedRows: a.affectedRows ?? 0 });
      })();
    },
  };
  const client = { connectionSettings: {}, acquireConnection: async () => conn, releaseConnection: async () => void released++ };
  return { db: { client } as unknown as Knex, sent, released: () => released };
}

describe('loadDataRows', () => {
  it('streams the rows as they are and returns how many the server inserted', async () => {
    const f = fakeDb(() => ({ affectedRows: 2 }));
    const n = await loadDataRows(f.db, 'readings', ['tenant_id', 'channel_id', 'ts', 'value'], '1\t2\t3\t4.5\n1\t2\t4\t-0.25\n');
    expect(n).toBe(2);
    expect(f.sent[0].body).toBe('1\t2\t3\t4.5\n1\t2\t4\t-0.25\n');
    expect(f.sent[0].sql).toContain('IGNORE INTO TABLE readings');
    expect(f.sent[0].sql).toContain('(tenant_id, channel_id, ts, value)');
    expect(f.released()).toBe(1);
  });

  it('answers null when local infile is refused, and does not try again on that database', async () => {
    const refused = Object.assign(new Error('The used command is not allowed with this MariaDB version'), { code: 'ER_NOT_ALLOWED_COMMAND' });
    const f = fakeDb(() => ({ err: refused }));
    expect(await loadDataRows(f.db, 'readings', ['ts'], '1\n')).toBeNull();
    expect(await loadDataRows(f.db, 'readings', ['ts'], '2\n')).toBeNull();
    expect(f.sent).toHaveLength(1);
    expect(f.released()).toBe(1);
  });

  it('passes any other error on (the batch transaction then rolls back)', async () => {
    const f = fakeDb(() => ({ err: Object.assign(new Error('Deadlock found'), { code: 'ER_LOCK_DEADLOCK' }) }));
    await expect(loadDataRows(f.db, 'readings', ['ts'], '1\n')).rejects.toThrow('Deadlock found');
    expect(f.released()).toBe(1);
  });
});
