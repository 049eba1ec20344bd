import { Readable } from 'node:stream';
import type { Response } from 'express';
import { ZipFile } from 'yazl';
import { csvLine } from '../csv-field.ts';
import type { LabExportPlan } from '../../services/lab-export/lab-export.service.ts';

/** Pages of one channel's readings, oldest first (LabExportService.readingPages). */
export type ReadingPages = (channelId: number) => AsyncIterable<{ ts: Float64Array; values: Float64Array }>;

/** The note at the top of every full export: what the files are. */
const ABOUT = [
  'Lagbook full lab export',
  '',
  'lab.json        the lab, its members and roles, loggers, channels with their settings, alert rules (and notes, when present)',
  'readings/       one CSV per channel: readings/logger-<logger id>/<channel key>.csv',
  '                columns time_utc (ISO 8601, UTC), epoch_ms (milliseconds since 1970-01-01 UTC), value',
  '',
  'lab.json lists each channel with its "readingsFile".',
  '',
].join('\r\n');

/** A channel's readings as CSV text chunks (header first, then one chunk per page), through the one CSV writer. */
async function* readingsCsv(pages: AsyncIterable<{ ts: Float64Array; values: Float64Array }>): AsyncGenerator<string> {
  yield csvLine(['time_utc', 'epoch_ms', 'value']);
  for await (const page of pages) {
    let chunk = '';
    for (let i = 0; i < page.ts.length; i++) chunk += csvLine([new Date(page.ts[i]).toISOString(), page.ts[i], page.values[i]]);
    yield chunk;
  }
}

/**
 * Writes a full lab export to `res` as one zip, streamed: `ABOUT.txt`, `lab.json` (the
 * settings), then each channel's readings CSV, opened only when its turn comes — one channel's
 * reading cursor at a time, a page (10,000 readings) in memory at most, and the socket's
 * back-pressure slowing the database reads. Resolves when the response has closed (finished,
 * or the client left — then the open reading stream is stopped); a database error midway
 * aborts the download (the client sees a broken archive, never a truncated one passed as whole).
 */
export async function writeLabExportZip(res: Response, plan: LabExportPlan, pages: ReadingPages, fileName: string): Promise<void> {
  const zip = new ZipFile();
  let current: Readable | null = null;
  const closed = new Promise<void>((resolve) => res.once('close', resolve));
  const abort = (err: unknown) => res.destroy(err instanceof Error ? err : new Error(String(err)));
  zip.on('error', abort);
  zip.outputStream.on('error', abort);
  res.set('Content-Type', 'application/zip');
  res.set('Content-Disposition', `attachment; filename="${fileName.replace(/[^A-Za-z0-9_.-]+/g, '-')}.zip"`);
  zip.outputStream.pipe(res);
  zip.addBuffer(Buffer.from(ABOUT, 'utf8'), 'ABOUT.txt');
  zip.addBuffer(Buffer.from(`${JSON.stringify(plan.settings, null, 2)}\n`, 'utf8'), 'lab.json');
  for (const { channel, file } of plan.channels) {
    zip.addReadStreamLazy(file, null, (cb) => {
      current = Readable.from(readingsCsv(pages(channel.id)));
      current.once('error', abort);
      cb(null, current);
    });
  }
  zip.end();
  await closed;
  if (!res.writableFinished) (current as Readable | null)?.destroy();
}
