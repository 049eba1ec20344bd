import { z } from 'zod';
import type { QuarantinedReading } from './ingest.ts';
import { channelKeySchema } from './loggers.ts';
import { timeZoneSchema } from './me.ts';
import type { IsoTime } from './common.ts';
import { UPLOAD_REASONS } from './words/uploads.ts';

/**
 * `POST …/loggers/:loggerId/uploads?options=<json>`: a logger's historical export file as the raw
 * body (text/csv), its reading options, the limits, and the NDJSON lines that stream back.
 */

/** Largest upload accepted (bytes, 2 GiB); the file is streamed, so this bounds time, not memory. */
export const MAX_UPLOAD_BYTES = 2 * 1024 ** 3;

/** Media types an upload's body may be declared with (a file picker may say either of the last two). */
export const UPLOAD_MEDIA_TYPES = ['text/csv', 'text/plain', 'application/octet-stream'];

/**
 * The built-in layouts an upload's time column may be written in (read by
 * `server/services/ingest/time-layouts.ts`), each with the words the upload form shows.
 */
export const TIME_LAYOUTS = [
  'iso',
  'day-first-dot',
  'day-first-slash',
  'month-first-slash',
  'day-first-slash-12h',
  'month-first-slash-12h',
  'epoch-s',
  'epoch-ms',
  'serial-1900',
] as const;
export type TimeLayoutId = (typeof TIME_LAYOUTS)[number];

export const TIME_LAYOUT_LABELS: Record<TimeLayoutId, string> = {
  iso: 'ISO 8601 (2026-11-24T00:00:00, with or without an offset)',
  'day-first-dot': 'day first, dd.mm.yyyy HH:mm[:ss]',
  'day-first-slash': 'day first, dd/mm/yyyy HH:mm[:ss]',
  'month-first-slash': 'month first, mm/dd/yyyy HH:mm[:ss]',
  'day-first-slash-12h': 'day first, dd/mm/yyyy hh:mm[:ss] AM/PM',
  'month-first-slash-12h': 'month first, mm/dd/yyyy hh:mm[:ss] AM/PM',
  'epoch-s': 'epoch seconds',
  'epoch-ms': 'epoch milliseconds',
  'serial-1900': 'spreadsheet serial day number (1900 system)',
};

/**
 * What an upload's `timeFormat` may say: `auto` (ISO 8601 or epoch milliseconds, as live
 * ingestion reads them), one of the built-in layouts, or `pattern` (then `timePattern` holds a
 * pattern in the Unicode LDML date-symbol subset, e.g. `dd.MM.yyyy HH:mm`).
 */
export const UPLOAD_TIME_FORMATS = ['auto', ...TIME_LAYOUTS, 'pattern'] as const;
export type UploadTimeFormat = (typeof UPLOAD_TIME_FORMATS)[number];

/** Layouts whose times carry no offset: the upload must name the zone they are in. */
const WALL_CLOCK_FORMATS: readonly UploadTimeFormat[] = [
  'day-first-dot',
  'day-first-slash',
  'month-first-slash',
  'day-first-slash-12h',
  'month-first-slash-12h',
  'serial-1900',
  'pattern',
];

