import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parse } from 'csv-parse/sync';
import {
  MAX_JSON_DEPTH,
  MAX_QUARANTINED_PER_BATCH,
  MAX_READINGS_PER_REQUEST,
  readingsFromCsvBody,
  readingsFromJson,
  readingsFromJsonBody,
  TooManyQuarantinedError,
  TooManyReadingsError,
} from './readings-from-body.ts';

const csvOf = (n: number) => `channel,ts,value\n${Array.from({ length: n }, (_, i) => `air_t,${1796303000000 + i * 1000},${i % 50}`).join('\n')}\n`;
const jsonOf = (n: number) =>
  JSON.stringify({ readings: Array.from({ length: n }, (_, i) => ({ channel: 'air_t', ts: 1796303000000 + i * 1000, value: i % 50 })) });
const fields = (rows: Array<{ channel: unknown; ts: unknown; value: unknown }>) => rows.map((r) => [r.channel, r.ts, r.value]);
const countPauses = () => {
  const counter = { n: 0, pause: async () => void counter.n++ };
  return counter;
};

describe('readingsFromCsvBody', () => {
  it('reads the header in any order and case, quoted fields, CRLF, lone CR, BOM and blank lines', async () => {
    const body = '\uFEFFValue,CHANNEL,ts\r\n 21.5 , air_t ,1796303000000\r\n\r\n"1,5","a ""b""",1796303001000\r"2","c\nd",1796303002000\n';
    const rows = await readingsFromCsvBody(body);
    expect(fields(rows)).toEqual([
      ['air_t', '1796303000000', '21.5'],
      ['a "b"', '1796303001000', '1,5'],
      ['c\nd', '1796303002000', '2'],
    ]);
    expect(rows.map((r) => r.index)).toEqual([0, 1, 2]);
  });

  it('keeps a line with the wrong number of fields as a row to quarantine, with its text', async () => {
    const rows = await readingsFromCsvBody('channel,ts,value\nair_t\nair_t,1796303000000,1\n');
    expect(rows[0]).toEqual({ index: 0, channel: undefined, ts: undefined, value: undefined, raw: 'air_t' });
    expect(rows[1].channel).toBe('air_t');
  });

  it('refuses a body without the required header columns, and unclosed quotes', async () => {
    await expect(readingsFromCsvBody('a,b\n1,2\n')).rejects.toThrow('header: expected columns channel, ts, value (got a, b)');
    await expect(readingsFromCsvBody('')).rejects.toThrow('body: expected a header line "channel,ts,value"');
    await expect(readingsFromCsvBody('channel,ts,value\n"air_t,1,2\n')).rejects.toThrow('body: not valid CSV (a quoted field is never closed)');
  });

  // Cross-check with the csv-parse library (RFC 4180 reader, the options the ingest route used before).
  it('reads the same fields as csv-parse for well-formed CSV (property)', async () => {
    const cell = fc.oneof(fc.constantFrom('air_t', '21.5', '', ' x ', '1e3'), fc.string({ maxLength: 8 }));
    const quote = (s: string) => (/[",\r\n]/.test(s) || s !== s.trim() ? `"${s.replace(/"/g, '""')}"` : s);
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 20 }),
        fc.constantFrom('\n', '\r\n'),
        async (lines, nl) => {
          const body = `channel,ts,value${nl}${lines.map((l) => l.map(quote).join(',')).join(nl)}${nl}`;
          const reference = (parse(body, { relax_column_count: true, skip_empty_lines: true, bom: true, trim: true }) as string[][]).slice(1);
          const ours = await readingsFromCsvBody(body, { maxQuarantined: Infinity });
          expect(fields(ours)).toEqual(reference.map((r) => (r.length === 3 ? r : [undefined, undefined, undefined])));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('refuses more than the readings cap with 413 naming it', async () => {
    await expect(readingsFromCsvBody(csvOf(MAX_READINGS_PER_REQUEST))).resolves.toHaveLength(MAX_READINGS_PER_REQUEST);
    const err = await readingsFromCsvBody(csvOf(MAX_READINGS_PER_REQUEST + 1)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TooManyReadingsError);
    expect(err).toMatchObject({
      status: 413,
      code: 'too_many_readings',
      message: 'body: at most 100,000 readings per request; send the rest in further requests.',
    });
  });

  it('refuses a batch with more unreadable rows than the quarantine cap (422, sample of reasons) within the first slice', async () => {
    const bad = `channel,ts,value\n${'a\n'.repeat(1_000_000)}`; // the hostile body of issue 15: 2 MB of one-field lines
    const pauses = countPauses();
    const err = (await readingsFromCsvBody(bad, { pause: pauses.pause }).catch((e: unknown) => e)) as TooManyQuarantinedError;
    expect(err).toBeInstanceOf(TooManyQuarantinedError);
    expect(err.status).toBe(422);
    expect(err.sample).toHaveLength(10);
    expect(err.sample[0]).toEqual({ index: 0, reason: 'row: expected 3 fields, got 1' });
    expect(err.message).toMatch(/^body: more than 1,000 rows of this batch cannot be read, so none was stored \(e\.g\. row 0: row: expected 3 fields, got 1;/);
    expect(pauses.n).toBe(0); // stopped inside the first 64 KB slice instead of reading all 2 MB
    // exactly at the cap the rows still come back (each to be quarantined with its reason)
    await expect(readingsFromCsvBody(`channel,ts,value\n${'a\n'.repeat(MAX_QUARANTINED_PER_BATCH)}`)).resolves.toHaveLength(MAX_QUARANTINED_PER_BATCH);
    await expect(readingsFromCsvBody(`channel,ts,value\n${',1,2\n'.repeat(MAX_QUARANTINED_PER_BATCH + 1)}`)).rejects.toThrow('row 0: channel: missing');
  });

  it('lets other work run between slices of a large body (ordering, not timing)', async () => {
    const order: string[] = [];
    const parsing = readingsFromCsvBody(csvOf(20_000)).then((rows) => order.push(`parsed ${rows.length}`));
    setImmediate(() => order.push('other request'));
    await parsing;
    expect(order).toEqual(['other request', 'parsed 20000']);
  });
});

describe('readingsFromJsonBody', () => {
  it('reads the same rows as JSON.parse + readingsFromJson (property)', async () => {
    const item = fc.oneof(
      fc.record({
        channel: fc.oneof(fc.constant('air_t'), fc.string({ maxLength: 6 })),
        ts: fc.oneof(fc.integer(), fc.string({ maxLength: 6 })),
        value: fc.oneof(fc.double(), fc.string({ maxLength: 4 })),
      }),
      fc.jsonValue({ maxDepth: 4 }),
    );
    await fc.assert(
      fc.asyncProperty(
        fc.array(item, { maxLength: 30 }),
        fc.dictionary(fc.string({ maxLength: 5 }), fc.jsonValue({ maxDepth: 3 }), { maxKeys: 3 }),
        async (readings, extra) => {
          const body = JSON.stringify({ ...extra, readings });
          const expected = readingsFromJson(JSON.parse(body), { maxQuarantined: Infinity });
          expect(await readingsFromJsonBody(Buffer.from(body), { maxQuarantined: Infinity })).toEqual(expected);
          // and through the sliced path large bodies take
          expect(await readingsFromJsonBody(Buffer.from(body), { maxQuarantined: Infinity, wholeJsonBytes: 0 })).toEqual(expected);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('finds "readings" only at the top level, whatever strings and escapes come before it', async () => {
    const body = '{"note":"a \\"readings\\": [ ] ] {","nested":{"readings":[1,2]},"readings":[{"channel":"air_t","ts":1,"value":2}]}';
    expect(fields(await readingsFromJsonBody(Buffer.from(body), { wholeJsonBytes: 0 }))).toEqual([['air_t', 1, 2]]);
  });

  it('refuses what JSON.parse refuses, and the wrong shape', async () => {
    for (const body of [
      '{"readings":[1,]}',
      '{"readings":[,1]}',
      '{"readings":[1,,2]}',
      '{"readings":[1]',
      '{"readings":[1]} x',
      '{"readings":[{"a":1}]',
      '',
    ]) {
      for (const wholeJsonBytes of [0, undefined])
        await expect(readingsFromJsonBody(Buffer.from(body), { wholeJsonBytes }), body).rejects.toThrow('body: not valid JSON');
    }
    for (const wholeJsonBytes of [0, undefined]) {
      await expect(readingsFromJsonBody(Buffer.from('[{"readings":[]}]'), { wholeJsonBytes })).rejects.toThrow('body: expected {"readings"');
      await expect(readingsFromJsonBody(Buffer.from('{"readings":{}}'), { wholeJsonBytes })).rejects.toThrow('body: expected {"readings"');
      await expect(readingsFromJsonBody(Buffer.from('{"readings":[ ]}'), { wholeJsonBytes })).resolves.toEqual([]);
    }
  });

  it('refuses nesting deeper than the limit with 400 before parsing (5,000 levels overflowed the stack when stringified)', async () => {
    const deep = (d: number) => Buffer.from(`{"readings":[{"channel":"air_t","ts":1,"value":${'['.repeat(d)}${']'.repeat(d)}}]}`);
    for (const wholeJsonBytes of [0, undefined]) {
      await expect(readingsFromJsonBody(deep(5000), { wholeJsonBytes })).rejects.toMatchObject({
        status: 400,
        message: `body: nested deeper than ${MAX_JSON_DEPTH} levels`,
      });
      await expect(readingsFromJsonBody(deep(MAX_JSON_DEPTH - 2), { wholeJsonBytes })).rejects.toMatchObject({ status: 400 });
      await expect(readingsFromJsonBody(deep(MAX_JSON_DEPTH - 3), { wholeJsonBytes })).resolves.toHaveLength(1);
    }
    // a deep item that is not even an object
    await expect(readingsFromJsonBody(Buffer.from(`{"readings":[${'['.repeat(5000)}${']'.repeat(5000)}]}`))).rejects.toMatchObject({ status: 400 });
  });

  it('refuses more than the readings cap with 413 before parsing any item', async () => {
    await expect(readingsFromJsonBody(Buffer.from(jsonOf(MAX_READINGS_PER_REQUEST)))).resolves.toHaveLength(MAX_READINGS_PER_REQUEST);
    const pauses = countPauses();
    await expect(
      readingsFromJsonBody(Buffer.from(`{"readings":[${'0,'.repeat(MAX_READINGS_PER_REQUEST)}0]}`), { pause: pauses.pause, wholeJsonBytes: 0 }),
    ).rejects.toBeInstanceOf(TooManyReadingsError);
    expect(pauses.n).toBe(0);
  });

  it('refuses a batch with more rows of the wrong shape than the quarantine cap (422)', async () => {
    const err = await readingsFromJsonBody(Buffer.from(`{"readings":[${'1,'.repeat(MAX_QUARANTINED_PER_BATCH)}1]}`)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TooManyQuarantinedError);
    expect((err as TooManyQuarantinedError).sample[0]).toEqual({ index: 0, reason: 'row: expected an object {"channel", "ts", "value"}' });
  });

  it('lets other work run between groups of a large body (ordering, not timing)', async () => {
    const order: string[] = [];
    const body = Buffer.from(jsonOf(40_000));
    expect(body.length).toBeGreaterThan(1024 * 1024); // past the size parsed in one go
    const parsing = readingsFromJsonBody(body).then((rows) => order.push(`parsed ${rows.length}`));
    setImmediate(() => order.push('other request'));
    await parsing;
    expect(order).toEqual(['other request', 'parsed 40000']);
  });
});
