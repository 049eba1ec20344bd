import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';

/** Hostile input on the front door: whatever arrives, the answer is never a 5xx and the accounting holds. */
let t: TestApp;
let f: LabWithEverything;
let cookie: string;
beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'technician' })).id);
});
afterAll(async () => t.close());

const csvCell = fc.oneof(
  fc.constantFrom('air_t', 'channel', 'ts', 'value', '', '"', '""', '1e309', '-0', '2026-01-01T00:00:00Z'),
  fc.string({ maxLength: 12 }),
  fc.double().map(String),
);
const csvText = fc
  .tuple(fc.constantFrom(',', ';', '\t'), fc.constantFrom('\n', '\r\n', '\r'), fc.array(fc.array(csvCell, { maxLength: 5 }), { maxLength: 30 }))
  .map(([sep, nl, lines]) => lines.map((cells) => cells.join(sep)).join(nl));

describe('fuzzed ingestion never answers 5xx', () => {
  it('arbitrary JSON bodies', async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.jsonValue(), fc.record({ readings: fc.array(fc.jsonValue(), { maxLength: 20 }) })), async (body) => {
        const res = await request(t.app)
          .post('/api/v1/ingest')
          .set('Authorization', `Bearer ${f.ingestKey}`)
          .set('Content-Type', 'application/json')
          .send(JSON.stringify(body));
        expect(res.status).toBeLessThan(500);
        if (res.status === 200) {
          const sent = (body as { readings: unknown[] }).readings.length;
          expect(res.body.accepted + res.body.duplicates + res.body.quarantined.length).toBe(sent);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('arbitrary CSV bodies', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          csvText,
          csvText.map((s) => `channel,ts,value\n${s}`),
          fc.string({ maxLength: 200 }),
        ),
        async (csv) => {
          const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'text/csv').send(csv);
          expect(res.status).toBeLessThan(500);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('arbitrary bytes and malformed JSON', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), fc.constantFrom('application/json', 'text/csv'), async (bytes, type) => {
        const res = await request(t.app)
          .post('/api/v1/ingest')
          .set('Authorization', `Bearer ${f.ingestKey}`)
          .set('Content-Type', type)
          .send(Buffer.from(bytes));
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: 60 },
    );
  });

  it('arbitrary upload options and files', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          fc.string({ maxLength: 60 }),
          fc.jsonValue().map((v) => JSON.stringify(v)),
        ),
        csvText,
        async (options, file) => {
          const res = await request(t.app)
            .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${encodeURIComponent(options)}`)
            .set('Cookie', cookie)
            .set('Content-Type', 'text/csv')
            .send(file);
          expect(res.status).toBeLessThan(500);
        },
      ),
      { numRuns: 40 },
    );
    // and well-formed options with hostile files: the stream ends with a summary or an error line
    await fc.assert(
      fc.asyncProperty(csvText, async (file) => {
        const options = encodeURIComponent(JSON.stringify({ format: 'wide', timeColumn: 'ts', columns: { value: 'air_t' } }));
        const res = await request(t.app)
          .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${options}`)
          .set('Cookie', cookie)
          .set('Content-Type', 'text/csv')
          .send(file);
        expect(res.status).toBe(200);
        const last = JSON.parse(res.text.trim().split('\n').at(-1)!);
        expect(['summary', 'error']).toContain(last.type);
      }),
      { numRuns: 40 },
    );
  });
});

