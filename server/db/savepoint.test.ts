import { describe, expect, it } from 'vitest';
import type { DbOrTrx } from './tenant-scope.ts';
import { rollbackToSavepoint, setSavepoint } from './savepoint.ts';

/** A stand-in transaction that records the statements it is given. */
function recordingTrx() {
  const sent: string[] = [];
  const trx = { raw: async (sql: string) => void sent.push(sql) } as unknown as DbOrTrx;
  return { trx, sent };
}

describe('savepoint', () => {
  it('sends SAVEPOINT and ROLLBACK TO SAVEPOINT with the name given', async () => {
    const { trx, sent } = recordingTrx();
    await setSavepoint(trx, 'lagbook_store_new');
    await rollbackToSavepoint(trx, 'lagbook_store_new');
    expect(sent).toEqual(['SAVEPOINT lagbook_store_new', 'ROLLBACK TO SAVEPOINT lagbook_store_new']);
  });

  it.each(['', 'Store', '1st', 'a-b', 'a;DROP TABLE readings', 'a'.repeat(65)])('refuses the name %j and sends nothing', async (name) => {
    const { trx, sent } = recordingTrx();
    await expect(setSavepoint(trx, name)).rejects.toThrow(/savepoint: name must be lower-case letters, digits and _/);
    await expect(rollbackToSavepoint(trx, name)).rejects.toThrow(/savepoint: name must be/);
    expect(sent).toEqual([]);
  });
});
