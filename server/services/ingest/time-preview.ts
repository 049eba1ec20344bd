import { wallClockText } from '../../policies/time-zones.ts';
import type { TimePreviewAnswer, TimePreviewInput, UploadTimeFormat } from '../../contract/uploads.ts';
import { parseReadingTime, type TimeParse } from './parse-reading-time.ts';
import { parseWithLayout } from './time-layouts.ts';
import { patternLayout } from './import-upload.ts';
import { guessLayout } from './time-layouts/guess-layout.ts';

/** How one text is read with an upload's time format (`auto`, `iso` and epoch as live ingestion reads them). */
function readerFor(format: UploadTimeFormat, pattern: string | undefined, timeZone: string): (text: string) => TimeParse {
  if (format === 'auto') return (text) => parseReadingTime(text, { format: 'auto', timeZone });
  if (format === 'pattern') {
    const layout = patternLayout(pattern);
    return (text) => parseWithLayout(text, layout, timeZone);
  }
  return (text) => parseWithLayout(text, format, timeZone);
}

/**
 * The upload form's preview of its time column: each sample as received, the instant it will be
 * stored (UTC, and the wall clock of the chosen zone), or why it cannot be read; rows the
 * built-in layouts read differently are flagged. With `auto`, when ingestion's own reading
 * (ISO 8601 or epoch milliseconds) does not read every sample, the guessed layout is used instead
 * and named, so the form can offer it; when nothing reads them, `guess.reason` says which rows fail.
 */
export function previewUploadTimes(input: TimePreviewInput): TimePreviewAnswer {
  const { samples, timeZone } = input;
  const guess = guessLayout(samples, timeZone);
  const ambiguous = new Set(guess.ambiguousRows.map((r) => r.row));
  const readAll = (format: UploadTimeFormat) => {
    const read = readerFor(format, input.timePattern, timeZone);
    return samples.map((text) => (text.trim() === '' ? null : read(text)));
  };
  let layout: UploadTimeFormat | null = input.timeFormat;
  let results = readAll(input.timeFormat);
  if (input.timeFormat === 'auto' && results.some((r) => r && !r.ok)) {
    layout = guess.chosen;
    results = guess.chosen ? readAll(guess.chosen) : results;
  }
  const rows = samples.map((text, i) => {
    const r = results[i];
    return {
      row: i + 1,
      text,
      utc: r?.ok ? new Date(r.ts).toISOString() : null,
      local: r?.ok ? wallClockText(timeZone, r.ts) : null,
      problem: r && !r.ok ? r.reason : null,
      ambiguous: ambiguous.has(i + 1),
    };
  });
  return {
    timeZone,
    layout,
    guess: { chosen: guess.chosen, candidates: guess.candidates, ambiguousRows: [...ambiguous], reason: guess.reason ?? null },
    rows,
    readable: layout !== null && results.every((r) => r === null || r.ok),
  };
}
