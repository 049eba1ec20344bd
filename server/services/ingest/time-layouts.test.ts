import { describe, expect, it } from 'vitest';
import { compilePattern, parseWithLayout, type TimeLayout } from './time-layouts.ts';

const custom = (pattern: string): TimeLayout => {
  const c = compilePattern(pattern);
  if ('error' in c) throw new Error(c.error);
  return { custom: c };
};
const ok = (ts: number) => ({ ok: true, ts });

// Europe/Berlin is UTC+1 in winter (CET) and UTC+2 in summer (CEST), America/New_York UTC−5 (EST)
// and UTC−4 (EDT), IANA tz database. Instants marked "python" were checked on this machine with
// /usr/bin/python3 zoneinfo.
const BERLIN = 'Europe/Berlin';
const NY = 'America/New_York';
const NOV24_MIDNIGHT_BERLIN = Date.UTC(2026, 10, 23, 23); // python: 1795474800000

describe('parseWithLayout: each built-in layout', () => {
  it.each<[string, TimeLayout, string, number]>([
    ['iso local', 'iso', '2026-11-24T00:00:00', NOV24_MIDNIGHT_BERLIN],
    ['iso local with milliseconds', 'iso', '2026-11-24T00:00:00.250', NOV24_MIDNIGHT_BERLIN + 250],
    ['iso local, space, no seconds', 'iso', '2026-11-24 00:00', NOV24_MIDNIGHT_BERLIN],
    ['iso with offset (zone ignored)', 'iso', '2026-11-24T00:00:00+05:30', Date.UTC(2026, 10, 23, 18, 30)],
    ['iso Z', 'iso', '2026-11-24T00:00:00.250Z', Date.UTC(2026, 10, 24, 0, 0, 0, 250)],
    ['day-first dot', 'day-first-dot', '24.11.2026 00:00', NOV24_MIDNIGHT_BERLIN],
    ['day-first dot, seconds, one-digit fields', 'day-first-dot', '3.4.2026 7:05:09', Date.UTC(2026, 3, 3, 5, 5, 9)],
    ['day-first slash', 'day-first-slash', '24/11/2026 00:00:00', NOV24_MIDNIGHT_BERLIN],
    ['month-first slash', 'month-first-slash', '11/24/2026 00:00', NOV24_MIDNIGHT_BERLIN],
    ['month-first 12h AM', 'month-first-slash-12h', '11/24/2026 12:00 AM', NOV24_MIDNIGHT_BERLIN],
    ['month-first 12h PM', 'month-first-slash-12h', '11/24/2026 01:30:15 pm', Date.UTC(2026, 10, 24, 12, 30, 15)],
    ['day-first 12h noon', 'day-first-slash-12h', '24/11/2026 12:00 PM', Date.UTC(2026, 10, 24, 11)],
    ['epoch seconds', 'epoch-s', '1795474800', NOV24_MIDNIGHT_BERLIN],
    ['epoch milliseconds', 'epoch-ms', '1795474800000', NOV24_MIDNIGHT_BERLIN],
    // 46350 = 2026-11-24 in the 1900 system (python: date(1899,12,30)+timedelta(46350))
    ['serial day', 'serial-1900', '46350', NOV24_MIDNIGHT_BERLIN],
    ['serial day with time', 'serial-1900', '46350.75', Date.UTC(2026, 10, 24, 17)],
  ])('%s', (_name, layout, text, ts) => {
    expect(parseWithLayout(text, layout, BERLIN)).toEqual(ok(ts));
  });

  it('reads a custom LDML pattern with quoted literals and milliseconds', () => {
    const layout = custom("yyyy'-W'MM'd'dd'T'HH.mm.ss,SSS");
    expect(parseWithLayout('2026-W07d04T15.45.30,125', layout, NY)).toEqual(ok(Date.UTC(2026, 6, 4, 19, 45, 30, 125))); // python: 1783194330000 + 125
    expect(parseWithLayout("04-07-26 3:45 PM o'clock", custom("dd-MM-yy h:mm a 'o''clock'"), NY)).toEqual(ok(Date.UTC(2026, 6, 4, 19, 45)));
  });
});

describe('parseWithLayout: spreadsheet serial days (1900 system)', () => {
  // ECMA-376 1st edition Part 4 §3.17.4.1 "Date Representation" (Part 1 §18.17.4.1 in later
  // editions): serial 1 = 1900-01-01, 59 = 1900-02-28, 60 the non-existent 1900-02-29, 61 =
  // 1900-03-01, upper limit 2958465 = 9999-12-31, and its worked examples 03-Feb-1910 = 3687 and
  // 01-Feb-2006 = 38749. 36526 = 2000-01-01 is the widely quoted value (from memory); all also
  // checked with python date(1899,12,30)+timedelta(serial) for serials above 60.
  it.each([
    ['1', Date.UTC(1900, 0, 1)],
    ['59', Date.UTC(1900, 1, 28)],
    ['61', Date.UTC(1900, 2, 1)],
    ['3687', Date.UTC(1910, 1, 3)],
    ['38749', Date.UTC(2006, 1, 1)],
    ['36526', Date.UTC(2000, 0, 1)],
    ['45658.5', Date.UTC(2025, 0, 1, 12)],
    ['2958465', Date.UTC(9999, 11, 31)],
  ])('serial %s', (text, ts) => {
    expect(parseWithLayout(text, 'serial-1900', 'UTC')).toEqual(ok(ts));
  });

  it('refuses the phantom 1900-02-29, serials below 1 and past 9999-12-31', () => {
    expect(parseWithLayout('60', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'bad_time', reason: expect.stringMatching(/^ts: .*1900-02-29/) });
    expect(parseWithLayout('60.5', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'bad_time' });
    expect(parseWithLayout('0.5', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'bad_time', reason: expect.stringContaining('start at 1') });
    expect(parseWithLayout('2958466', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'time_out_of_range' });
    expect(parseWithLayout('-3', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'bad_time' });
    expect(parseWithLayout('1e5', 'serial-1900', 'UTC')).toMatchObject({ ok: false, code: 'bad_time' });
  });
});

