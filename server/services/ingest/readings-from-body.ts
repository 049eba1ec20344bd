import { AppError, ValidationError } from '../../errors.ts';
import type { IncomingReading } from './ingest-batch.ts';
import { readRecords } from './csv-records.ts';

/** Most readings one ingest request may carry; more is refused with 413 (send several requests). */
export const MAX_READINGS_PER_REQUEST = 100_000;
/**
 * Most rows of one batch (one ingest request, one upload batch) that may go to quarantine; a
 * batch with more is refused whole with 422 and nothing is stored, so a logger that sends
 * garbage cannot fill the quarantine (and the answer) with a row per line.
 */
export const MAX_QUARANTINED_PER_BATCH = 1_000;
/** Deepest nesting a JSON ingest body may have (`{"readings":[{…}]}` is 3 levels). */
export const MAX_JSON_DEPTH = 32;
/** How many rows of a refused batch the answer shows with their reasons. */
const SAMPLE_SIZE = 10;
/** Work done between two yields to the event loop: characters of CSV, bytes of JSON scanned, JSON bytes parsed. */
const SLICE_CHARS = 64 * 1024;
const SCAN_SLICE_BYTES = 512 * 1024;
/** Largest JSON body parsed in one go (JSON.parse of 1 MB takes a few ms). */
const WHOLE_JSON_BYTES = 1024 * 1024;
const JSON_GROUP_BYTES = 128 * 1024;
/** Largest part of a JSON body outside its "readings" array, parsed in one go. */
const OUTSIDE_BYTES = 64 * 1024;

/** 413: more readings in one request than `MAX_READINGS_PER_REQUEST`. */
export class TooManyReadingsError extends AppError {
  constructor(limit = MAX_READINGS_PER_REQUEST) {
    super(413, 'too_many_readings', `body: at most ${limit.toLocaleString('en')} readings per request; send the rest in further requests.`);
  }
}

/** One refused row of a batch refused whole: its position and why. */
export interface RefusedRow {
  index: number;
  reason: string;
}

/**
 * 422: a batch in which more than `MAX_QUARANTINED_PER_BATCH` rows would go to quarantine;
 * nothing of it is stored. `sample` (the first rows with their reasons) is sent in the answer.
 */
export class TooManyQuarantinedError extends AppError {
  constructor(
    readonly sample: RefusedRow[],
    limit = MAX_QUARANTINED_PER_BATCH,
    /** How many rows would have gone to quarantine, when known. */
    count?: number,
  ) {
    const examples = sample.length
      ? ` (e.g. ${sample
          .slice(0, 3)
          .map((s) => `row ${s.index}: ${s.reason}`)
          .join('; ')})`
      : '';
    const counted = count === undefined ? '' : ` (${count.toLocaleString('en')} would go to quarantine)`;
    super(
      422,
      'too_many_quarantined',
      `body: more than ${limit.toLocaleString('en')} rows of this batch cannot be read${counted}, so none was stored${examples}. Check what the logger sends.`,
      { sample },
    );
  }
}

/** Counts rows and the rows certain to be quarantined as a body is read; throws once a cap is passed. */
class BodyCaps {
  rows = 0;
  private bad = 0;
  private readonly sample: RefusedRow[] = [];
  constructor(
    private readonly maxRows: number,
    private readonly maxBad: number,
  ) {}
  row(): void {
    if (++this.rows > this.maxRows) throw new TooManyReadingsError(this.maxRows);
  }
  badRow(index: number, reason: string): void {
    if (this.sample.length < SAMPLE_SIZE) this.sample.push({ index, reason });
    if (++this.bad > this.maxBad) throw new TooManyQuarantinedError(this.sample, this.maxBad);
  }
}

export interface BodyLimits {
  maxReadings?: number;
  maxQuarantined?: number;
  /** Called between slices of work; the default waits for the event loop's next turn (`setImmediate`). */
  pause?: () => Promise<void>;
  /** JSON bodies up to this many bytes are parsed in one go (default 1 MB; tests lower it). */
  wholeJsonBytes?: number;
}

const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

