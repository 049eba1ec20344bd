/**
 * A quarantined row keeps its original text (`raw`) once. Its time and value as received are
 * usually a field of that text — a JSON item's `ts`/`value`, or one comma-separated field of a
 * CSV line — and are then not stored again: `quarantined_rows.copied_fields` says where in
 * `raw` each one is, and the reader takes it from there. A field that is not a plain copy (a
 * time that was read is kept as ISO 8601 UTC, for re-submission; a CSV field that held a quoted
 * comma) stays in its own column. The channel name stays in its own column too: it is a filter.
 *
 * `copied_fields`: low 4 bits the time's source, high 4 bits the value's: 0 = its own column,
 * 1–14 = the CSV field at that position (1 = first), 15 = the JSON item's field. A source is
 * only ever recorded after checking that reading it back gives exactly the text to keep.
 */

const OWN_COLUMN = 0;
const JSON_FIELD = 15;
const MAX_CSV_FIELD = 14;

/** The text quarantine keeps for a field value of a JSON item: strings as they are, anything else as JSON. */
const asText = (v: unknown): string | null => (v === undefined || v === null ? null : typeof v === 'string' ? v : (JSON.stringify(v) ?? null));

/** `raw` as a JSON object (an API item), or null when it is not one. */
function jsonItem(raw: string): Record<string, unknown> | null {
  if (!raw.startsWith('{')) return null;
  try {
    const parsed: unknown = JSON.parse(raw);
    return parsed !== null && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}

/** The field `name` of `raw` read from source `code` (see the module comment); undefined when the source gives nothing. */
function readSource(raw: string, name: 'ts' | 'value', code: number): string | null | undefined {
  if (code === JSON_FIELD) {
    const item = jsonItem(raw);
    return item ? asText(item[name]) : undefined;
  }
  if (code >= 1 && code <= MAX_CSV_FIELD) return raw.split(',')[code - 1];
  return undefined;
}

/** Where in `raw` the text `kept` of field `name` can be read back exactly, or OWN_COLUMN. */
function sourceOf(raw: string | null, name: 'ts' | 'value', kept: string | null): number {
  if (raw === null || kept === null) return OWN_COLUMN;
  if (readSource(raw, name, JSON_FIELD) === kept) return JSON_FIELD;
  const fields = raw.split(',');
  for (let k = 0; k < Math.min(fields.length, MAX_CSV_FIELD); k++) if (fields[k] === kept) return k + 1;
  return OWN_COLUMN;
}

/** A quarantined row's stored text fields, as the table holds them. */
export interface StoredCopies {
  raw: string | null;
  tsRaw: string | null;
  valueRaw: string | null;
  copiedFields: number;
}

/**
 * What to store for a row whose text, time and value as received are `raw`, `tsRaw` and
 * `valueRaw` (already cut to their columns' lengths): the time and value become null where
 * `raw` holds them, with `copiedFields` saying where. O(length of raw).
 */
export function storedCopies(raw: string | null, tsRaw: string | null, valueRaw: string | null): StoredCopies {
  const ts = sourceOf(raw, 'ts', tsRaw);
  const value = sourceOf(raw, 'value', valueRaw);
  return { raw, tsRaw: ts === OWN_COLUMN ? tsRaw : null, valueRaw: value === OWN_COLUMN ? valueRaw : null, copiedFields: ts | (value << 4) };
}

/** The time and value as received, read back from a stored row (the inverse of {@link storedCopies}). */
export function readCopies(stored: StoredCopies): { tsRaw: string | null; valueRaw: string | null } {
  const ts = stored.copiedFields & 0x0f;
  const value = stored.copiedFields >> 4;
  const from = (name: 'ts' | 'value', code: number, own: string | null) =>
    code === OWN_COLUMN || stored.raw === null ? own : (readSource(stored.raw, name, code) ?? null);
  return { tsRaw: from('ts', ts, stored.tsRaw), valueRaw: from('value', value, stored.valueRaw) };
}
