import { z } from 'zod';
import type { IsoTime } from './common.ts';
import { timeZoneSchema } from './me.ts';
import { UPLOAD_TIME_FORMATS } from './uploads.ts';
import { atMostRows, QUARANTINE_REASONS } from './words/quarantine.ts';
import { UPLOAD_REASONS } from './words/uploads.ts';
import { REASONS } from './words/reasons.ts';

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
const BAD_CURSOR = QUARANTINE_REASONS.badCursor;

/** The cursor's sort key, or null when the text is not one `encodeQuarantineCursor` made. */
export function decodeQuarantineCursor(text: string): QuarantineCursorKey | null {
  const m = CURSOR_TEXT.exec(text);
  if (!m) return null;
  const [receivedAtMs, rowIndex, id] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (!Number.isSafeInteger(id) || receivedAtMs > 8.64e15 || rowIndex > 4294967295) return null;
  return { receivedAt: new Date(receivedAtMs), rowIndex, id };
}

const isoTime = z.iso.datetime({ offset: true, error: REASONS.isoTime });

/**
 * What the quarantine list can be narrowed to (all optional): logger, reason code, the channel
 * name as received, where the rows came from, and when they were received (from inclusive, to
 * exclusive). The list, its CSV export and the bulk repairs share it.
 */
export const quarantineFilterFields = {
  loggerId: z.coerce.number().int().positive(REASONS.positive).optional(),
  reason: z.string().max(48, 'must be at most 48 characters').optional(),
  channel: z.string().trim().min(1, 'must not be empty').max(191, 'must be at most 191 characters').optional(),
  source: z
    .string()
    .regex(/^[a-z-]{1,16}$/, QUARANTINE_REASONS.source)
    .optional(),
  receivedFrom: isoTime.optional(),
  receivedTo: isoTime.optional(),
};

/** The filter fields as one object (the bulk selection's `filter`). */
export const quarantineFilterSchema = z
  .object(quarantineFilterFields)
  .strict()
  .refine((f) => !f.receivedFrom || !f.receivedTo || Date.parse(f.receivedFrom) < Date.parse(f.receivedTo), {
    message: QUARANTINE_REASONS.receivedToAfterFrom,
    path: ['receivedTo'],
  });
export type QuarantineFilterInput = z.infer<typeof quarantineFilterSchema>;

/**
 * `GET …/quarantine` and its CSV export. Keyset pages: the first page without `cursor`, each
 * next one with the previous page's `nextCursor`. Page numbers are refused with a 400 (a deep
 * OFFSET page made the database skip millions of rows).
 */
export const quarantineQuerySchema = z.object({
  ...quarantineFilterFields,
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
  page: z.undefined({ error: QUARANTINE_REASONS.noPageNumbers }).optional().describe('Not supported (400): page with `cursor` instead.'),
  pageSize: z.coerce.number().int().min(1, 'must be 1 or more').max(500, 'must be at most 500').default(100),
});

