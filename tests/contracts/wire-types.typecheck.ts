/**
 * Compile-time contract between the server's JSON answers and the client's hand-written API
 * types: `npm run typecheck` (and `npm test`, which runs it) fails when a presenter stops
 * producing a field the client reads, or produces it with another type. The client keeps its
 * own types so its type-check does not pull in the server's (database, engine) typings; this
 * file, checked with the server's configuration, holds the two together. Nothing imports it.
 */

/** What `JSON.stringify` makes of T: dates become strings, typed arrays plain arrays. */
type Json<T> = T extends Date
  ? string
  : T extends Float64Array | Int32Array
    ? number[]
    : T extends readonly unknown[]
      ? { [K in keyof T]: Json<T[K]> }
      : T extends object
        ? { [K in keyof T]: Json<T[K]> }
        : T;

/** Compiles only when the server's answer A can be read as the client's type B. */
type Reads<A extends B, B> = [A, B];
type Answer<F extends (...args: never[]) => unknown> = Json<ReturnType<F>>;

export type Contracts = [
];