function capsOf(limits: BodyLimits): BodyCaps {
  return new BodyCaps(limits.maxReadings ?? MAX_READINGS_PER_REQUEST, limits.maxQuarantined ?? MAX_QUARANTINED_PER_BATCH);
}

const isBlank = (v: unknown) => v === undefined || v === null || (typeof v === 'string' && v.trim() === '');

/** Why a row is certain to be quarantined before any lookup (a missing field), or null. */
function missingField(channel: unknown, ts: unknown, value: unknown): string | null {
  if (isBlank(channel)) return 'channel: missing';
  if (isBlank(ts)) return 'ts: missing';
  if (isBlank(value)) return 'value: missing';
  return null;
}

/**
 * True when `value` nests deeper than `max` levels, found with an explicit stack (no recursion).
 * A row goes to quarantine as JSON text, and JSON.stringify recurses: thousands of levels
 * overflow the stack, so such a row is refused before it gets there.
 */
function nestsDeeperThan(value: unknown, max: number): boolean {
  const stack: Array<[unknown, number]> = [[value, 1]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (depth > max) return true;
    for (const child of Object.values(v as object)) if (child !== null && typeof child === 'object') stack.push([child, depth + 1]);
  }
  return false;
}

/** Whether any field of a reading item holds an object (rare: most items are three plain values). */
function holdsObjects(item: object): boolean {
  for (const key in item) {
    const v = (item as Record<string, unknown>)[key];
    if (v !== null && typeof v === 'object') return true;
  }
  return false;
}

/** The reading row of one item of a JSON `readings` array (items of the wrong shape keep only their text). */
function readingOfItem(item: unknown, index: number, caps: BodyCaps): IncomingReading {
  caps.row();
  // the item sits 2 levels down in the body
  if (item !== null && typeof item === 'object' && (Array.isArray(item) || holdsObjects(item)) && nestsDeeperThan(item, MAX_JSON_DEPTH - 2)) {
    throw new ValidationError(`body: nested deeper than ${MAX_JSON_DEPTH} levels`);
  }
  if (!item || typeof item !== 'object' || Array.isArray(item)) {
    caps.badRow(index, 'row: expected an object {"channel", "ts", "value"}');
    return { index, channel: undefined, ts: undefined, value: undefined, raw: JSON.stringify(item) ?? 'undefined' };
  }
  const r = item as Record<string, unknown>;
  const missing = missingField(r.channel, r.ts, r.value);
  if (missing) caps.badRow(index, missing);
  return { index, channel: r.channel, ts: r.ts, value: r.value, raw: r };
}

const SHAPE = 'body: expected {"readings": [{"channel": …, "ts": …, "value": …}, …]}';

/**
 * Turns a parsed JSON ingest body `{"readings":[{"channel","ts","value"}, …]}` into rows. A body of
 * the wrong shape is refused as a whole (400); a single row of the wrong shape becomes a row
 * whose fields are missing, so it is quarantined with a reason and the rest are stored. The
 * caps of `readingsFromJsonBody` apply (413, 422).
 */
export function readingsFromJson(body: unknown, limits: BodyLimits = {}): IncomingReading[] {
  const list = (body as { readings?: unknown } | null)?.readings;
  if (!body || typeof body !== 'object' || !Array.isArray(list)) throw new ValidationError(SHAPE);
  const caps = capsOf(limits);
  return list.map((item, index) => readingOfItem(item, index, caps));
}

