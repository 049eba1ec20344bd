import { afterAll, beforeAll } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { testConfig } from './test-app.ts';

/**
 * Two database pools on the test database standing for two app servers (lease and cycle tests),
 * opened and migrated before the file's tests and closed after them. Read `serverA`/`serverB`
 * inside tests, not at import.
 */
export function twoServerPools(): { readonly serverA: Db; readonly serverB: Db } {
  const pools: { serverA?: Db; serverB?: Db } = {};
  beforeAll(async () => {
    pools.serverA = createDb(testConfig().db);
    pools.serverB = createDb(testConfig().db);
    await migrateToLatest(pools.serverA);
  });
  afterAll(async () => {
    await pools.serverA?.destroy();
    await pools.serverB?.destroy();
  });
  return {
    get serverA() {
      return pools.serverA!;
    },
    get serverB() {
      return pools.serverB!;
    },
  };
}
