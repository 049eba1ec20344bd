/**
 * The channel browser API on the real MariaDB: overview (status, sparkline, bounded queries),
 * detail, the downsampled series and the readings export. Readings go in through the real
 * ingest endpoint, so rollups and channel state are the ones ingestion keeps. The readings are
 * simulated (behaviour checks); expected values are computed here from the readings posted.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

const MIN = 60_000;
const HOUR = 3_600_000;

interface Reading {
  channel: string;
  ts: number;
  value: number;
}

/** A lab with one channel and a scientist; on the largest plan unless `freePlan` (the readings here reach back years). */
async function setup(opts: { freePlan?: boolean } = {}): Promise<{ f: LabWithEverything; cookie: string; base: string }> {
  const f = await buildLabWithEverything(t.db);
  if (!opts.freePlan) await onLargestPlan(t.db, f.lab.id);
  const scientist = await buildMember(t.db, f.lab, { role: 'scientist' });
  return { f, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, scientist.id), base: `/api/v1/labs/${f.lab.slug}` };
}

async function ingest(f: LabWithEverything, readings: Reading[]) {
  for (let i = 0; i < readings.length; i += 5000) {
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .send({ readings: readings.slice(i, i + 5000) })
      .expect(200);
  }
}

const get = (cookie: string, path: string) => request(t.app).get(path).set('Cookie', cookie);

describe('GET /channels (overview)', () => {
  it('shows no-data, then live with the last reading and hourly-mean sparkline, then out-of-range and silent', async () => {
    const { f, cookie, base } = await setup();
    let res = await get(cookie, `${base}/channels`).expect(200);
    expect(res.body.channels).toHaveLength(1);
    expect(res.body.channels[0]).toMatchObject({
      id: f.ids.channelId,
      key: 'air_t',
      status: 'no-data',
      lastReading: null,
      statusIntervalS: 60,
      dataVersion: 0,
    });
    expect(res.body.channels[0].logger).toMatchObject({ id: f.ids.loggerId, timezone: 'UTC' });
    expect(res.body.channels[0].sparkline.means).toEqual(new Array(24).fill(null));

    // Readings every minute over the last 3 hours, up to one minute ago.
    const now = Date.now();
    const readings = Array.from({ length: 180 }, (_, i) => ({ channel: 'air_t', ts: now - MIN - (179 - i) * MIN, value: 20 + Math.sin(i / 9) }));
    await ingest(f, readings);
    res = await get(cookie, `${base}/channels`).expect(200);
    const row = res.body.channels[0];
    const last = readings[readings.length - 1];
    expect(row).toMatchObject({ status: 'live', lastReading: { ts: last.ts, value: last.value, time: new Date(last.ts).toISOString() }, dataVersion: 1 });
    // Expected sparkline: the mean of the readings of each of the 24 hours ending with the current one.
    const startHour = Math.floor(res.body.now / HOUR) * HOUR - 23 * HOUR;
    const expected = Array.from({ length: 24 }, (_, h) => {
      const inHour = readings.filter((r) => r.ts >= startHour + h * HOUR && r.ts < startHour + (h + 1) * HOUR);
      return inHour.length ? inHour.reduce((s, r) => s + r.value, 0) / inHour.length : null;
    });
    expect(row.sparkline.startHour).toBe(startHour);
    row.sparkline.means.forEach((m: number | null, h: number) => {
      if (expected[h] === null) expect(m).toBeNull();
      else expect(m).toBeCloseTo(expected[h]!, 10);
    });

    // A valid range below the last value → out of range.
    await t.db('channels').where({ tenant_id: f.lab.id, id: f.ids.channelId }).update({ valid_min: 0, valid_max: 19 });
    res = await get(cookie, `${base}/channels`).expect(200);
    expect(res.body.channels[0].status).toBe('out-of-range');

    // The channel's own interval (20 s) makes the 1-minute-old reading overdue: silent wins.
    await t.db('channels').where({ tenant_id: f.lab.id, id: f.ids.channelId }).update({ expected_interval_s: 20 });
    res = await get(cookie, `${base}/channels`).expect(200);
    expect(res.body.channels[0]).toMatchObject({ status: 'silent', statusIntervalS: 20 });
  });

  it('keeps the last reading from moving backwards; the version rises only when something new is stored', async () => {
    const { f, cookie, base } = await setup();
    const now = Date.now();
    await ingest(f, [{ channel: 'air_t', ts: now - 2 * MIN, value: 5 }]);
    await ingest(f, [{ channel: 'air_t', ts: now - 30 * MIN, value: 7 }]); // older, but new
    await ingest(f, [{ channel: 'air_t', ts: now - 30 * MIN, value: 7 }]); // a re-sent batch
    await ingest(f, [{ channel: 'air_t', ts: now - 2 * MIN, value: 8 }]); // conflicts: stored value kept
    const res = await get(cookie, `${base}/channels/${f.ids.channelId}`).expect(200);
    expect(res.body.channel).toMatchObject({
      lastReading: { ts: now - 2 * MIN, value: 5 },
      dataVersion: 2,
      readingCount: 2,
      firstReading: { ts: now - 30 * MIN },
    });
  });

  it('answers with the same number of database statements for 1 channel and for 7', async () => {
    const one = await setup();
    const many = await setup();
    for (let i = 0; i < 6; i++) {
      await request(t.app)
        .post(`${many.base}/loggers/${many.f.ids.loggerId}/channels`)
        .set('Cookie', await sessionCookieFor(t.db, t.config.sessionSecret, many.f.founder.id))
        .send({ key: `ch${i}`, label: `Channel ${i}` })
        .expect(201);
    }
    await ingest(
      many.f,
      Array.from({ length: 6 }, (_, i) => ({ channel: `ch${i}`, ts: Date.now() - MIN, value: i })),
    );
    const count = async (s: { cookie: string; base: string }) => {
      let statements = 0;
      const onQuery = () => statements++;
      t.db.on('query', onQuery);
      const res = await get(s.cookie, `${s.base}/channels`).expect(200);
      t.db.removeListener('query', onQuery);
      return { statements, channels: res.body.channels.length };
    };
    // Ingestion's after-commit work (the usage counter, the alert nudge 250 ms later) runs on the
    // same database; let it finish so that only the overview's own statements are counted.
    const quiet = async () => {
      let last = Date.now();
      const onQuery = () => (last = Date.now());
      t.db.on('query', onQuery);
      for (const give = Date.now() + 10_000; Date.now() - last < 600 && Date.now() < give;) await new Promise((r) => setTimeout(r, 50));
      t.db.removeListener('query', onQuery);
    };
    await quiet();
    const a = await count(one);
    const b = await count(many);
    expect(a.channels).toBe(1);
    expect(b.channels).toBe(7);
    expect(b.statements).toBe(a.statements);
  });
});