/** The hostile bodies of issue 15: each was answered 5xx, or froze the server, before. */
describe('hostile ingest bodies', () => {
  const ingest = () => request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`);
  const quarantined = async () => Number((await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).count({ n: '*' }))[0].n);
  const storedCount = async () => Number((await t.db('readings').where({ tenant_id: f.lab.id }).count({ n: '*' }))[0].n);
  const T = Date.UTC(2026, 10, 1);

  it('a million one-field CSV lines: refused with 422 and a short sample, nothing stored; the server keeps answering meanwhile', async () => {
    const server = await new Promise<import('node:http').Server>((resolve) => {
      const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    try {
      const base = `http://127.0.0.1:${(server.address() as import('node:net').AddressInfo).port}`;
      const body = Buffer.from(`channel,ts,value\n${'a\n'.repeat(1_000_000)}`);
      const before = await quarantined();
      const order: string[] = [];
      // Send the first half of the bad body, ask for /healthz, and only once it has answered send the rest.
      const http = await import('node:http');
      const bad = new Promise<{ status: number; text: string }>((resolve, reject) => {
        const req = http.request(
          `${base}/api/v1/ingest`,
          { method: 'POST', headers: { authorization: `Bearer ${f.ingestKey}`, 'content-type': 'text/csv', 'content-length': body.length } },
          (res) => {
            let text = '';
            res
              .setEncoding('utf8')
              .on('data', (c: string) => (text += c))
              .on('end', () => {
                order.push('bad body answered');
                resolve({ status: res.statusCode!, text });
              });
          },
        );
        req.on('error', reject);
        req.write(body.subarray(0, body.length / 2), async () => {
          const health = await fetch(`${base}/healthz`);
          order.push(`healthz ${health.status}`);
          req.end(body.subarray(body.length / 2));
        });
      });
      const res = await bad;
      expect(order).toEqual(['healthz 200', 'bad body answered']);
      expect(res.status).toBe(422);
      expect(res.text.length).toBeLessThan(4000); // 70 MB before
      const error = JSON.parse(res.text).error;
      expect(error.code).toBe('too_many_quarantined');
      expect(error.message).toMatch(/^body: more than 1,000 rows of this batch cannot be read, so none was stored/);
      expect(error.sample).toHaveLength(10);
      expect(error.sample[0]).toEqual({ index: 0, reason: 'row: expected 3 fields, got 1' });
      expect(await quarantined()).toBe(before);
    } finally {
      server.close();
    }
  });

  it('a batch with more than 1,000 rows for channels the logger does not have: 422, nothing stored or quarantined', async () => {
    const before = [await quarantined(), await storedCount()];
    const readings = Array.from({ length: 1001 }, (_, i) => ({ channel: 'no_such_channel', ts: T + i * 1000, value: 1 }));
    readings.push({ channel: 'air_t', ts: T + 2_000_000, value: 2 });
    const res = await ingest().send({ readings }).expect(422);
    expect(res.body.error).toMatchObject({
      code: 'too_many_quarantined',
      message: 'body: more than 1,000 rows of this batch cannot be read (1,001 would go to quarantine), so none was stored. Check what the logger sends.',
    });
    expect([await quarantined(), await storedCount()]).toEqual(before);
  });

  it('more readings than the cap in one request: 413 naming the cap', async () => {
    const csv = `channel,ts,value\n${'air_t,1796303000000,1\n'.repeat(100_001)}`;
    const res = await ingest().set('Content-Type', 'text/csv').send(csv).expect(413);
    expect(res.body.error).toEqual({ code: 'too_many_readings', message: 'body: at most 100,000 readings per request; send the rest in further requests.' });
  });

  it('times a Date cannot hold are quarantined with the text sent; the good readings of the batch are stored', async () => {
    const storedBefore = await storedCount();
    const body = `{"readings":[{"channel":"air_t","ts":${T},"value":1},{"channel":"air_t","ts":1796303000000000000,"value":2},{"channel":"air_t","ts":1e16,"value":3},{"channel":"air_t","ts":1e300,"value":4},{"channel":"air_t","ts":"9999999999999999","value":5},{"channel":"air_t","ts":${T + 1000},"value":6}]}`;
    const res = await ingest().set('Content-Type', 'application/json').send(body).expect(200);
    expect(res.body.accepted).toBe(2);
    expect(res.body.quarantined.map((q: { index: number }) => q.index)).toEqual([1, 2, 3, 4]);
    for (const q of res.body.quarantined) expect(q.reason).toMatch(/^ts: ".*" is beyond the times that can be stored/);
    for (const q of res.body.quarantined) expect(q.code).toBe('time_out_of_range');
    expect(res.body.quarantined[3].reason).toContain('"9999999999999999"');
    expect(await storedCount()).toBe(storedBefore + 2);
  });

  it('an upload with 4,000 good rows and one such time stores the 4,000, and sending it again changes nothing', async () => {
    const lines = Array.from({ length: 4000 }, (_, i) => `air_t,${T + 10_000_000 + i * 1000},${i % 7}`);
    lines.splice(2000, 0, 'air_t,1796303000000000000,1');
    const file = `channel,ts,value\n${lines.join('\n')}\n`;
    const options = encodeURIComponent(
      JSON.stringify({ format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value', timeFormat: 'auto' }),
    );
    const send = () =>
      request(t.app)
        .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${options}`)
        .set('Cookie', cookie)
        .set('Content-Type', 'text/csv')
        .send(file)
        .expect(200);
    const summaryOf = (text: string) => JSON.parse(text.trim().split('\n').at(-1)!);
    const first = summaryOf((await send()).text);
    expect(first).toMatchObject({ type: 'summary', accepted: 4000, quarantined: 1 });
    expect(first.firstQuarantined[0].reason).toMatch(/^ts: "1796303000000000000" is beyond the times that can be stored/);
    expect(summaryOf((await send()).text)).toMatchObject({ type: 'summary', accepted: 0, duplicates: 4000, quarantined: 1 });
  });

  it('an upload of a million one-field lines stops at the first batch with too many unreadable rows; nothing is quarantined', async () => {
    const before = await quarantined();
    const options = encodeURIComponent(
      JSON.stringify({ format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value', timeFormat: 'auto' }),
    );
    const res = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${options}`)
      .set('Cookie', cookie)
      .set('Content-Type', 'text/csv')
      .send(`channel,ts,value\n${'a\n'.repeat(1_000_000)}`)
      .expect(200);
    const last = JSON.parse(res.text.trim().split('\n').at(-1)!);
    expect(last).toMatchObject({ type: 'error', code: 'too_many_quarantined' });
    expect(last.message).toMatch(/^body: more than 1,000 rows of this batch cannot be read, so none was stored \(e\.g\. row 0: line 2: ts: missing;/);
    expect(res.text.length).toBeLessThan(2000);
    expect(await quarantined()).toBe(before);
  });

  it('JSON nested 5,000 levels: 400 on ingest and on a session route', async () => {
    const deep = `${'['.repeat(5000)}${']'.repeat(5000)}`;
    const res = await ingest().set('Content-Type', 'application/json').send(`{"readings":[{"channel":"air_t","ts":${T},"value":${deep}}]}`).expect(400);
    expect(res.body.error).toEqual({ code: 'invalid_input', message: 'body: nested deeper than 32 levels' });
    const me = await request(t.app).patch('/api/v1/me').set('Cookie', cookie).set('Content-Type', 'application/json').send(`{"timeZone":${deep}}`).expect(400);
    expect(me.body.error).toEqual({ code: 'invalid_input', message: 'The request is nested deeper than 64 levels.' });
  });

  it('charsets other than UTF-8 and unsupported content codings: 415; corrupt gzip: 400; good gzip is read', async () => {
    const { gzipSync, brotliCompressSync } = await import('node:zlib');
    const server = await new Promise<import('node:http').Server>((resolve) => {
      const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    // fetch, not supertest: superagent re-encodes a Buffer sent as application/json
    const send = async (method: string, path: string, headers: Record<string, string>, body: Buffer | string) => {
      const auth: Record<string, string> = path === '/api/v1/ingest' ? { authorization: `Bearer ${f.ingestKey}` } : { cookie };
      const res = await fetch(`http://127.0.0.1:${(server.address() as import('node:net').AddressInfo).port}${path}`, {
        method,
        headers: { ...auth, ...headers },
        body,
      });
      return { status: res.status, body: (await res.json()) as { error?: { code: string; message: string }; accepted?: number; duplicates?: number } };
    };
    try {
      const json = JSON.stringify({ readings: [{ channel: 'air_t', ts: T + 5000, value: 1 }] });
      const routes: Array<[string, string, string]> = [
        ['POST', '/api/v1/ingest', json],
        ['PATCH', '/api/v1/me', '{"timeZone":"UTC"}'],
      ];
      for (const [method, path, body] of routes) {
        expect(await send(method, path, { 'content-type': 'application/json; charset=latin1' }, body)).toEqual({
          status: 415,
          body: { error: { code: 'unsupported_charset', message: 'charset "latin1" is not supported; send the body as UTF-8.' } },
        });
        for (const coding of ['br', 'compress', 'gzip, gzip']) {
          const res = await send(
            method,
            path,
            { 'content-type': 'application/json', 'content-encoding': coding },
            coding === 'br' ? brotliCompressSync(body) : body,
          );
          expect([res.status, res.body.error?.code], coding).toEqual([415, 'unsupported_encoding']);
        }
        const corrupt = Buffer.concat([gzipSync(body).subarray(0, 12), Buffer.from('not gzip at all')]);
        expect(await send(method, path, { 'content-type': 'application/json', 'content-encoding': 'gzip' }, corrupt)).toEqual({
          status: 400,
          body: {
            error: { code: 'corrupt_body', message: 'The request could not be read: its compressed body is corrupt or cut short (it says gzip or deflate).' },
          },
        });
      }
      const good = await send('POST', '/api/v1/ingest', { 'content-type': 'application/json', 'content-encoding': 'gzip' }, gzipSync(json));
      expect(good.status).toBe(200);
      expect(good.body.accepted! + good.body.duplicates!).toBe(1);
    } finally {
      server.close();
    }
  });

  it('strict times: impossible offsets and fractional epoch milliseconds are quarantined, not stored', async () => {
    const readings = [
      { channel: 'air_t', ts: '2026-11-02T00:00:00+99:99', value: 1 },
      { channel: 'air_t', ts: '2026-11-02T00:00:00+2400', value: 1 },
      { channel: 'air_t', ts: '2026-11-02T00:00:00-23:59', value: 1 },
      { channel: 'air_t', ts: 1796303000000.7, value: 1 },
      { channel: 'air_t', ts: '1796303000003.5', value: 1 },
      { channel: 'air_t', ts: '2026-11-02T00:00:00+14:00', value: 1 },
    ];
    const res = await ingest().send({ readings }).expect(200);
    expect(res.body.accepted).toBe(1);
    expect(res.body.quarantined.map((q: { index: number; code: string }) => [q.index, q.code])).toEqual([0, 1, 2, 3, 4].map((i) => [i, 'bad_time']));
    expect(res.body.quarantined[2].reason).toBe('ts: "2026-11-02T00:00:00-23:59": offset "-23:59" is outside the UTC offsets in use (−12:00 to +14:00)');
    expect(res.body.quarantined[3].reason).toBe('ts: 1796303000000.7 is not whole epoch milliseconds');
  });

  it('strict values: text that underflows to 0 or overflows to infinity is quarantined, not stored as 0', async () => {
    const readings = [
      { channel: 'air_t', ts: T + 7000, value: '1e-400' },
      { channel: 'air_t', ts: T + 8000, value: '1e400' },
      { channel: 'air_t', ts: T + 9000, value: '0.0e-400' },
    ];
    const res = await ingest().send({ readings }).expect(200);
    expect(res.body.accepted).toBe(1); // an exact zero written with an exponent is still zero
    expect(res.body.quarantined.map((q: { index: number; code: string }) => [q.index, q.code])).toEqual([
      [0, 'bad_value'],
      [1, 'bad_value'],
    ]);
    expect(res.body.quarantined[0].reason).toBe('value: "1e-400" is too small for a double (below 2.2e-308 it would lose digits or become 0)');
    expect(res.body.quarantined[1].reason).toBe('value: "1e400" is too large for a double (beyond ±1.8e308)');
  });

  it('range queries refuse dates the calendar does not have, as ingestion does', async () => {
    // the last day of last month (within the free plan's 90 days), and the day after it that does not exist
    const lastMonth = new Date(Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth() - 1, 1));
    const y = lastMonth.getUTCFullYear();
    const m = lastMonth.getUTCMonth();
    const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
    const day = (d: number) => `${y}-${String(m + 1).padStart(2, '0')}-${String(d).padStart(2, '0')}T00:00:00Z`;
    const series = (from: string) =>
      request(t.app).get(`/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}/series?from=${from}&to=${new Date().toISOString()}`).set('Cookie', cookie);
    const res = await series(day(last + 1)).expect(400);
    expect(res.body.error.message).toBe(`From: "${day(last + 1)}" is not a valid date and time.`);
    await series(day(last)).expect(200);
  });
});
