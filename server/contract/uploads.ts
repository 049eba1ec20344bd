import { z } from 'zod';
import type { QuarantinedReading } from './ingest.ts';
import { channelKeySchema } from './loggers.ts';
import { timeZoneSchema } from './me.ts';

/**
 * `POST …/loggers/:loggerId/uploads?options=<json>`: a logger's historical export file as the raw
 * body (text/csv), its reading options, the limits, and the NDJSON lines that stream back.
 */

/** Largest upload accepted (bytes, 2 GiB); the file is streamed, so this bounds time, not memory. */
export const MAX_UPLOAD_BYTES = 2 * 1024 ** 3;

/** Media types an upload's body may be declared with (a file picker may say either of the last two). */
export const UPLOAD_MEDIA_TYPES = ['text/csv', 'text/plain', 'application/octet-stream'];

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
  .refine((o) => o.format !== 'wide' || (o.columns && Object.values(o.columns).some((v) => v)), {
    message: 'wide format needs at least one column mapped to a channel',
    path: ['columns'],
  });
export type UploadOptions = z.infer<typeof uploadOptionsSchema>;

/**
 * The upload's query: `options`, the reading options as JSON text. Parsed here in full, so an
 * invalid option answers 400 with the option's own name (`format: must be long or wide`).
 */
export const uploadQuerySchema = z
  .object({ options: z.string().min(2, 'must be the upload options as JSON').describe('The reading options (uploadOptions) as JSON.') })
  .transform((query, ctx) => {
    let json: unknown;
    try {
      json = JSON.parse(query.options);
    } catch {
      ctx.addIssue({ code: 'custom', message: 'not valid JSON', path: ['options'] });
      return z.NEVER;
    }
    const parsed = uploadOptionsSchema.safeParse(json);
    if (parsed.success) return { options: parsed.data };
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', message: issue.message, path: issue.path });
    return z.NEVER;
  });

/** The uploaded export file, documented as text (its layout is described by `options`). */
export const uploadCsvBody = z.string().describe("A logger's export file: long (channel,ts,value) or wide CSV, as `options` describes it");

/** Counts the import reports after each stored batch. */
export interface ImportProgress {
  lines: number;
  readings: number;
  accepted: number;
  duplicates: number;
  quarantined: number;
}

/** The import's last word: the counts, and the first quarantined readings with their file line. */
export interface ImportSummary extends ImportProgress {
  firstQuarantined: Array<QuarantinedReading & { line: number }>;
}

/**
 * One line of the upload's NDJSON answer: `progress` after each stored batch, then one `summary`,
 * or an `error` when the import stopped (what was stored before it is kept).
 */
export type UploadLine = ({ type: 'progress' } & ImportProgress) | ({ type: 'summary' } & ImportSummary) | { type: 'error'; code: string; message: string };
