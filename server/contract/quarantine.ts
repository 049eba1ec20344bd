import { z } from 'zod';
import type { IsoTime } from './common.ts';

/**
 * Quarantined rows: the list query with its keyset cursor, discard and re-submit inputs, and
 * the answers. Shared with the client.
 */

/** Where a reading came in: the ingest API, a file upload, or a re-submit from quarantine. */
export type ReadingSource = 'api' | 'upload' | 'resubmit';

/** Where a quarantine page ends: the sort key of its last row (see quarantine.repo.ts). */
export interface QuarantineCursorKey {
  receivedAt: Date;
  rowIndex: number;
  id: number;
}

/** The `nextCursor` text for a page's last row: `receivedAtMs.rowIndex.id` (treat it as opaque). */
export function encodeQuarantineCursor(c: QuarantineCursorKey): string {
  return `${c.receivedAt.getTime()}.${c.rowIndex}.${c.id}`;
}

const CURSOR_TEXT = /^(\d{1,15})\.(\d{1,10})\.(\d{1,16})$/;
const BAD_CURSOR = 'not a cursor of this list (send nextCursor exactly as the previous page gave it)';

/** The cursor's sort key, or null when the text is not one `encodeQuarantineCursor` made. */
export function decodeQuarantineCursor(text: string): QuarantineCursorKey | null {
  const m = CURSOR_TEXT.exec(text);
  if (!m) return null;
  const [receivedAtMs, rowIndex, id] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (!Number.isSafeInteger(id) || receivedAtMs > 8.64e15 || rowIndex > 4294967295) return null;
  return { receivedAt: new Date(receivedAtMs), rowIndex, id };
}

/**
 * `GET …/quarantine` and its CSV export. Keyset pages: the first page without `cursor`, each
 * next one with the previous page's `nextCursor`. Page numbers are refused with a 400 (a deep
 * OFFSET page made the database skip millions of rows).
 */
export const quarantineQuerySchema = z.object({
  loggerId: z.coerce.number().int().positive('must be a positive number').optional(),
  reason: z.string().max(48, 'must be at most 48 characters').optional(),
  cursor: z
    .string()
    .max(64, BAD_CURSOR)
    .transform((text, ctx) => {
      const key = decodeQuarantineCursor(text);
      if (!key) ctx.addIssue({ code: 'custom', message: BAD_CURSOR });
      return key ?? undefined;
    })
    .optional()
    .describe("The previous page's `nextCursor`; leave out for the newest rows."),
  page: z
    .undefined({ error: 'page numbers are not supported; follow nextCursor from the previous page' })
    .optional()
    .describe('Not supported (400): page with `cursor` instead.'),
  pageSize: z.coerce.number().int().min(1, 'must be 1 or more').max(500, 'must be at most 500').default(100),
});

/** `POST …/quarantine/discard`. */
export const quarantineIdsSchema = z.object({
  ids: z.array(z.number().int().positive()).min(1, 'choose at least one row').max(1000, 'at most 1000 rows at a time'),
});

/** `POST …/quarantine/resubmit`: each row by its id, as it was or as corrected. */
export const quarantineResubmitSchema = z.object({
  rows: z
    .array(
      z.object({
        id: z.number().int().positive(),
        channel: z.string().max(191),
        ts: z.union([z.string().max(191), z.number()]),
        value: z.union([z.number(), z.string().max(191)]),
      }),
    )
    .min(1, 'send at least one row')
    .max(1000, 'at most 1000 rows at a time'),
});
/** A quarantined row sent again, as it was or as corrected. */
export type ResubmitRow = z.infer<typeof quarantineResubmitSchema>['rows'][number];

/** A reading kept in quarantine, with the fields as they arrived (text) and why it was kept. */
export interface QuarantinedRow {
  id: number;
  loggerId: number | null;
  source: ReadingSource;
  rowIndex: number;
  reasonCode: string;
  reason: string;
  channel: string | null;
  ts: string | null;
  value: string | null;
  raw: string | null;
  receivedAt: IsoTime;
}

/** `GET …/quarantine`: one keyset page; `nextCursor` asks for the following one (null on the last page). */
export interface QuarantinePage {
  rows: QuarantinedRow[];
  /** Matching rows, counted up to 10,000. */
  total: number;
  /** True when `total` stopped at the counting limit (there are at least that many). */
  totalAtLeast: boolean;
  pageSize: number;
  nextCursor: string | null;
}

/** `POST …/quarantine/discard`: how many rows were deleted. */
export interface DiscardAnswer {
  discarded: number;
}

/** `POST …/quarantine/resubmit`: `quarantined` names the rows (by their old id) that failed again, and why. */
export interface ResubmitOutcome {
  resubmitted: number;
  accepted: number;
  duplicates: number;
  quarantined: Array<{ id: number; code: string; reason: string }>;
}