describe('GET /channels/:channelId/series', () => {
  it('returns raw readings when the range holds at most `points`, with a null where readings stop for a while', async () => {
    const { f, cookie, base } = await setup();
    const t0 = Date.UTC(2026, 1, 1);
    const readings = [0, 1, 2, 3, 10, 11].map((m) => ({ channel: 'air_t', ts: t0 + m * MIN, value: m }));
    await ingest(f, readings);
    const res = await get(cookie, `${base}/channels/${f.ids.channelId}/series?from=${t0}&to=${t0 + HOUR}&points=10`).expect(200);
    // Gap marker 3 expected intervals (3 min) after the reading before the gap.
    expect(res.body.series).toEqual({
      shape: 'readings',
      source: 'raw',
      resolutionS: null,
      bucketMs: null,
      from: t0,
      to: t0 + HOUR,
      t: [0, 1, 2, 3, 6, 10, 11].map((m) => t0 + m * MIN),
      value: [0, 1, 2, 3, null, 10, 11],
    });
  });

  it('downsamples 3 days of 1-minute readings from hourly rollups, keeps an injected spike and returns empty buckets as null', async () => {
    const { f, cookie, base } = await setup();
    const t0 = Date.UTC(2026, 1, 1);
    const spikeAt = t0 + 50 * HOUR + 17 * MIN;
    const readings: Reading[] = [];
    for (let m = 0; m < 3 * 24 * 60; m++) {
      const ts = t0 + m * MIN;
      if (ts >= t0 + 20 * HOUR && ts < t0 + 26 * HOUR) continue; // a 6-hour outage
      readings.push({ channel: 'air_t', ts, value: ts === spikeAt ? 999 : 10 + Math.sin(m / 60) });
    }
    await ingest(f, readings);
    const to = t0 + 72 * HOUR;
    const res = await get(
      cookie,
      `${base}/channels/${f.ids.channelId}/series?from=${new Date(t0).toISOString()}&to=${new Date(to).toISOString()}&points=100`,
    ).expect(200);
    const s = res.body.series;
    // 72 h over 50 buckets is 86.4 min: the hourly rollups are the coarsest fine enough; width rounds up to 2 h.
    expect(s).toMatchObject({ shape: 'buckets', source: 'rollup', resolutionS: 3600, bucketMs: 2 * HOUR, from: t0, to });
    expect(s.t).toHaveLength(36);
    for (let i = 0; i < 36; i++) {
      const inBucket = readings.filter((r) => r.ts >= s.t[i] && r.ts < s.t[i] + 2 * HOUR);
      if (inBucket.length === 0) {
        expect([s.min[i], s.max[i], s.mean[i], s.count[i]]).toEqual([null, null, null, 0]);
        continue;
      }
      expect(s.min[i]).toBe(Math.min(...inBucket.map((r) => r.value)));
      expect(s.max[i]).toBe(Math.max(...inBucket.map((r) => r.value)));
      expect(s.count[i]).toBe(inBucket.length);
      expect(s.mean[i]).toBeCloseTo(inBucket.reduce((a, r) => a + r.value, 0) / inBucket.length, 9);
    }
    expect(s.min.filter((v: number | null) => v === null)).toHaveLength(3); // 20:00–26:00
    expect(Math.max(...s.max.filter((v: number | null) => v !== null))).toBe(999);
    expect(s.max[Math.floor((spikeAt - t0) / (2 * HOUR))]).toBe(999);
  });

  it('summarises raw readings when buckets are shorter than a minute', async () => {
    const { f, cookie, base } = await setup();
    const t0 = Date.UTC(2026, 1, 2);
    await ingest(
      f,
      Array.from({ length: 300 }, (_, i) => ({ channel: 'air_t', ts: t0 + i * 1000, value: i })),
    );
    const res = await get(cookie, `${base}/channels/${f.ids.channelId}/series?from=${t0}&to=${t0 + 300_000}&points=20`).expect(200);
    expect(res.body.series).toMatchObject({ shape: 'buckets', source: 'raw', resolutionS: null, bucketMs: 30_000 });
    expect(res.body.series.min.slice(0, 3)).toEqual([0, 30, 60]);
    expect(res.body.series.max.slice(0, 3)).toEqual([29, 59, 89]);
  });

  it('400 with exact messages for a bad range or point count; 404 for an unknown channel', async () => {
    const { cookie, base, f } = await setup();
    const path = `${base}/channels/${f.ids.channelId}/series`;
    const cases: Array<[string, string]> = [
      ['?from=2000&to=1000', 'To: must be after the start of the range.'],
      ['?from=2026-01-01T00:00:00Z&to=2026-01-01T00:00:00Z', 'To: must be after the start of the range.'],
      ['?from=0&to=700000000000', 'To: the range must be at most 20 years.'],
      ['?from=yesterday&to=1000', 'From: must be a date and time with its zone, e.g. 2026-03-01T00:00:00Z, or milliseconds since 1970.'],
      ['?from=2026-01-01T00:00:00&to=1000', 'From: must be a date and time with its zone, e.g. 2026-03-01T00:00:00Z, or milliseconds since 1970.'],
      ['?points=9', 'Points on the chart: must be at least 10.'],
      ['?points=10001', 'Points on the chart: must be at most 10,000.'],
      ['?points=2.5', 'Points on the chart: must be a whole number.'],
    ];
    for (const [query, message] of cases) {
      const res = await get(cookie, path + query).expect(400);
      expect(res.body.error, query).toMatchObject({ code: 'invalid_input', message });
    }
    const missing = await get(cookie, `${base}/channels/999999999999/series`).expect(404);
    expect(missing.body.error).toEqual({ code: 'not_found', message: 'No such channel in this lab.' });
  });
});