/** Where the items of the top-level `readings` array lie in a JSON body, found without parsing it. */
interface ReadingsSpan {
  /** Offset of `[` and of the matching `]`. */
  open: number;
  close: number;
  /** Offsets of the commas between items (depth 2). */
  commas: number[];
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COLON = 0x3a;
const COMMA = 0x2c;
const isSpace = (c: number) => c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09;

/** Where the scan of a JSON body stands between two slices. */
interface ScanState {
  depth: number;
  inString: boolean;
  escaped: boolean;
  stringStart: number;
  lastKey: string | null;
  /** Offset after a depth-1 string, until we know whether a colon follows (then it was a key). */
  pendingKey: number;
  span: ReadingsSpan | null;
  current: ReadingsSpan | null;
}

/** Scans bytes `from`..`to` (kept in a plain function of its own so V8 optimises the loop). */
function scanSlice(buf: Buffer, from: number, to: number, st: ScanState, maxItems: number): void {
  for (let i = from; i < to; i++) {
    const c = buf[i];
    if (st.inString) {
      if (st.escaped) st.escaped = false;
      else if (c === BACKSLASH) st.escaped = true;
      else if (c === QUOTE) {
        st.inString = false;
        if (st.depth === 1) st.pendingKey = i + 1;
      }
      continue;
    }
    if (st.pendingKey >= 0 && !isSpace(c)) {
      st.lastKey = c === COLON ? safeKey(buf, st.stringStart, st.pendingKey) : null;
      st.pendingKey = -1;
      if (c === COLON) continue;
    }
    if (c === QUOTE) {
      st.inString = true;
      st.stringStart = i;
    } else if (c === 0x7b || c === 0x5b) {
      if (++st.depth > MAX_JSON_DEPTH) throw new ValidationError(`body: nested deeper than ${MAX_JSON_DEPTH} levels`);
      if (st.depth === 2 && c === 0x5b && st.lastKey === 'readings') st.current = { open: i, close: -1, commas: [] };
    } else if (c === 0x7d || c === 0x5d) {
      if (st.depth === 2 && st.current && c === 0x5d) {
        st.current.close = i;
        st.span = st.current; // a repeated key: the last one wins, as in JSON.parse
        st.current = null;
      }
      st.depth--;
      if (st.depth === 1) st.lastKey = null;
    } else if (c === COMMA && st.depth === 2 && st.current) {
      st.current.commas.push(i);
      if (st.current.commas.length >= maxItems) throw new TooManyReadingsError(maxItems);
    } else if (c === COMMA && st.depth === 1) st.lastKey = null;
  }
}

/**
 * One pass over the bytes of a JSON body, in slices with a pause between them: refuses nesting
 * deeper than `MAX_JSON_DEPTH` (so no later step recurses deeply), counts the items of the
 * top-level "readings" array (413 before any is parsed) and finds where they lie. Every byte
 * that starts or ends a string or container is ASCII, so UTF-8 needs no decoding here; syntax
 * errors are left to `JSON.parse`.
 */
async function scanJson(buf: Buffer, maxItems: number, pause: () => Promise<void>): Promise<ReadingsSpan | null> {
  const st: ScanState = { depth: 0, inString: false, escaped: false, stringStart: -1, lastKey: null, pendingKey: -1, span: null, current: null };
  for (let from = 0; from < buf.length; from += SCAN_SLICE_BYTES) {
    if (from > 0) await pause();
    scanSlice(buf, from, Math.min(buf.length, from + SCAN_SLICE_BYTES), st, maxItems);
  }
  return st.span;
}

function safeKey(buf: Buffer, start: number, end: number): string | null {
  if (end - start > 64) return null;
  try {
    return JSON.parse(buf.toString('utf8', start, end)) as string;
  } catch {
    return null;
  }
}

function parseJsonText(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    throw new ValidationError('body: not valid JSON');
  }
}

/**
 * Reads a JSON ingest body (UTF-8 bytes) into rows without holding the event loop for long. A
 * body of up to 1 MB is parsed at once. A larger one is scanned first, in slices with a pause
 * between them, to find the items of "readings" (refusing deep nesting with 400 and too many
 * readings with 413 before parsing); then the items are parsed a group of about 128 KB at a
 * time with a pause between groups, and the rest of the body is checked to be valid JSON of the
 * expected shape. A parse of the whole body at once would hold the thread for ~50–200 ms at the
 * 8 MB limit. Items nested deeper than `MAX_JSON_DEPTH` are refused with 400 either way.
 */
