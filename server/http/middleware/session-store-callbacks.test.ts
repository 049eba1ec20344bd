import { ConnectSessionKnexStore } from 'connect-session-knex';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../db/create-db.ts';
import { settleStoreCallbacks } from './session-store-callbacks.ts';

/**
 * The real session store on a database that does not answer (a closed port), as during a
 * writer failover: every call must answer its callback once, with the error, and leave no
 * unhandled rejection behind.
 */
const unreachable = createDb({ host: '127.0.0.1', port: 1, user: 'nobody', password: 'x', database: 'none', poolMax: 1 });
afterAll(() => unreachable.destroy());

function storeOnUnreachableDb() {
  const store = new ConnectSessionKnexStore({ knex: unreachable, tableName: 'sessions', createTable: false, cleanupInterval: 0 });
  const patchable = store as unknown as { ready: Promise<void> };
  patchable.ready.catch(() => undefined);
  patchable.ready = Promise.resolve();
  return store;
}

const session = { cookie: { maxAge: 60_000, originalMaxAge: 60_000, expires: new Date(Date.UTC(2030, 0, 1)) } } as never;

/** Calls `method` and resolves with every callback call seen within `waitMs`. */
function callbacksOf(invoke: (done: (...args: unknown[]) => void) => void, waitMs = 3000): Promise<unknown[][]> {
  const calls: unknown[][] = [];
  invoke((...args) => calls.push(args));
  return new Promise((resolve) => setTimeout(() => resolve(calls), waitMs));
}

describe('settleStoreCallbacks', () => {
  it('without it, touch on a database that does not answer never calls back (the hang it prevents)', async () => {
    const store = storeOnUnreachableDb();
    const rejections: unknown[] = [];
    const onRejection = (reason: unknown) => rejections.push(reason);
    process.on('unhandledRejection', onRejection);
    try {
      const calls = await callbacksOf((done) => store.touch('sid-1', session, done));
      expect(calls).toEqual([]);
    } finally {
      process.off('unhandledRejection', onRejection);
    }
  });

  it('with it, touch, get and set each call back once with the error, and nothing is left unhandled', async () => {
    const store = storeOnUnreachableDb();
    settleStoreCallbacks(store);
    const rejections: unknown[] = [];
    const onRejection = (reason: unknown) => rejections.push(reason);
    process.on('unhandledRejection', onRejection);
    try {
      const [touched, got, set] = await Promise.all([
        callbacksOf((done) => store.touch('sid-1', session, done)),
        callbacksOf((done) => store.get('sid-1', done)),
        callbacksOf((done) => store.set('sid-1', session, done)),
      ]);
      for (const calls of [touched, got, set]) {
        expect(calls).toHaveLength(1);
        expect(calls[0][0]).toBeInstanceOf(Error);
      }
      expect(rejections).toEqual([]);
    } finally {
      process.off('unhandledRejection', onRejection);
    }
  });
});
