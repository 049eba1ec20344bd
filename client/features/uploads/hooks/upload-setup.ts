import { uploadOptionsSchema, type UploadOptions, type UploadTimeFormat } from '@shared/contract/uploads.ts';
import type { Delimiter } from './csv-preview.ts';
import { fieldLabel, problemsMessage } from '@shared/contract/words/fields.ts';
import { UPLOAD_MESSAGES } from '../messages.ts';

/** The route whose field labels name the reading options (server/contract/words/fields.ts). */
const UPLOADS_ROUTE = '/loggers/:loggerId/uploads';

export type UploadFormat = 'long' | 'wide';
export type TimeFormat = UploadTimeFormat;

/** What the person chose on the upload page, before it becomes the API's upload options. */
export interface UploadSetup {
  format: UploadFormat;
  delimiter: Delimiter;
  timeColumn: string;
  /** Long format: the column naming the channel, and the one holding the value. */
  channelColumn: string;
  valueColumn: string;
  /** Wide format: file column → channel key, or null to skip the column. */
  columns: Record<string, string | null>;
  timeFormat: TimeFormat;
  /** With the custom layout (`timeFormat: 'pattern'`): its pattern, e.g. dd.MM.yyyy HH:mm. */
  timePattern?: string;
  /** Zone for times without a UTC offset. */
  timeZone: string;
}

const TIME_NAMES = /^(ts|time|timestamp|date|datetime|date_time|datum|zeit|utc)$/i;
const find = (header: string[], re: RegExp) => header.find((h) => re.test(h)) ?? '';

/**
 * A first guess at the setup from a file's header: the time column by its name (else the
 * first column); long format when the file has `channel` and `value` columns; in wide format
 * each column whose name is a channel key (any case) maps to that channel, the rest are skipped.
 */
export function guessUploadSetup(header: string[], delimiter: Delimiter, channelKeys: string[], timeZone: string): UploadSetup {
  const timeColumn = find(header, TIME_NAMES) || header[0] || '';
  const channelColumn = find(header, /^(channel|channel_key|sensor)$/i);
  const valueColumn = find(header, /^(value|reading|val)$/i);
  const byLower = new Map(channelKeys.map((k) => [k.toLowerCase(), k]));
  const columns = Object.fromEntries(header.filter((h) => h !== timeColumn).map((h) => [h, byLower.get(h.toLowerCase()) ?? null]));
  return {
    format: channelColumn && valueColumn ? 'long' : 'wide',
    delimiter,
    timeColumn,
    channelColumn,
    valueColumn,
    columns,
    timeFormat: 'auto',
    timeZone,
  };
}

/**
 * Turns the setup into the API's upload options and checks them with the server's own
 * `uploadOptionsSchema`, so a mapping the server would refuse is caught before a byte is
 * sent. Wide format lists every column of the file except the time column (skipped ones as
 * null), so nothing is left out by accident. Problems come back as "field: reason".
 */
export function toUploadOptions(setup: UploadSetup, header: string[]): { ok: true; options: UploadOptions } | { ok: false; problems: string[] } {
  const common = {
    format: setup.format,
    delimiter: setup.delimiter,
    timeColumn: setup.timeColumn,
    timeFormat: setup.timeFormat,
    timePattern: setup.timeFormat === 'pattern' ? setup.timePattern || undefined : undefined,
    timeZone: setup.timeZone || undefined,
  };
  const candidate =
    setup.format === 'long'
      ? { ...common, channelColumn: setup.channelColumn || undefined, valueColumn: setup.valueColumn || undefined }
      : { ...common, columns: Object.fromEntries(header.filter((h) => h !== setup.timeColumn).map((h) => [h, setup.columns[h] ?? null])) };
  const problems: string[] = [];
  if (setup.format === 'long' && new Set([setup.timeColumn, setup.channelColumn, setup.valueColumn]).size < 3) {
    problems.push(UPLOAD_MESSAGES.threeDifferentColumns);
  }
  const parsed = uploadOptionsSchema.safeParse(candidate);
  // each refusal with its field's label (the server's words), never the option's key
  if (!parsed.success)
    problems.push(
      ...parsed.error.issues.map((i) => problemsMessage([{ label: fieldLabel(i.path.length ? i.path : ['options'], UPLOADS_ROUTE), reason: i.message }])),
    );
  return problems.length ? { ok: false, problems } : { ok: true, options: parsed.data! };
}
