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

const csvCell = fc.oneof(fc.constantFrom('air_t', 'channel', 'ts', 'value', '', '"', '""', '1e309', '-0', '2026-01-01T00:00:00Z'), fc.string({ maxLength: 12 }), fc.double().map(String));
const csvText = fc
  .tuple(fc.constantFrom(',', ';', '\t'), fc.constantFrom('\n', '\r\n', '\r'), fc.array(fc.array(csvCell, { maxLength: 5 }), { maxLength: 30 }))
  .map(([sep, nl, lines]) => lines.map((cells) => cells.join(sep)).join(nl));

describe('fuzzed ingestion never answers 5xx', () => {
  it('arbitrary JSON bodies', async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.jsonValue(), fc.record({ readings: fc.array(fc.jsonValue(), { maxLength: 20 }) })), async (body) => {
        const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'application/json').send(JSON.stringify(body));
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
      fc.asyncProperty(fc.oneof(csvText, csvText.map((s) => `channel,ts,value\n${s}`), fc.string({ maxLength: 200 })), async (csv) => {
        const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'text/csv').send(csv);
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: 60 },
    );
  });

  it('arbitrary bytes and malformed JSON', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), fc.constantFrom('application/json', 'text/csv'), async (bytes, type) => {
        const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', type).send(Buffer.from(bytes));
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: 60 },
    );
  });

  it('arbitrary upload options and files', async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.string({ maxLength: 60 }), fc.jsonValue().map((v) => JSON.stringify(v))), csvText, async (options, file) => {
        const res = await request(t.app)
          .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${encodeURIComponent(options)}`)
          .set('Cookie', cookie)
          .set('Content-Type', 'text/csv')
          .send(file);
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: 40 },
    );
    // and well-formed options with hostile files: the stream ends with a summary or an error line
    await fc.assert(
      fc.asyncProperty(csvText, async (file) => {
        const options = encodeURIComponent(JSON.stringify({ format: 'wide', timeColumn: 'ts', columns: { value: 'air_t' } }));
        const res = await request(t.app).post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${options}`).set('Cookie', cookie).set('Content-Type', 'text/csv').send(file);
        expect(res.status).toBe(200);
        const last = JSON.parse(res.text.trim().split('\n').at(-1)!);
        expect(['summary', 'error']).toContain(last.type);
      }),
      { numRuns: 40 },
    );
  });
});