/** How to read an uploaded export file: long (`channel,ts,value`) or wide (a time column and one column per channel). */
export const uploadOptionsSchema = z
  .object({
    format: z.enum(['long', 'wide'], { error: UPLOAD_REASONS.format }),
    delimiter: z.enum([',', ';', '\t'], { error: UPLOAD_REASONS.delimiter }).default(','),
    timeColumn: z.string().min(1, UPLOAD_REASONS.timeColumn).max(191),
    channelColumn: z.string().min(1).max(191).optional(),
    valueColumn: z.string().min(1).max(191).optional(),
    /** Wide format: file column → channel key (null skips the column). */
    columns: z.record(z.string().max(191), channelKeySchema.nullable()).optional(),
    timeFormat: z.enum(UPLOAD_TIME_FORMATS, { error: UPLOAD_REASONS.timeFormat }).default('auto'),
    /** With `timeFormat: 'pattern'`: the custom pattern (checked by the server before the upload starts). */
    timePattern: z.string().trim().min(1, 'must not be empty').max(64, 'must be at most 64 characters').optional(),
    /** Zone for local times without an offset (e.g. the logger's own zone). */
    timeZone: timeZoneSchema.optional(),
  })
  .refine((o) => o.format !== 'long' || (o.channelColumn && o.valueColumn), { message: UPLOAD_REASONS.longNeedsColumns, path: ['format'] })
  .refine((o) => o.format !== 'wide' || (o.columns && Object.values(o.columns).some((v) => v)), {
    message: UPLOAD_REASONS.wideNeedsChannel,
    path: ['columns'],
  })
  .refine((o) => o.timeFormat !== 'pattern' || o.timePattern, { message: UPLOAD_REASONS.patternNeeded, path: ['timePattern'] })
  .refine((o) => !WALL_CLOCK_FORMATS.includes(o.timeFormat) || o.timeZone, {
    message: UPLOAD_REASONS.zoneNeeded,
    path: ['timeZone'],
  });
export type UploadOptions = z.infer<typeof uploadOptionsSchema>;

/**
 * The upload's query: `options`, the reading options as JSON text. Parsed here in full, so an
 * invalid option answers 400 with the option's own name (`format: must be long or wide`).
 */
export const uploadQuerySchema = z
  .object({ options: z.string().min(2, UPLOAD_REASONS.optionsJson).describe('The reading options (uploadOptions) as JSON.') })
  .transform((query, ctx) => {
    let json: unknown;
    try {
      json = JSON.parse(query.options);
    } catch {
      ctx.addIssue({ code: 'custom', message: UPLOAD_REASONS.optionsJson, path: ['options'] });
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

/**
 * `POST …/loggers/:loggerId/uploads/time-preview`: how the first rows' time texts will be read,
 * before an upload starts — with the layout asked for, or with `auto` the layout guessed from them.
 */
export const timePreviewSchema = z
  .object({
    samples: z
      .array(z.string({ error: 'must be text' }).max(100, 'must be at most 100 characters'), { error: UPLOAD_REASONS.samplesText })
      .min(1, UPLOAD_REASONS.samplesMin)
      .max(50, 'must be at most 50 texts'),
    timeFormat: z.enum(UPLOAD_TIME_FORMATS, { error: UPLOAD_REASONS.timeFormat }).default('auto'),
    timePattern: z.string().trim().min(1, 'must not be empty').max(64, 'must be at most 64 characters').optional(),
    timeZone: timeZoneSchema,
  })
  .refine((o) => o.timeFormat !== 'pattern' || o.timePattern, { message: UPLOAD_REASONS.patternNeeded, path: ['timePattern'] });
export type TimePreviewInput = z.infer<typeof timePreviewSchema>;

/** One sample row as it will be stored: the text as received, the instant in UTC and on the zone's wall clock, or why it cannot be read. */
export interface TimePreviewRow {
  /** 1-based position among the samples. */
  row: number;
  text: string;
  utc: IsoTime | null;
  /** `YYYY-MM-DD HH:MM:SS` on the wall clock of the preview's zone. */
  local: string | null;
  problem: string | null;
  /** The built-in layouts that read this row disagree (e.g. 03/04/2026: 3 April or 4 March). */
  ambiguous: boolean;
}

/** The answer of the time preview. */
export interface TimePreviewAnswer {
  timeZone: string;
  /** The layout the rows were read with: the one asked for, or with `auto` the one that reads them (null: none does). */
  layout: UploadTimeFormat | null;
  /** What the first rows suggest, whatever was asked for. */
  guess: { chosen: TimeLayoutId | null; candidates: TimeLayoutId[]; ambiguousRows: number[]; reason: string | null };
  rows: TimePreviewRow[];
  /** Every non-blank sample reads with `layout`: an upload with it will not quarantine these rows for their time. */
  readable: boolean;
}
