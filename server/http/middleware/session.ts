import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { RequestHandler } from 'express';
import type { Db } from '../../db/create-db.ts';

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
  // Each store method reports a failure to express-session's callback AND rethrows it from
  // the promise nobody awaits; on Node that unhandled rejection would end the process the
  // first time the database went away. Keep the callback, drop the rethrow.
  const methods = store as unknown as Record<string, (...args: unknown[]) => unknown>;
  for (const name of ['get', 'set', 'destroy', 'touch', 'length', 'clear', 'all']) {
    const original = methods[name];
    if (typeof original !== 'function') continue;
    methods[name] = function (this: unknown, ...args: unknown[]) {
      const result = original.apply(this, args);
      if (result instanceof Promise) result.catch(() => undefined);
      return result;
    };
  }
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
