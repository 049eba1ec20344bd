import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { RequestHandler } from 'express';
import type { Db } from '../../db/create-db.ts';
import { settleStoreCallbacks } from './session-store-callbacks.ts';

export const SESSION_COOKIE = 'lagbook.sid';

/**
 * Sessions live in MariaDB (table `sessions`) so any app server can serve any request.
 * The cookie has its own name (cookies are not port-scoped), is httpOnly and SameSite=Lax
 * (Lax lets the identity provider's redirect back carry it), Secure behind TLS.
 */
export function sessionMiddleware(opts: { db: Db; secret: string; secure: boolean }): RequestHandler {
  const store = new ConnectSessionKnexStore({
    knex: opts.db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: 15 * 60 * 1000,
  });
  // The store checks for its table once, at construction, and every later call awaits that
  // check: were the database down at that moment, sessions would fail until a restart. The
  // table comes from our migrations, so the check is dropped and later calls go straight to
  // the database (and recover as soon as it answers).
  const patchable = store as unknown as { ready: Promise<void> };
  patchable.ready.catch(() => undefined);
  patchable.ready = Promise.resolve();
  settleStoreCallbacks(store);
  return session({
    name: SESSION_COOKIE,
    secret: opts.secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: opts.secure,
    cookie: { httpOnly: true, sameSite: 'lax', secure: opts.secure, maxAge: 7 * 24 * 3600 * 1000 },
  });
}
