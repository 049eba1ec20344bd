import { describe, expect, it } from 'vitest';
import { quarantineCapHook } from './quarantine-cap.ts';
import type { StoredBatch } from './ingest-hooks.ts';
import type { Db } from '../../db/create-db.ts';

const batch = (quarantined: number, replacesQuarantined?: number): StoredBatch => ({
  target: { tenantId: 1, loggerId: 2 },
  source: 'api',
  accepted: 5,
  quarantined,
  replacesQuarantined,
  channels: [],
});
const trx = {} as Db;

describe('quarantineCapHook', () => {
  it('lets a batch through up to the cap and refuses it whole beyond, with 422', async () => {
    const hook = quarantineCapHook(1000);
    await expect(hook.beforeCommit!(trx, batch(1000))).resolves.toBeUndefined();
    await expect(hook.beforeCommit!(trx, batch(1001))).rejects.toMatchObject({
      status: 422,
      code: 'too_many_quarantined',
      message: 'body: more than 1,000 rows of this batch cannot be read (1,001 would go to quarantine), so none was stored. Check what the logger sends.',
    });
  });

  it('counts only what a re-submit adds beyond the rows it replaces', async () => {
    const hook = quarantineCapHook(10);
    await expect(hook.beforeCommit!(trx, batch(50, 45))).resolves.toBeUndefined();
    await expect(hook.beforeCommit!(trx, batch(50, 39))).rejects.toMatchObject({ status: 422 });
  });
});
