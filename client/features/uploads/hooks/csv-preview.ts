/** The delimiters an upload may use (the server's `uploadOptionsSchema`). */
export const DELIMITERS = [',', ';', '\t'] as const;
export type Delimiter = (typeof DELIMITERS)[number];

/**
 * Splits CSV text into records the way the server's import reads the file (RFC 4180 quoting:
 * a field in double quotes may hold the delimiter, line breaks and `""` for a quote; then, as
 * the import does, a leading byte-order mark is dropped, fields are trimmed and empty lines
 * skipped). For a preview of a file's first kilobytes: pass `truncated` when the text stops
 * mid-file, and the last, possibly cut-off record is left out. Linear in the text's length.
 */
export function parseCsvRecords(text: string, delimiter: Delimiter, truncated = false): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = '';
  let quoted = false;
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const endField = () => {
    record.push(field.trim());
    field = '';
  };
  const endRecord = () => {
    endField();
    if (record.length > 1 || record[0] !== '') records.push(record);
    record = [];
  };
  for (let i = 0; i < body.length; i++) {
    const c = body[i];
    if (quoted) {
      if (c === '"' && body[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"' && field.trim() === '') {
      field = '';
      quoted = true;
    } else if (c === delimiter) endField();
    else if (c === '\n' || c === '\r') {
      if (c === '\r' && body[i + 1] === '\n') i++;
      endRecord();
    } else field += c;
  }
  if (field !== '' || record.length > 0) endRecord();
  if (truncated && records.length > 0) records.pop();
  return records;
}

/**
 * Guesses a file's delimiter from its first lines: the candidate (`,` `;` tab) that splits the
 * header into the most columns while giving most of the following lines the same number of
 * fields. A comma wins ties and files with a single column.
 */
export function detectDelimiter(text: string): Delimiter {
  let best: Delimiter = ',';
  let bestScore = 0;
  for (const delimiter of DELIMITERS) {
    const records = parseCsvRecords(text, delimiter, true).slice(0, 20);
    if (records.length === 0) continue;
    const width = records[0].length;
    if (width < 2) continue;
    const consistent = records.filter((r) => r.length === width).length / records.length;
    const score = consistent >= 0.8 ? width : 0;
    if (score > bestScore) {
      best = delimiter;
      bestScore = score;
    }
  }
  return best;
}

/** How much of a file the browser reads for the preview and the column mapping. */
export const PREVIEW_BYTES = 64 * 1024;

export interface CsvPreview {
  delimiter: Delimiter;
  header: string[];
  rows: string[][];
}

/** The preview of a file's first {@link PREVIEW_BYTES}: header and first rows, with the given or detected delimiter. */
export function previewCsv(text: string, truncated: boolean, delimiter: Delimiter = detectDelimiter(text), maxRows = 10): CsvPreview {
  const records = parseCsvRecords(text, delimiter, truncated);
  return { delimiter, header: records[0] ?? [], rows: records.slice(1, maxRows + 1) };
}