/** `POST …/quarantine/discard`. */
export const quarantineIdsSchema = z.object({
  ids: z.array(z.number().int().positive()).min(1, QUARANTINE_REASONS.chooseRows).max(1000, atMostRows(1000)),
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
    .min(1, QUARANTINE_REASONS.chooseRows)
    .max(1000, atMostRows(1000)),
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

/** A bulk repair reaches at most this many rows at once (the list counts up to the same number). */
export const BULK_MAX_ROWS = 10_000;

/**
 * Which rows a bulk repair reaches: every row matching a filter of the list (`filter`, `{}` is
 * the whole quarantine) or rows named by id (`ids`) — one or the other.
 */
export const bulkSelectionSchema = z
  .object({
    filter: quarantineFilterSchema.optional(),
    ids: z.array(z.number().int().positive()).min(1, QUARANTINE_REASONS.chooseRows).max(BULK_MAX_ROWS, atMostRows(BULK_MAX_ROWS)).optional(),
  })
  .strict()
  .refine((s) => (s.filter === undefined) !== (s.ids === undefined), { message: QUARANTINE_REASONS.filterOrIds, path: ['filter'] });
export type BulkSelection = z.infer<typeof bulkSelectionSchema>;

/** The bulk repairs, by `kind`. */
export const BULK_ACTION_KINDS = ['reread', 'shift', 'map-channel', 'discard'] as const;
export type BulkActionKind = (typeof BULK_ACTION_KINDS)[number];

/** A signed shift of at most ten years, in minutes (a clock that ran late is shifted back: negative). */
const MAX_SHIFT_MINUTES = 10 * 366 * 24 * 60;

/**
 * What to do with the selected rows:
 * - `reread`: read each row's time text again with `timeFormat` (`pattern`: `timePattern`, LDML
 *   date symbols) in `timeZone` (default: the row's logger's zone), then store it;
 * - `shift`: read each time as ingestion does and move it by `offsetMinutes` (signed), then store it;
 * - `map-channel`: store the rows under `channelId`, a channel of the rows' own logger;
 * - `discard`: delete the rows for good, saying why (`reason`, kept in the audit log).
 */
export const bulkActionSchema = z.discriminatedUnion(
  'kind',
  [
    z
      .object({
        kind: z.literal('reread'),
        timeFormat: z.enum(UPLOAD_TIME_FORMATS, { error: UPLOAD_REASONS.timeFormat }),
        timePattern: z.string().trim().min(1, 'must not be empty').max(64, 'must be at most 64 characters').optional(),
        timeZone: timeZoneSchema.optional(),
      })
      .strict()
      .refine((a) => a.timeFormat !== 'pattern' || a.timePattern, { message: QUARANTINE_REASONS.patternNeeded, path: ['timePattern'] }),
    z
      .object({
        kind: z.literal('shift'),
        offsetMinutes: z
          .number({ error: QUARANTINE_REASONS.shiftWhole })
          .int(QUARANTINE_REASONS.shiftWhole)
          .min(-MAX_SHIFT_MINUTES, QUARANTINE_REASONS.shiftBack)
          .max(MAX_SHIFT_MINUTES, QUARANTINE_REASONS.shiftAhead)
          .refine((m) => m !== 0, QUARANTINE_REASONS.shiftNotZero),
      })
      .strict(),
    z
      .object({
        kind: z.literal('map-channel'),
        channelId: z.number({ error: QUARANTINE_REASONS.channelId }).int(QUARANTINE_REASONS.channelId).positive(QUARANTINE_REASONS.channelId),
      })
      .strict(),
    z
      .object({ kind: z.literal('discard'), reason: z.string().trim().min(3, QUARANTINE_REASONS.discardWhy).max(255, 'must be at most 255 characters') })
      .strict(),
  ],
  { error: QUARANTINE_REASONS.kind },
);
export type BulkAction = z.infer<typeof bulkActionSchema>;

/** `POST …/quarantine/bulk/preview` and `POST …/quarantine/bulk/runs`. */
export const bulkRequestSchema = z.object({ selection: bulkSelectionSchema, action: bulkActionSchema }).strict();
export type BulkRequest = z.infer<typeof bulkRequestSchema>;

/** `GET …/quarantine/bulk/runs/:runId`. */
export const bulkRunParamsSchema = z.object({ runId: z.coerce.number().int(REASONS.whole).positive(REASONS.positive) });

/** Rows that stay in quarantine after a repair, grouped by their new reason code (one reason text as example). */
export interface BulkReasonGroup {
  code: string;
  count: number;
  example: string;
}

/**
 * What a repair does (or did) with its rows. Accounting: `selected = stored + alreadyStored +
 * stillQuarantined + discarded`; every row ends in exactly one of them.
 */
export interface BulkCounts {
  selected: number;
  /** New readings stored. */
  stored: number;
  /** Rows whose reading was already stored with the same value: they leave quarantine, nothing changes. */
  alreadyStored: number;
  /** Rows that stay in quarantine with a new reason (their text as received is kept). */
  stillQuarantined: number;
  discarded: number;
  /** `stillQuarantined`, by new reason. */
  reasons: BulkReasonGroup[];
}

/** One row before → after, for the preview's sample. */
export interface BulkSampleRow {
  id: number;
  before: { channel: string | null; ts: string | null; value: string | null; reasonCode: string };
  after: { outcome: 'stored'; channel: string; ts: IsoTime } | { outcome: 'quarantined'; reasonCode: string; reason: string } | { outcome: 'discarded' };
}

/** `POST …/quarantine/bulk/preview`: what the repair would do; nothing is changed. */
export interface BulkPreview extends BulkCounts {
  /** The first rows of the selection (at most 20), before → after. */
  sample: BulkSampleRow[];
}

export type BulkRunState = 'running' | 'done' | 'failed';

/** `POST …/quarantine/bulk/runs` (202) and `GET …/quarantine/bulk/runs/:runId`: a repair working in the background, or its outcome. */
export interface BulkRun {
  id: number;
  state: BulkRunState;
  action: BulkAction;
  selection: BulkSelection;
  /** Rows worked through so far, of `total`. */
  done: number;
  total: number;
  /** Set once the run is done (everything was applied in one transaction). */
  counts: BulkCounts | null;
  /** Why the run failed (nothing was applied). */
  error: string | null;
  startedBy: string | null;
  startedAt: IsoTime;
  finishedAt: IsoTime | null;
}

/** `GET …/quarantine/bulk/runs`: the lab's recent runs, newest first (the running one, if any, first). */
export interface BulkRunList {
  runs: BulkRun[];
}
