import type { Readable } from 'node:stream';
import type { Db } from '../../db/create-db.ts';
import { ValidationError } from '../../errors.ts';
import { csvRecordChunks } from './csv-records.ts';
import { MAX_QUARANTINED_PER_BATCH, TooManyQuarantinedError, type RefusedRow } from './readings-from-body.ts';
import type { IngestHooks } from './ingest-hooks.ts';
import { ingestBatch, type IncomingReading, type IngestTarget, type QuarantinedEntry } from './ingest-batch.ts';
import type { TimeFormat } from './parse-reading-time.ts';
import { compilePattern, type TimeLayout } from './time-layouts.ts';
import type { UploadOptions, UploadTimeFormat } from '../../contract/uploads.ts';
import { UPLOAD_LABELS } from '../../contract/words/uploads.ts';
import { fieldRefusal } from '../service-errors.ts';

export interface UploadLayout {
  format: 'long' | 'wide';
  delimiter: string;
  timeColumn: string;
  channelColumn?: string;
  valueColumn?: string;
  columns?: Record<string, string | null>;
  timeFormat: TimeFormat;
  /** A layout chosen for the time column (`resolveUploadLayout`); `timeFormat` is then unused. */
  timeLayout?: TimeLayout;
  timeZone?: string;
}

export interface UploadProgress {
  lines: number;
  readings: number;
  accepted: number;
  duplicates: number;
  quarantined: number;
}

export interface UploadSummary extends UploadProgress {
  /** The first quarantined readings with their reasons (all are in the quarantine table). */
  firstQuarantined: Array<QuarantinedEntry & { line: number }>;
}

/**
 * How an upload's options say its times are read: `auto`, `iso` and the epoch formats as live
 * ingestion reads them; the other layouts, and a custom pattern (compiled here once, so a bad
 * one is refused as `Pattern of the times: …` before anything is read), through `time-layouts.ts`.
 */
export function resolveUploadLayout(options: UploadOptions): UploadLayout {
  const { timeFormat, timePattern, ...rest } = options;
  return { ...rest, ...timeReadingOf(timeFormat, timePattern) };
}

/**
 * An upload time format (and custom pattern) as the batch options that read it: `auto`, `iso`
 * and the epoch formats by ingestion's own rules, any other layout through `time-layouts.ts`.
 * Shared by uploads and quarantine re-reads; a bad pattern answers 400 `Pattern of the times: …`.
 */
export function timeReadingOf(timeFormat: UploadTimeFormat, timePattern: string | undefined): { timeFormat: TimeFormat; timeLayout?: TimeLayout } {
  if (timeFormat === 'auto' || timeFormat === 'iso' || timeFormat === 'epoch-ms' || timeFormat === 'epoch-s') return { timeFormat };
  if (timeFormat !== 'pattern') return { timeFormat: 'auto', timeLayout: timeFormat };
  return { timeFormat: 'auto', timeLayout: patternLayout(timePattern) };
}

/** A custom time pattern as a layout; one it cannot read is refused as `Pattern of the times: reason` (400). */
export function patternLayout(pattern: string | undefined): TimeLayout {
  const compiled = compilePattern(pattern ?? '');
  if ('error' in compiled) throw fieldRefusal('timePattern', UPLOAD_LABELS.timePattern, compiled.error.replace(/^pattern: /, ''));
  return { custom: compiled };
}

/** Readings are stored in batches of this many: each batch is one transaction. */
export const UPLOAD_BATCH = 5000;

/**
 * Imports a logger's export file from a stream, never holding more than one batch in
 * memory: CSV records are turned into readings (long: one per line; wide: one per mapped
 * column per line), stored batch by batch with the same rules as live ingestion (dedupe,
 * quarantine with reasons), and progress is reported after each batch. Each batch commits
 * on its own, so an interrupted upload keeps what was stored and can simply be sent again:
 * the rows already stored count as duplicates. A batch with more than
 * `MAX_QUARANTINED_PER_BATCH` rows missing a field stops the upload (422-style error line;
 * the batches before it stay stored), so a file of garbage cannot fill the quarantine.
 * The CSV is read with `csvRecordChunks` (lines up to 1 MB).
 */
