import { z } from 'zod';

/**
 * Pieces every area's contract uses: path ids, the error body every failure answers with.
 * Pure zod (imports nothing else of the server), so the client may import it.
 */

/** A positive whole number taken from a path segment (`/members/:userId`). */
export const pathId = () => z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be a positive number');

/** Path parameters made of one id, e.g. `idParams('userId')` for `/members/:userId`. */
export function idParams<K extends string>(name: K) {
  return z.object({ [name]: pathId() } as { [P in K]: ReturnType<typeof pathId> });
}

/** A time as answers write it: ISO 8601 in UTC (`2026-11-24T13:00:00.000Z`). */
export type IsoTime = string;

/** What every failure answers with; `sample` lists the first unreadable rows of a refused batch. */
export interface ErrorAnswer {
  error: { code: string; message: string; sample?: unknown[] };
}
