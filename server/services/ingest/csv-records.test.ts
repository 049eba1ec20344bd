import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parse } from 'csv-parse/sync';
import { completeRecordsEnd, csvRecordChunks, readRecords } from './csv-records.ts';

const readAll = (text: string, delimiter = ',') => {
  const out: string[][] = [];
  readRecords(text, 0, Infinity, delimiter, (f) => out.push(f));
  return out;
};
async function fromChunks(chunks: Array<Buffer | string>, delimiter = ','): Promise<string[][]> {
  const out: string[][] = [];
  async function* source() {
    yield* chunks;
  }
  for await (const records of csvRecordChunks(source(), delimiter)) out.push(...records);
  return out;
}

const cell = fc.oneof(fc.constantFrom('air_t', '21,5', '', ' x ', 'a "q"', 'line\nbreak', 'é°C'), fc.string({ maxLength: 8 }));
const quote = (s: string, d: string) => (s.includes(d) || /["\r\n]/.test(s) || s !== s.trim() ? `"${s.replace(/"/g, '""')}"` : s);
const csvText = fc
  .tuple(
    fc.constantFrom(',', ';', '\t'),
    fc.constantFrom('\n', '\r\n', '\r'),
    fc.array(fc.array(cell, { minLength: 1, maxLength: 4 }), { minLength: 1, maxLength: 15 }),
  )
  .map(([d, nl, rows]) => ({ d, text: rows.map((r) => r.map((c) => quote(c, d)).join(d)).join(nl) + nl }));

describe('readRecords', () => {
  // Reference: the csv-parse library with the options the upload used (trim, skip empty lines, relaxed column count).
  it('reads what csv-parse reads for well-formed CSV with any delimiter and line ending (property)', () => {
    fc.assert(
      fc.property(csvText, ({ d, text }) => {
        const reference = parse(text, { delimiter: d, relax_column_count: true, skip_empty_lines: true, trim: true }) as string[][];
        expect(readAll(text, d)).toEqual(reference);
      }),
      { numRuns: 300 },
    );
  });

  it('refuses quotes that RFC 4180 does not allow', () => {
    expect(() => readAll('a,"b"c\n')).toThrow('body: not valid CSV (text after a closing quote');
    expect(() => readAll('a,b"c\n')).toThrow('body: not valid CSV (a quote inside a field that does not start with one)');
    expect(() => readAll('a,"b\n')).toThrow('body: not valid CSV (a quoted field is never closed)');
  });

  it('stops at a record boundary after the budget and goes on from there', () => {
    const text = 'a,1\nb,2\nc,3\n';
    const first: string[][] = [];
    const at = readRecords(text, 0, 1, ',', (f) => first.push(f));
    expect([first, at]).toEqual([[['a', '1']], 4]);
  });
});

describe('completeRecordsEnd', () => {
  it('ends after the last line break outside quotes', () => {
    expect(completeRecordsEnd('a,1\nb,"x\ny')).toBe(4);
    expect(completeRecordsEnd('a,1\nb,"x\ny"\nc')).toBe(12);
    expect(completeRecordsEnd('a,1')).toBe(0);
    expect(completeRecordsEnd('a\r')).toBe(2);
  });
});

describe('csvRecordChunks', () => {
  it('reads the same records whatever the chunk boundaries, multi-byte characters included (property)', async () => {
    await fc.assert(
      fc.asyncProperty(csvText, fc.array(fc.nat(), { maxLength: 6 }), async ({ d, text }, cuts) => {
        const bytes = Buffer.from(`\uFEFF${text}`);
        const at = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
        const chunks = [0, ...at].map((from, i) => bytes.subarray(from, i < at.length ? at[i] : bytes.length));
        expect(await fromChunks(chunks, d)).toEqual(readAll(text, d));
      }),
      { numRuns: 300 },
    );
  });

  it('refuses a line longer than the limit instead of buffering it', async () => {
    async function* endless() {
      for (let i = 0; i < 40; i++) yield 'x'.repeat(64 * 1024);
    }
    const reading = (async () => {
      for await (const records of csvRecordChunks(endless(), ',')) void records;
    })();
    await expect(reading).rejects.toThrow('The file has a line longer than 1,048,576 characters (is the column separator right?).');
  });
});