describe('GET /channels/:channelId/readings.csv', () => {
  it('streams the range as RFC 4180 CSV with ISO UTC and epoch-ms times', async () => {
    const { f, cookie, base } = await setup();
    const t0 = Date.UTC(2026, 2, 1);
    await ingest(
      f,
      Array.from({ length: 25_000 }, (_, i) => ({ channel: 'air_t', ts: t0 + i * 1000, value: i / 4 })),
    );
    const res = await get(cookie, `${base}/channels/${f.ids.channelId}/readings.csv?from=${t0 + 1000}&to=${t0 + 24_001_000}`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${f.lab.slug}-air_t-readings.csv"`);
    const lines = res.text.split('\r\n');
    // the fixture's logger is on UTC: the last column is the same time on its clock
    expect(lines[0]).toBe('time_utc,epoch_ms,value,time_local_UTC');
    expect(lines[1]).toBe(`2026-03-01T00:00:01.000Z,${t0 + 1000},0.25,2026-03-01T00:00:01.000+00:00`);
    expect(lines).toHaveLength(1 + 24_000 + 1); // header, rows across three pages, final CRLF
    expect(lines[24_000]).toBe(`${new Date(t0 + 24_000_000).toISOString()},${t0 + 24_000_000},6000,2026-03-01T06:40:00.000+00:00`);
    expect(lines[24_001]).toBe('');
  });

  it('is refused to guests (403) and answers 400 for a bad range', async () => {
    const { f, base } = await setup();
    const guestCookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);
    await get(guestCookie, `${base}/channels/${f.ids.channelId}/readings.csv`).expect(403);
    const founderCookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    const res = await get(founderCookie, `${base}/channels/${f.ids.channelId}/readings.csv?from=5&to=5`).expect(400);
    expect(res.body.error.message).toBe('To: must be after the start of the range.');
  });
});

