import { z } from 'zod';
import type { FieldProblem } from './words/fields.ts';
// plain-word reasons for every check without its own message (zod's global error text)
import './words/reasons.ts';

/**
 * Pieces every area's contract uses: path ids, the error body every failure answers with.
 * Pure zod (imports nothing else of the server), so the client may import it.
 */

/** A positive whole number taken from a path segment (`/members/:userId`). */
export const pathId = () => z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be above 0');

/** Path parameters made of one id, e.g. `idParams('userId')` for `/members/:userId`. */
export function idParams<K extends string>(name: K) {
  return z.object({ [name]: pathId() } as { [P in K]: ReturnType<typeof pathId> });
}

/** A time as answers write it: ISO 8601 in UTC (`2026-11-24T13:00:00.000Z`). */
export type IsoTime = string;

/**
 * What every failure answers with: `message` for people; `fields` (invalid input) names each
 * refused field by key with its label and reason; `sample` lists the first unreadable rows of a
 * refused batch.
 */
export interface ErrorAnswer {
  error: { code: string; message: string; fields?: FieldProblem[]; sample?: unknown[] };
}