export async function readingsFromJsonBody(buf: Buffer, limits: BodyLimits = {}): Promise<IncomingReading[]> {
  // A body of up to 1 MB is parsed in one go (a few ms); items are checked for depth one by one.
  if (buf.length <= (limits.wholeJsonBytes ?? WHOLE_JSON_BYTES)) return readingsFromJson(parseJsonText(buf.toString('utf8')), limits);
  const pause = limits.pause ?? nextTurn;
  const caps = capsOf(limits);
  const span = await scanJson(buf, limits.maxReadings ?? MAX_READINGS_PER_REQUEST, pause);
  if (!span) {
    // no top-level "readings" array: the wrong shape; a small body is parsed for the exact answer
    if (buf.length > OUTSIDE_BYTES) throw new ValidationError(SHAPE);
    return readingsFromJson(parseJsonText(buf.toString('utf8')), limits);
  }
  // Everything outside the array must be valid JSON of the right shape (and small).
  if (buf.length - (span.close - span.open) > OUTSIDE_BYTES)
    throw new ValidationError(`body: only "readings" may be large (the rest of the body is over ${OUTSIDE_BYTES / 1024} KB)`);
  const outside = parseJsonText(`${buf.toString('utf8', 0, span.open)}[]${buf.toString('utf8', span.close + 1)}`);
  if (!outside || typeof outside !== 'object' || Array.isArray(outside)) throw new ValidationError(SHAPE);
  const bounds = [span.open, ...span.commas, span.close];
  if (span.commas.length === 0 && buf.toString('utf8', span.open + 1, span.close).trim() === '') return [];
  const rows: IncomingReading[] = [];
  let first = 0; // index of the item that starts the next group
  while (first < bounds.length - 1) {
    let last = first;
    while (last + 1 < bounds.length - 1 && bounds[last + 1] - bounds[first] < JSON_GROUP_BYTES) last++;
    const items = parseJsonText(`[${buf.toString('utf8', bounds[first] + 1, bounds[last + 1])}]`) as unknown[];
    if (items.length !== last - first + 1) throw new ValidationError('body: not valid JSON');
    for (const item of items) rows.push(readingOfItem(item, rows.length, caps));
    first = last + 1;
    if (first < bounds.length - 1) await pause();
  }
  return rows;
}

const REQUIRED = ['channel', 'ts', 'value'] as const;

/**
 * Reads a CSV ingest body with the header `channel,ts,value` (any order, any case, more columns
 * allowed) into rows, about 64 KB at a time with a pause between slices, so a large or hostile
 * body never holds the event loop for long. A missing header column refuses the body (400); a
 * line with the wrong number of fields becomes a row that is quarantined — up to
 * `MAX_QUARANTINED_PER_BATCH` of them, beyond which the body is refused (422); more than
 * `MAX_READINGS_PER_REQUEST` lines are refused (413) as soon as they are counted.
 */
export async function readingsFromCsvBody(text: string, limits: BodyLimits = {}): Promise<IncomingReading[]> {
  const pause = limits.pause ?? nextTurn;
  const caps = capsOf(limits);
  const rows: IncomingReading[] = [];
  let header: string[] | null = null;
  let at: number[] = [];
  const onRecord = (fields: string[]) => {
    if (!header) {
      header = fields.map((h) => h.toLowerCase());
      at = REQUIRED.map((name) => header!.indexOf(name));
      if (at.some((i) => i < 0)) throw new ValidationError(`header: expected columns channel, ts, value (got ${header.join(', ').slice(0, 120)})`);
      return;
    }
    const index = rows.length;
    caps.row();
    if (fields.length !== header.length) {
      caps.badRow(index, `row: expected ${header.length} fields, got ${fields.length}`);
      rows.push({ index, channel: undefined, ts: undefined, value: undefined, raw: fields.join(',') });
      return;
    }
    const row = { index, channel: fields[at[0]], ts: fields[at[1]], value: fields[at[2]], raw: fields.join(',') };
    const missing = missingField(row.channel, row.ts, row.value);
    if (missing) caps.badRow(index, missing);
    rows.push(row);
  };
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  while (i < text.length) {
    i = readRecords(text, i, SLICE_CHARS, ',', onRecord);
    if (i < text.length) await pause();
  }
  if (!header) throw new ValidationError('body: expected a header line "channel,ts,value"');
  return rows;
}