export async function importUpload(
  db: Db,
  target: IngestTarget,
  input: Readable,
  layout: UploadLayout,
  onProgress: (p: UploadProgress) => void,
  opts: { now?: () => number; hooks?: IngestHooks } = {},
): Promise<UploadSummary> {
  const summary: UploadSummary = { lines: 0, readings: 0, accepted: 0, duplicates: 0, quarantined: 0, firstQuarantined: [] };
  const batchRef = `upload-${Date.now().toString(36)}`;
  let header: string[] | null = null;
  let timeAt = -1;
  let channelAt = -1;
  let valueAt = -1;
  let mapped: Array<{ at: number; key: string }> = [];
  let batch: IncomingReading[] = [];
  const lineOf = new Map<number, number>();
  // rows of this batch certain to be quarantined (a field missing); past the cap the upload stops
  let unreadable: RefusedRow[] = [];
  let unreadableCount = 0;
  const refuseIfUnreadable = (index: number, line: number, reason: string) => {
    if (unreadable.length < 10) unreadable.push({ index, reason: `line ${line}: ${reason}` });
    if (++unreadableCount > MAX_QUARANTINED_PER_BATCH) throw new TooManyQuarantinedError(unreadable);
  };

  const flush = async () => {
    if (batch.length === 0) return;
    const outcome = await ingestBatch(db, target, batch, {
      source: 'upload',
      batchRef,
      timeFormat: layout.timeFormat,
      timeLayout: layout.timeLayout,
      timeZone: layout.timeZone,
      now: opts.now,
      hooks: opts.hooks,
    });
    summary.accepted += outcome.accepted;
    summary.duplicates += outcome.duplicates;
    summary.quarantined += outcome.quarantined.length;
    for (const q of outcome.quarantined) {
      if (summary.firstQuarantined.length < 100) summary.firstQuarantined.push({ ...q, line: lineOf.get(q.index) ?? 0 });
    }
    batch = [];
    lineOf.clear();
    unreadable = [];
    unreadableCount = 0;
    onProgress({
      lines: summary.lines,
      readings: summary.readings,
      accepted: summary.accepted,
      duplicates: summary.duplicates,
      quarantined: summary.quarantined,
    });
  };

  // an early stop (a bad header, a refused batch) leaves the request readable, so the answer can still be written
  for await (const records of csvRecordChunks(input.iterator({ destroyOnReturn: false }), layout.delimiter)) {
    for (const record of records) {
      if (!header) {
        header = record;
        const find = (name: string | undefined, what: string) => {
          const i = name === undefined ? -1 : header!.indexOf(name);
          if (i < 0)
            throw fieldRefusal(
              what,
              (UPLOAD_LABELS as Record<string, string>)[what] ?? UPLOAD_LABELS.columns,
              `the file has no column "${name}" (its columns: ${header!.join(', ').slice(0, 200)})`,
            );
          return i;
        };
        timeAt = find(layout.timeColumn, 'timeColumn');
        if (layout.format === 'long') {
          channelAt = find(layout.channelColumn, 'channelColumn');
          valueAt = find(layout.valueColumn, 'valueColumn');
        } else {
          mapped = Object.entries(layout.columns ?? {})
            .filter((e): e is [string, string] => typeof e[1] === 'string')
            .map(([column, key]) => ({ at: find(column, `columns.${column}`), key }));
        }
        continue;
      }
      summary.lines++;
      const line = summary.lines + 1; // 1-based, counting the header line
      const raw = record.join(layout.delimiter);
      const push = (r: Omit<IncomingReading, 'index'>) => {
        const index = summary.readings++;
        lineOf.set(index, line);
        batch.push({ ...r, index, raw });
        const missing =
          r.channel === undefined || r.channel === ''
            ? 'channel: missing'
            : r.ts === undefined || r.ts === ''
              ? 'ts: missing'
              : r.value === undefined || r.value === ''
                ? 'value: missing'
                : null;
        if (missing) refuseIfUnreadable(index, line, missing);
      };
      if (layout.format === 'long') {
        push({ channel: record[channelAt], ts: record[timeAt], value: record[valueAt] });
      } else {
        for (const m of mapped) {
          const cell = record[m.at];
          if (cell === undefined || cell === '') continue; // an empty cell is no reading, not a bad one
          push({ channel: m.key, ts: record[timeAt], value: cell });
        }
      }
      if (batch.length >= UPLOAD_BATCH) await flush();
    }
  }
  if (!header) throw new ValidationError('The file is empty (a header line was expected).');
  await flush();
  return summary;
}