describe("the plan's history window", () => {
  const DAY = 24 * HOUR;
  it('shows a free-plan lab its last historyDays only: older readings are kept, cut from charts and exports, and come back on a larger plan', async () => {
    const { f, cookie, base } = await setup({ freePlan: true });
    const historyDays = 90; // tenants/plans.json: the free plan's historyDays
    const now = Date.now();
    const old = now - 120 * DAY; // stored, but before the free plan's window
    const recent = now - 10 * DAY;
    await ingest(f, [
      { channel: 'air_t', ts: old, value: 11.5 },
      { channel: 'air_t', ts: recent, value: 12.5 },
    ]);

    // A range reaching back past the window is cut at its start, and the answer says where.
    const range = `from=${now - 200 * DAY}&to=${now}`;
    let csv = await get(cookie, `${base}/channels/${f.ids.channelId}/readings.csv?${range}`).expect(200);
    const starts = Date.parse(csv.headers['lagbook-history-starts']);
    expect(Math.abs(starts - (now - historyDays * DAY))).toBeLessThan(60_000);
    expect(csv.text).toContain(new Date(recent).toISOString());
    expect(csv.text).not.toContain(new Date(old).toISOString());
    const series = await get(cookie, `${base}/channels/${f.ids.channelId}/series?${range}&points=100`).expect(200);
    expect(Math.abs(Date.parse(series.headers['lagbook-history-starts']) - starts)).toBeLessThan(60_000); // the window moves with the clock
    expect(series.body.series.from).toBeGreaterThanOrEqual(Math.floor(starts / HOUR) * HOUR - DAY);
    expect(Math.abs(series.body.historyStartsAt - starts)).toBeLessThan(60_000);
    expect(series.body.requested.from).toBe(now - 200 * DAY);

    // A range wholly before the window is refused with a reason, not answered as empty.
    const before = await get(cookie, `${base}/channels/${f.ids.channelId}/readings.csv?from=${old - DAY}&to=${old + DAY}`).expect(402);
    expect(before.body.error.code).toBe('outside_plan_history');
    expect(before.body.error.message).toContain('kept, not deleted');

    // Nothing was deleted: on the largest plan the old reading is there again.
    await onLargestPlan(t.db, f.lab.id);
    csv = await get(cookie, `${base}/channels/${f.ids.channelId}/readings.csv?${range}`).expect(200);
    expect(csv.headers['lagbook-history-starts']).toBeUndefined();
    expect((await get(cookie, `${base}/channels/${f.ids.channelId}/series?${range}&points=100`).expect(200)).body.historyStartsAt).toBeNull();
    expect(csv.text).toContain(new Date(old).toISOString());
  });
});