describe('parseWithLayout: daylight-saving gaps and overlaps (IANA tz database rules)', () => {
  // EU: last Sunday of March/October at 01:00 UTC; US: second Sunday of March / first Sunday
  // of November at 02:00 local. Gap times are refused; a repeated hour takes its first occurrence.
  it.each<[string, TimeLayout, string]>([
    [BERLIN, 'day-first-dot', '29.03.2026 02:30'],
    [BERLIN, 'iso', '2026-03-29T02:30:00'],
    [BERLIN, 'serial-1900', '46110.10416666667'], // 2026-03-29 02:30 (python: date(1899,12,30)+46110 days)
    [NY, 'month-first-slash', '03/08/2026 02:30'],
    [NY, 'month-first-slash-12h', '03/08/2026 02:30 AM'],
    [NY, 'iso', '2026-03-08 02:30'],
  ])('%s refuses %s %s (skipped by the spring change)', (zone, layout, text) => {
    expect(parseWithLayout(text, layout, zone)).toEqual({
      ok: false,
      code: 'bad_time',
      reason: `ts: "${text}" does not exist in ${zone} (daylight-saving change)`,
    });
  });

  it.each<[string, TimeLayout, string, number]>([
    [BERLIN, 'day-first-dot', '25.10.2026 02:30', Date.UTC(2026, 9, 25, 0, 30)], // python fold=0: 1792888200000
    [BERLIN, 'iso', '2026-10-25T02:30', Date.UTC(2026, 9, 25, 0, 30)],
    [BERLIN, 'day-first-dot', '25.10.2026 03:00', Date.UTC(2026, 9, 25, 2, 0)], // python: 1792893600000
    [NY, 'month-first-slash-12h', '11/01/2026 01:30 AM', Date.UTC(2026, 10, 1, 5, 30)], // python fold=0: 1793511000000
    [NY, 'iso', '2026-11-01T01:30', Date.UTC(2026, 10, 1, 5, 30)],
    [NY, 'month-first-slash', '11/01/2026 02:00', Date.UTC(2026, 10, 1, 7, 0)], // python: 1793516400000
  ])('%s reads %s %s as its first occurrence', (zone, layout, text, ts) => {
    expect(parseWithLayout(text, layout, zone)).toEqual(ok(ts));
  });
});

describe('parseWithLayout: bad and out-of-range input', () => {
  it.each<[TimeLayout, string, RegExp]>([
    ['day-first-dot', '32.01.2026 00:00', /^ts: .*day 32 is not in 2026-01/],
    ['day-first-dot', '29.02.2026 00:00', /day 29 is not in 2026-02/],
    ['day-first-slash', '12/13/2026 00:00', /month 13 is not 1–12/],
    ['month-first-slash', '01/02/2026 24:00', /hour 24 is not 0–23/],
    ['day-first-dot', '01.02.2026 10:60', /minute 60 is not 0–59/],
    ['day-first-dot', '01.02.2026 10:59:60', /second 60 is not 0–59/],
    ['month-first-slash-12h', '01/02/2026 13:00 PM', /hour 13 is not 1–12/],
    ['month-first-slash-12h', '01/02/2026 00:30 AM', /hour 0 is not 1–12/],
    ['month-first-slash-12h', '01/02/2026 10:00', /does not match the pattern M\/d\/yyyy h:mm:ss a/],
    ['day-first-dot', '2026-11-24 00:00', /does not match/],
    ['iso', '24.11.2026 00:00', /^ts: .*not an ISO 8601 time/],
    ['iso', '2026-11-24T00:00+25:00', /not a valid UTC offset/],
    ['iso', '2026-02-30T00:00', /not a valid date and time/],
    ['epoch-s', '24.11.2026', /not an epoch time/],
    ['epoch-ms', '1795474800.5', /not whole epoch milliseconds/],
  ])('%s refuses %s', (layout, text, reason) => {
    const r = parseWithLayout(text, layout, BERLIN);
    expect(r).toMatchObject({ ok: false, code: 'bad_time' });
    expect(r.ok ? '' : r.reason).toMatch(reason);
  });

  it('refuses blank text and epoch values beyond what a Date holds (±8.64e15 ms, ECMA-262 §21.4.1.1)', () => {
    expect(parseWithLayout('  ', 'iso', BERLIN)).toEqual({ ok: false, code: 'bad_time', reason: 'ts: missing' });
    expect(parseWithLayout('8640000000001', 'epoch-s', BERLIN)).toMatchObject({ ok: false, code: 'time_out_of_range' });
    expect(parseWithLayout('8640000000000001', 'epoch-ms', BERLIN)).toMatchObject({ ok: false, code: 'time_out_of_range' });
  });

  it('refuses an unknown layout name instead of throwing', () => {
    expect(parseWithLayout('1', 'nope' as TimeLayout, BERLIN)).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/^layout: "nope" is not a known layout/),
    });
  });
});
