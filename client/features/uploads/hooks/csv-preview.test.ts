import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { detectDelimiter, parseCsvRecords, previewCsv } from './csv-preview.ts';

describe('parseCsvRecords', () => {
  // RFC 4180, section 2, rules 6 and 7 (quoted fields holding a line break, a comma, and "" for a quote).
  it('follows the quoting rules of RFC 4180', () => {
    expect(parseCsvRecords('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx', ',')).toEqual([
      ['aaa', 'b\r\nbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect(parseCsvRecords('"aaa","b""bb","ccc"', ',')).toEqual([['aaa', 'b"bb', 'ccc']]);
    expect(parseCsvRecords('"a,b",c', ',')).toEqual([['a,b', 'c']]);
  });

  it('reads a file exactly as csv-parse does with the import’s options (bom, trim, skip empty lines, ragged rows)', () => {
    // csv-parse is the parser the server's import uses; these are the options in server/services/ingest/import-upload.ts.
    const text = '\uFEFFtime; air_t ;"note"\n2026-09-01 00:00; 12.5 ;"said ""hi""; twice"\n\n2026-09-01 00:10;13\r\n 2026-09-01 00:20 ;n/a;"x\ny"\n';
    const reference = parse(text, { delimiter: ';', bom: true, trim: true, skip_empty_lines: true, relax_column_count: true }) as string[][];
    expect(parseCsvRecords(text, ';')).toEqual(reference);
    expect(reference[1]).toEqual(['2026-09-01 00:00', '12.5', 'said "hi"; twice']);
  });

  it('leaves out the last record of a cut-off preview, and returns nothing for empty text', () => {
    expect(parseCsvRecords('a,b\n1,2\n3,', ',', true)).toEqual([
      ['a', 'b'],
      ['1', '2'],
    ]);
    expect(parseCsvRecords('', ',')).toEqual([]);
    expect(parseCsvRecords('\n\n', ',')).toEqual([]);
  });
});

describe('detectDelimiter', () => {
  it('finds comma, semicolon and tab from the header and the lines after it', () => {
    expect(detectDelimiter('time,air_t,rh\n2026-09-01T00:00Z,12.5,80\n')).toBe(',');
    // Decimal commas inside a semicolon file must not make it look comma-separated.
    expect(detectDelimiter('time;air_t;rh\n2026-09-01 00:00;12,5;80\n2026-09-01 00:10;12,75;81\n')).toBe(';');
    expect(detectDelimiter('time\tair_t\n2026-09-01 00:00\t12.5\n')).toBe('\t');
  });

  it('falls back to a comma for a single column or no text', () => {
    expect(detectDelimiter('value\n1\n2\n')).toBe(',');
    expect(detectDelimiter('')).toBe(',');
  });
});

describe('previewCsv', () => {
  it('gives the header and at most the requested number of rows', () => {
    const text = ['time,a', ...Array.from({ length: 30 }, (_, i) => `${i},${i * 2}`)].join('\n');
    const preview = previewCsv(text, false, undefined, 5);
    expect(preview.delimiter).toBe(',');
    expect(preview.header).toEqual(['time', 'a']);
    expect(preview.rows).toHaveLength(5);
    expect(preview.rows[4]).toEqual(['4', '8']);
  });
});
