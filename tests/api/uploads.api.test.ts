import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';

let t: TestApp;
let f: LabWithEverything;
let cookie: string;
let rhId: number;
beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'technician' })).id);
  rhId = 900_000_000 + f.lab.id;
  await t.db('channels').insert({ tenant_id: f.lab.id, id: rhId, logger_id: f.ids.loggerId, channel_key: 'rh', label: 'Humidity', unit: '%' });
});
afterAll(async () => t.close());

function upload(options: object, body: string, contentType = 'text/csv') {
  return request(t.app)
    .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${encodeURIComponent(JSON.stringify(options))}`)
    .set('Cookie', cookie)
    .set('Content-Type', contentType)
    .send(body);
}

const ndjson = (text: string) =>
  text
    .trim()
    .split('\n')
    .map((l) => JSON.parse(l));

describe('historical uploads', () => {
  it("imports a wide file (time column + one column per channel) in the logger's zone, with progress and a summary", async () => {
    const lines = ['Timestamp;Temp (C);RH (%);Battery'];
    for (let i = 0; i < 12_000; i++) {
      const d = new Date(Date.UTC(2026, 0, 1, 0, 0) + i * 60_000);
      const local = d.toISOString().slice(0, 19); // written as local wall time, zone given below
      lines.push(`${local};${(i % 50) / 10};${i === 7 ? 'n/a' : 40 + (i % 20)};3.3`);
    }
    const options = {
      format: 'wide',
      delimiter: ';',
      timeColumn: 'Timestamp',
      columns: { 'Temp (C)': 'air_t', 'RH (%)': 'rh', Battery: null },
      timeFormat: 'iso',
      timeZone: 'Etc/GMT-1',
    };
    const res = await upload(options, lines.join('\n')).expect(200);
    expect(res.headers['content-type']).toMatch(/application\/x-ndjson/);
    const events = ndjson(res.text);
    const progress = events.filter((e) => e.type === 'progress');
    expect(progress.length).toBeGreaterThanOrEqual(4);
    const summary = events.at(-1);
    expect(summary).toMatchObject({ type: 'summary', lines: 12_000, readings: 24_000, accepted: 23_999, duplicates: 0, quarantined: 1 });
    expect(summary.firstQuarantined).toEqual([{ index: 15, code: 'bad_value', reason: 'value: must be a finite number', line: 9 }]);
    // Etc/GMT-1 is UTC+1 (POSIX sign convention of the IANA tz database): local 00:00 is 23:00 UTC the day before.
    const first = await t.db('readings').where({ tenant_id: f.lab.id, channel_id: rhId }).orderBy('ts').first();
    expect(Number(first.ts)).toBe(Date.UTC(2025, 11, 31, 23, 0));
    expect(await t.db('readings').where({ tenant_id: f.lab.id, channel_id: rhId }).count({ n: '*' })).toEqual([{ n: 11_999 }]);
  });

  it('sending the same file again stores nothing twice', async () => {
    const body = 'channel,ts,value\nair_t,2026-02-01T00:00:00Z,1\nair_t,2026-02-01T00:01:00Z,2\n';
    const options = { format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' };
    expect(ndjson((await upload(options, body).expect(200)).text).at(-1)).toMatchObject({ accepted: 2, duplicates: 0 });
    expect(ndjson((await upload(options, body).expect(200)).text).at(-1)).toMatchObject({ accepted: 0, duplicates: 2 });
  });

  it('a quarantined upload row keeps its time as ISO UTC, so fixing only the value re-submits it at the right time', async () => {
    const options = { format: 'wide', timeColumn: 'epoch', columns: { t: 'air_t' }, timeFormat: 'epoch-s' };
    const summary = ndjson((await upload(options, 'epoch,t\n1790000000,1.5\n1790000060,oops\n').expect(200)).text).at(-1);
    expect(summary).toMatchObject({ accepted: 1, quarantined: 1 });
    const row = await t.db('quarantined_rows').where({ tenant_id: f.lab.id, source: 'upload', raw: '1790000060,oops' }).first();
    expect(row.ts_raw).toBe('2026-09-21T14:14:20.000Z'); // 1790000060 s after 1970-01-01T00:00:00Z
    expect(row.raw).toBe('1790000060,oops');
    const res = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/quarantine/resubmit`)
      .set('Cookie', cookie)
      .send({ rows: [{ id: Number(row.id), channel: row.channel_key, ts: row.ts_raw, value: 1.6 }] })
      .expect(200);
    expect(res.body.accepted).toBe(1);
    const stored = await t.db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId, ts: 1790000060_000 }).first();
    expect(stored.value).toBe(1.6);
  });

  it('reports a column that is not in the file as an error line', async () => {
    const options = { format: 'long', timeColumn: 'time', channelColumn: 'channel', valueColumn: 'value' };
    const events = ndjson((await upload(options, 'channel,ts,value\nair_t,1,2\n').expect(200)).text);
    expect(events).toEqual([
      { type: 'error', code: 'invalid_input', message: 'Time column: the file has no column "time" (its columns: channel, ts, value).' },
    ]);
  });

  it.each([
    [{ format: 'long', timeColumn: 'ts' }, 'File layout: a long file needs its channel column and its value column named.'],
    [{ format: 'wide', timeColumn: 'ts', columns: { a: null } }, 'Columns and their channels: a wide file needs at least one column stored under a channel.'],
    [{ format: 'tall', timeColumn: 'ts' }, 'File layout: must be long (one reading a line) or wide (one column a channel).'],
    [
      { format: 'long', timeColumn: 'ts', channelColumn: 'c', valueColumn: 'v', timeZone: 'Nowhere/Else' },
      'Time zone of the times: must be a time zone such as Europe/Berlin or UTC.',
    ],
  ])('refuses options %j with 400 and the exact message', async (options, message) => {
    const res = await upload(options, 'x\n').expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
  });

  it("reads a day-first export (dd.mm.yyyy, semicolons) in the logger's zone when that layout is chosen: nothing quarantined", async () => {
    const lines = ['Datum;Temp;RH'];
    for (let i = 0; i < 96; i++) {
      const minutes = i * 15;
      const hh = String(Math.floor(minutes / 60)).padStart(2, '0');
      const mm = String(minutes % 60).padStart(2, '0');
      lines.push(`25.11.2026 ${hh}:${mm};${(i % 40) / 10};${50 + (i % 7)}`);
    }
    const options = {
      format: 'wide',
      delimiter: ';',
      timeColumn: 'Datum',
      columns: { Temp: 'air_t', RH: 'rh' },
      timeFormat: 'day-first-dot',
      timeZone: 'Europe/Berlin',
    };
    const summary = ndjson((await upload(options, lines.join('\n')).expect(200)).text).at(-1);
    expect(summary).toMatchObject({ type: 'summary', lines: 96, readings: 192, accepted: 192, quarantined: 0 });
    // Europe/Berlin keeps UTC+1 in November (IANA tz database: CET after the last Sunday of October).
    const stored = await t
      .db('readings')
      .where({ tenant_id: f.lab.id, channel_id: rhId })
      .where('ts', '>=', Date.UTC(2026, 10, 24, 23, 0))
      .orderBy('ts');
    expect(stored).toHaveLength(96);
    expect(Number(stored[0].ts)).toBe(Date.UTC(2026, 10, 24, 23, 0));
    expect(Number(stored[95].ts)).toBe(Date.UTC(2026, 10, 25, 22, 45));
  });

  it('reads times with a custom pattern, and refuses a pattern it cannot read before anything is stored', async () => {
    const options = {
      format: 'long',
      timeColumn: 'ts',
      channelColumn: 'channel',
      valueColumn: 'value',
      timeFormat: 'pattern',
      timePattern: 'yyyy/MM/dd HH.mm',
      timeZone: 'UTC',
    };
    const summary = ndjson((await upload(options, 'channel,ts,value\nair_t,2026/12/01 06.30,4.5\n').expect(200)).text).at(-1);
    expect(summary).toMatchObject({ accepted: 1, quarantined: 0 });
    expect(
      await t
        .db('readings')
        .where({ tenant_id: f.lab.id, channel_id: f.ids.channelId, ts: Date.UTC(2026, 11, 1, 6, 30) })
        .first(),
    ).toMatchObject({ value: 4.5 });
    const bad = await upload({ ...options, timePattern: 'yyyy-MM-dd QQQ' }, 'channel,ts,value\nair_t,2026-12-02 Q4,1\n').expect(400);
    expect(bad.body.error.code).toBe('invalid_input');
    expect(bad.body.error.message).toMatch(/^Pattern of the times: /);
    expect(
      await t
        .db('readings')
        .where({ tenant_id: f.lab.id, channel_id: f.ids.channelId, ts: Date.UTC(2026, 11, 2) })
        .first(),
    ).toBeUndefined();
  });

  it.each([
    [
      { format: 'long', timeColumn: 'ts', channelColumn: 'c', valueColumn: 'v', timeFormat: 'pattern', timeZone: 'UTC' },
      'Pattern of the times: give the pattern of the time column, e.g. dd.MM.yyyy HH:mm.',
    ],
    [
      { format: 'long', timeColumn: 'ts', channelColumn: 'c', valueColumn: 'v', timeFormat: 'month-first-slash' },
      "Time zone of the times: these times carry no offset from UTC: name the zone they are in (usually the logger's own).",
    ],
  ])('refuses layout options %j with 400 and the exact message', async (options, message) => {
    const res = await upload(options, 'x\n').expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
  });

  it('previews how the first time texts will be stored, naming the layout that reads them, before an upload starts', async () => {
    const res = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads/time-preview`)
      .set('Cookie', cookie)
      .send({ samples: ['24.11.2026 00:00', '24.11.2026 00:15'], timeZone: 'Europe/Berlin' })
      .expect(200);
    expect(res.body).toMatchObject({ timeZone: 'Europe/Berlin', layout: 'day-first-dot', readable: true });
    // Europe/Berlin is UTC+1 in November (IANA tz database)
    expect(res.body.rows[1]).toEqual({
      row: 2,
      text: '24.11.2026 00:15',
      utc: '2026-11-23T23:15:00.000Z',
      local: '2026-11-24 00:15:00',
      problem: null,
      ambiguous: false,
    });
    const bad = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads/time-preview`)
      .set('Cookie', cookie)
      .send({ samples: [], timeZone: 'Europe/Berlin' })
      .expect(400);
    expect(bad.body.error.message).toBe('Sample times: give at least one time text.');
  });

  it('415 for a body that is not a CSV file', async () => {
    const options = { format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' };
    await upload(options, '{}', 'application/json').expect(415);
  });
});
