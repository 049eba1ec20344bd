import { describe, expect, it } from 'vitest';
import { readingsFromJson } from '../../../../server/services/ingest/readings-from-body.ts';
import { parseReadingTime } from '../../../../server/services/ingest/parse-reading-time.ts';
import { curlIngestExample, sampleValue } from './ingest-example.ts';

// A key in the documented shape lbk_<12 hex>_<43 chars> (API contract); invented for the test.
const KEY = 'lbk_0123456789ab_AbCdEfGhIjKlMnOpQrStUvWxYz0123456789-_AbCdEf';

/** The argument of `-d '…'` in a command. */
const bodyOf = (command: string) => /-d '([^']*)'/.exec(command)![1];

describe('curlIngestExample', () => {
  it('posts one reading with the key, in a body the server’s ingest parser reads as channel, time and value', () => {
    const at = new Date(Date.UTC(2026, 8, 1, 6, 30, 0, 250));
    const command = curlIngestExample('http://127.0.0.1:5310', KEY, { key: 'air_t', validMin: -40, validMax: 60 }, at);
    expect(command).toContain(`-H 'Authorization: Bearer ${KEY}'`);
    expect(command.split('\n')[0]).toBe(`curl -sS -X POST 'http://127.0.0.1:5310/api/v1/ingest' \\`);
    const rows = readingsFromJson(JSON.parse(bodyOf(command)));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ channel: 'air_t', value: 10 });
    // Whole seconds in UTC: the server reads it back as the same instant, minus the dropped milliseconds.
    expect(parseReadingTime(rows[0].ts)).toEqual({ ok: true, ts: at.getTime() - 250 });
  });

  it('takes the middle of the valid range as the sample value, else 0', () => {
    expect(sampleValue({ key: 'rh', validMin: 0, validMax: 100 })).toBe(50);
    expect(sampleValue({ key: 'rh', validMin: 0, validMax: null })).toBe(0);
    expect(sampleValue({ key: 'rh' })).toBe(0);
  });
});
