import { z } from 'zod';
import { timeZoneSchema } from '../../contract/me.ts';

/**
 * Input schemas for loggers, channels, ingest keys and quarantine review. Pure zod, shared
 * with the client's forms.
 */

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `must be at most ${max} characters`)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional();

export const channelKeySchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,63}$/, 'use 1–64 letters, digits, "_", "." or "-", starting with a letter or digit');

const intervalSchema = z.number().int('must be a whole number of seconds').min(1, 'must be at least 1 second').max(604800, 'must be at most 7 days');

const channelFields = {
  key: channelKeySchema,
  label: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  unit: z.string().trim().max(32, 'must be at most 32 characters').optional(),
  quantity: z.string().trim().max(64, 'must be at most 64 characters').optional(),
  validMin: z.number().finite().nullable().optional(),
  validMax: z.number().finite().nullable().optional(),
  expectedIntervalS: intervalSchema.nullable().optional(),
  seasonalPeriodHint: z.number().int('must be a whole number').min(2, 'must be at least 2').max(100000, 'must be at most 100000').nullable().optional(),
};

const rangeIsOrdered = (c: { validMin?: number | null; validMax?: number | null }) =>
  c.validMin === undefined || c.validMin === null || c.validMax === undefined || c.validMax === null || c.validMin < c.validMax;
const rangeMessage = { message: 'validMin must be below validMax', path: ['validMax'] };

export const channelInputSchema = z.object(channelFields).refine(rangeIsOrdered, rangeMessage);
export type ChannelInputBody = z.infer<typeof channelInputSchema>;

export const channelPatchSchema = z.object(channelFields).partial().refine(rangeIsOrdered, rangeMessage);

const loggerFields = {
  name: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  serial: optionalText(120),
  site: optionalText(120),
  timezone: timeZoneSchema,
  expectedIntervalS: intervalSchema,
};

export const createLoggerSchema = z
  .object({ ...loggerFields, channels: z.array(channelInputSchema).max(64, 'at most 64 channels per logger').default([]) })
  .refine((l) => new Set(l.channels.map((c) => c.key)).size === l.channels.length, { message: 'channel keys must be unique within a logger', path: ['channels'] });
export type CreateLoggerBody = z.infer<typeof createLoggerSchema>;

export const loggerPatchSchema = z.object(loggerFields).partial();

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

export const quarantineIdsSchema = z.object({
  ids: z.array(z.number().int().positive()).min(1, 'choose at least one row').max(1000, 'at most 1000 rows at a time'),
});

export const quarantineResubmitSchema = z.object({
  rows: z
    .array(z.object({ id: z.number().int().positive(), channel: z.string().max(191), ts: z.union([z.string().max(191), z.number()]), value: z.union([z.number(), z.string().max(191)]) }))
    .min(1, 'send at least one row')
    .max(1000, 'at most 1000 rows at a time'),
});

/** How to read an uploaded export file: long (`channel,ts,value`) or wide (a time column and one column per channel). */
export const uploadOptionsSchema = z
  .object({
    format: z.enum(['long', 'wide'], { error: 'must be long or wide' }),
    delimiter: z.enum([',', ';', '\t'], { error: 'must be a comma, a semicolon or a tab' }).default(','),
    timeColumn: z.string().min(1, 'must name a column').max(191),
    channelColumn: z.string().min(1).max(191).optional(),
    valueColumn: z.string().min(1).max(191).optional(),
    /** Wide format: file column → channel key (null skips the column). */
    columns: z.record(z.string().max(191), channelKeySchema.nullable()).optional(),
    timeFormat: z.enum(['auto', 'iso', 'epoch-ms', 'epoch-s'], { error: 'must be auto, iso, epoch-ms or epoch-s' }).default('auto'),
    /** Zone for local times without an offset (e.g. the logger's own zone). */
    timeZone: timeZoneSchema.optional(),
  })
  .refine((o) => o.format !== 'long' || (o.channelColumn && o.valueColumn), { message: 'long format needs channelColumn and valueColumn', path: ['format'] })
  .refine((o) => o.format !== 'wide' || (o.columns && Object.values(o.columns).some((v) => v)), { message: 'wide format needs at least one column mapped to a channel', path: ['columns'] });
export type UploadOptions = z.infer<typeof uploadOptionsSchema>;

/** One reading sent by hand from a logger's page, stored "now" through the ingestion path. */
export const testReadingSchema = z.object({
  channel: channelKeySchema.describe("the channel's key on this logger"),
  value: z.number({ error: 'must be a number' }).finite('must be a finite number'),
});
export type TestReadingBody = z.infer<typeof testReadingSchema>;
