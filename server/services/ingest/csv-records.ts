import { StringDecoder } from 'node:string_decoder';
import { ValidationError } from '../../errors.ts';

/** Receives the fields of one record (already trimmed). */
export type OnRecord = (fields: string[]) => void;

/**
 * A small RFC 4180 reader for logger CSV: records end at LF, CRLF or CR; fields are split at
 * `delimiter` and trimmed; a quoted field may hold delimiters, line breaks and doubled quotes;
 * a quote anywhere else is an error (as in RFC 4180 §2.5–2.7). Empty lines are skipped. It reads
 * from `at` up to roughly `budget` characters and stops at a record boundary, so the caller can
 * pause between slices. (A general CSV library builds an Error object for every line of the
 * wrong length, 50–280 µs a line here: far too slow for a hostile body of a million short lines.)
 */
export function readRecords(text: string, at: number, budget: number, delimiter: string, onRecord: OnRecord): number {
  const stop = Math.min(text.length, at + budget);
  // next quote and next CR, looked up again only once passed (no rescans of a text without any)
  let quote = -2;
  let cr = -2;
  let i = at;
  while (i < text.length && (i < stop || i === at)) {
    const lf = text.indexOf('\n', i);
    const lineEnd = lf < 0 ? text.length : lf;
    if (quote !== -1 && quote < i) quote = text.indexOf('"', i);
    if (cr !== -1 && cr < i) cr = text.indexOf('\r', i);
    if ((quote < 0 || quote > lineEnd) && (cr < 0 || cr >= lineEnd - 1)) {
      // fast path: no quote, and no CR except one just before the LF
      const line = text.slice(i, cr >= 0 && cr === lineEnd - 1 ? cr : lineEnd);
      i = lineEnd + 1;
      const fields = line.split(delimiter).map((f) => f.trim());
      if (fields.length > 1 || fields[0] !== '') onRecord(fields);
      continue;
    }
    i = readSlowRecord(text, i, delimiter, onRecord);
  }
  return Math.min(i, text.length);
}

/** Reads one record that holds a quote or a lone CR, character by character; returns where the next record starts. */
function readSlowRecord(text: string, start: number, delimiter: string, onRecord: OnRecord): number {
  const fields: string[] = [];
  const blank = (c: string | undefined) => c === ' ' || (c === '\t' && delimiter !== '\t');
  const ends = (c: string | undefined) => c === undefined || c === delimiter || c === '\n' || c === '\r';
  let i = start;
  for (;;) {
    while (blank(text[i])) i++;
    let value = '';
    if (text[i] === '"') {
      i++;
      for (;;) {
        const q = text.indexOf('"', i);
        if (q < 0) throw new ValidationError('body: not valid CSV (a quoted field is never closed)');
        value += text.slice(i, q);
        if (text[q + 1] === '"') {
          value += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      while (blank(text[i])) i++;
      if (!ends(text[i])) throw new ValidationError('body: not valid CSV (text after a closing quote; a quote inside a field is written "")');
    } else {
      let j = i;
      while (!ends(text[j])) {
        if (text[j] === '"') throw new ValidationError('body: not valid CSV (a quote inside a field that does not start with one)');
        j++;
      }
      value = text.slice(i, j).trim();
      i = j;
    }
    fields.push(value);
    if (text[i] === delimiter) {
      i++;
      continue;
    }
    if (text[i] === '\r' && text[i + 1] === '\n') i += 2;
    else if (i < text.length) i++;
    if (!(fields.length === 1 && fields[0] === '')) onRecord(fields);
    return i;
  }
}

/**
 * Where the complete records of `text` end: just after the last line break that lies outside
 * quotes (quotes come in pairs in valid CSV, so parity tells), or 0 when there is none yet.
 */
export function completeRecordsEnd(text: string): number {
  let end = 0;
  let pos = 0;
  let inQuote = false;
  for (;;) {
    const q = text.indexOf('"', pos);
    const segmentEnd = q < 0 ? text.length : q;
    if (!inQuote) {
      const br = Math.max(text.lastIndexOf('\n', segmentEnd - 1), text.lastIndexOf('\r', segmentEnd - 1));
      if (br >= pos) end = br + 1;
    }
    if (q < 0) return end;
    inQuote = !inQuote;
    pos = q + 1;
  }
}

/**
 * The records of a CSV stream, one array per chunk read: the bytes are decoded as UTF-8 (a
 * character split between chunks is kept whole), a leading BOM is dropped, and a record cut by a
 * chunk boundary waits for the next chunk. A record longer than `maxRecordChars` is refused,
 * so a file without line breaks cannot grow memory without bound.
 */
export async function* csvRecordChunks(input: AsyncIterable<Buffer | string>, delimiter: string, maxRecordChars = 1 << 20): AsyncGenerator<string[][]> {
  const decoder = new StringDecoder('utf8');
  let carry = '';
  let first = true;
  const read = (text: string) => {
    const records: string[][] = [];
    readRecords(text, 0, Infinity, delimiter, (fields) => records.push(fields));
    return records;
  };
  for await (const chunk of input) {
    let text = carry + (typeof chunk === 'string' ? chunk : decoder.write(chunk));
    if (first && text.length > 0) {
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      first = false;
    }
    const end = completeRecordsEnd(text);
    carry = text.slice(end);
    if (carry.length > maxRecordChars)
      throw new ValidationError(`The file has a line longer than ${maxRecordChars.toLocaleString('en')} characters (is the column separator right?).`);
    if (end > 0) yield read(text.slice(0, end));
  }
  const rest = carry + decoder.end();
  if (rest.trim() !== '') yield read(first && rest.charCodeAt(0) === 0xfeff ? rest.slice(1) : rest);
}
