/**
 * Makes every method of a session store answer its callback exactly once, and never leave a
 * rejected promise unhandled.
 *
 * `connect-session-knex` (5.0.0) reports most failures to express-session's callback AND
 * rethrows them from a promise nobody awaits; on Node that unhandled rejection would end the
 * process the first time the database went away, so the rethrow is dropped. Its `touch` (which
 * `rolling: true` runs before every response ends) calls its callback only on success: when its
 * UPDATE fails — the writer lost in the middle of a database failover — express-session would
 * wait forever and the response would never end (seen on the Galera cluster: browse requests
 * hanging after the writer node was killed). So a rejection reaches the callback once if
 * nothing else did. Changes `store` in place.
 */
export function settleStoreCallbacks(store: object): void {
  const methods = store as Record<string, (...args: unknown[]) => unknown>;
  for (const name of ['get', 'set', 'destroy', 'touch', 'length', 'clear', 'all']) {
    const original = methods[name];
    if (typeof original !== 'function') continue;
    methods[name] = function (this: unknown, ...args: unknown[]) {
      const last = args[args.length - 1];
      let called = false;
      if (typeof last === 'function') {
        args[args.length - 1] = (...results: unknown[]) => {
          called = true;
          return (last as (...r: unknown[]) => unknown)(...results);
        };
      }
      const result = original.apply(this, args);
      if (result instanceof Promise) {
        result.catch((err: unknown) => {
          if (!called && typeof last === 'function') {
            called = true;
            (last as (err: unknown) => unknown)(err);
          }
        });
      }
      return result;
    };
  }
}
