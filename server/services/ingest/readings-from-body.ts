import { parse } from 'csv-parse/sync';
import { ValidationError } from '../../errors.ts';
import type { IncomingReading } from './ingest-batch.ts';

/**
 * Turns a JSON ingest body `{"readings":[{"channel","ts","value"}, …]}` into rows. A body of
 * the wrong shape is refused as a whole (400); a single row of the wrong shape becomes a row
 * whose fields are missing, so it is quarantined with a reason and the rest are stored.
 */
export function readingsFromJson(body: unknown): IncomingReading[] {
  const list = (body as { readings?: unknown } | null)?.readings;
  if (!body || typeof body !== 'object' || !Array.isArray(list)) {
    throw new ValidationError('body: expected {"readings": [{"channel": …, "ts": …, "value": …}, …]}');
  }
  return list.map((item, index) => {
    if (!item || typeof item !== 'object' || Array.isArray(item)) {
      return { index, channel: undefined, ts: undefined, value: undefined, raw: JSON.stringify(item) ?? 'undefined' };
    }
    const r = item as Record<string, unknown>;
    return { index, channel: r.channel, ts: r.ts, value: r.value, raw: r };
  });
}

const REQUIRED = ['channel', 'ts', 'value'] as const;

/**
 * Turns a CSV ingest body with the header `channel,ts,value` (any order, any case) into rows.
 * A missing header column refuses the body (400); a line with the wrong number of fields
 * becomes a row that is quarantined.
 */
export function readingsFromCsv(text: string): IncomingReading[] {
  let records: string[][];
  try {
    records = parse(text, { relax_column_count: true, skip_empty_lines: true, bom: true, trim: true });
  } catch (err) {
    throw new ValidationError(`body: not valid CSV (${(err as Error).message.slice(0, 120)})`);
  }
  if (records.length === 0) throw new ValidationError('body: expected a header line "channel,ts,value"');
  const header = records[0].map((h) => h.toLowerCase());
  const at = REQUIRED.map((name) => header.indexOf(name));
  if (at.some((i) => i < 0)) throw new ValidationError(`header: expected columns channel, ts, value (got ${header.join(', ').slice(0, 120)})`);
  return records.slice(1).map((fields, i) => {
    const raw = fields.join(',');
    if (fields.length !== header.length) return { index: i, channel: undefined, ts: undefined, value: undefined, raw };
    return { index: i, channel: fields[at[0]], ts: fields[at[1]], value: fields[at[2]], raw };
  });
}
