import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything } from '../support/lab-fixture.ts';

/**
 * CSV formula injection (issue 15, finding 7): text a logger sent that a spreadsheet would run
 * as a formula comes out of every export with a leading apostrophe (OWASP "CSV Injection"
 * guidance); numbers, negative ones included, stay numbers.
 */
let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t?.close());

/** The fields of one CSV line per RFC 4180 (quoted fields with doubled quotes). */
function fieldsOf(line: string): string[] {
  const out: string[] = [];
  const re = /("((?:[^"]|"")*)"|[^,]*)(,|$)/g;
  for (let m = re.exec(line); m && m.index < line.length; m = re.exec(line)) out.push(m[2] !== undefined ? m[2].replace(/""/g, '"') : m[1]);
  return out;
}

describe('CSV exports neutralise formulas', () => {
  it('quarantine export: =HYPERLINK(…), @SUM(1), -3+cmd get an apostrophe; a plain "-3.2" and numbers stay as they are', async () => {
    const f = await buildLabWithEverything(t.db);
    const tech = await buildMember(t.db, f.lab, { role: 'technician' });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, tech.id);
    const ts = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 86_400_000; // inside the free plan's history window
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .send({
        readings: [
          { channel: '=HYPERLINK("http://x","y")', ts, value: '@SUM(1)' },
          { channel: '-3+cmd', ts, value: '-3.2' },
          { channel: 'air_t', ts, value: -3.2 },
        ],
      });
    expect(res.status).toBe(200);
    expect(res.body.accepted).toBe(1);

    const csv = await request(t.app)
      .get(`/api/v1/labs/${f.lab.slug}/quarantine/export.csv?loggerId=${f.ids.loggerId}&reason=unknown_channel`)
      .set('Cookie', cookie)
      .expect(200);
    const [header, ...lines] = csv.text.trim().split('\r\n');
    const columns = fieldsOf(header);
    const rows = lines.map(fieldsOf).map((cells) => Object.fromEntries(columns.map((c, i) => [c, cells[i]])));
    const byIndex = new Map(rows.map((r) => [r.row_index, r]));
    expect(byIndex.get('0')).toMatchObject({ channel: `'=HYPERLINK("http://x","y")`, value: "'@SUM(1)" });
    expect(byIndex.get('1')).toMatchObject({ channel: "'-3+cmd", value: '-3.2' });
    expect(byIndex.get('0')!.logger_id).toBe(String(f.ids.loggerId)); // ids written as plain numbers
    // the raw JSON row starts with "{", so it is left alone
    expect(byIndex.get('0')!.raw.startsWith('{')).toBe(true);

    const readings = await request(t.app)
      .get(`/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}/readings.csv?from=${ts}&to=${ts + 1}`)
      .set('Cookie', cookie)
      .expect(200);
    // the last column is the same instant on the logger's clock (the fixture's logger keeps UTC)
    expect(readings.text.trim().split('\r\n')[1]).toBe(`${new Date(ts).toISOString()},${ts},-3.2,${new Date(ts).toISOString().replace('Z', '+00:00')}`);
  });
});
