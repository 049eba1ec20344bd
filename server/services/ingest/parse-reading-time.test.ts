import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseReadingTime } from './parse-reading-time.ts';

// Expected epoch values computed from the ISO 8601 / RFC 3339 definitions (offset = local − UTC).
describe('parseReadingTime', () => {
  it.each([
    ['2026-03-01T06:00:00Z', Date.UTC(2026, 2, 1, 6)],
    ['2026-03-01T06:00:00+01:00', Date.UTC(2026, 2, 1, 5)],
    ['2026-03-01T06:00:00-0530', Date.UTC(2026, 2, 1, 11, 30)],
    ['2026-03-01 06:00Z', Date.UTC(2026, 2, 1, 6)],
    ['2026-03-01T06:00:00.123456Z', Date.UTC(2026, 2, 1, 6, 0, 0, 123)],
    ['2024-02-29T00:00:00Z', Date.UTC(2024, 1, 29)],
    ['1790000000000', 1790000000000],
  ])('reads %s', (raw, ts) => {
    expect(parseReadingTime(raw)).toEqual({ ok: true, ts });
  });

  it('reads epoch milliseconds given as a JSON number', () => {
    expect(parseReadingTime(1790000000123)).toEqual({ ok: true, ts: 1790000000123 });
  });

  it.each([
    ['2026-03-01T06:00:00', 'ts: "2026-03-01T06:00:00" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds)'],
    ['2025-02-29T00:00:00Z', 'ts: "2025-02-29T00:00:00Z" is not a valid date and time'],
    ['2026-13-01T00:00:00Z', 'ts: "2026-13-01T00:00:00Z" is not a valid date and time'],
    ['yesterday', 'ts: "yesterday" is not an ISO 8601 time or epoch milliseconds'],
    ['', 'ts: missing'],
  ])('refuses %j with a reason', (raw, reason) => {
    expect(parseReadingTime(raw)).toEqual({ ok: false, code: 'bad_time', reason });
  });

  // ECMA-262 §21.4.1.1: a Date holds ±8.64e15 ms; beyond that `new Date(t).toISOString()` throws.
  it.each([
    [1796303000000000000, '1796303000000000000'], // nanoseconds since the epoch, a common logger mistake
    [1e16, '10000000000000000'],
    [1e300, '1e+300'],
    [-1e16, '-10000000000000000'],
    ['9999999999999999', '9999999999999999'],
    ['1796303000000000000', '1796303000000000000'],
    ['8640000000000001', '8640000000000001'],
  ])('refuses %j as time_out_of_range, naming the text sent', (raw, sent) => {
    expect(parseReadingTime(raw)).toEqual({
      ok: false,
      code: 'time_out_of_range',
      reason: `ts: "${sent}" is beyond the times that can be stored (±8.64e15 ms from 1970, about ±273,000 years)`,
    });
  });

  it('keeps the outermost representable times', () => {
    expect(parseReadingTime(8.64e15)).toEqual({ ok: true, ts: 8.64e15 });
    expect(parseReadingTime('-8640000000000000')).toEqual({ ok: true, ts: -8.64e15 });
    expect(parseReadingTime('1e+16', { format: 'epoch-s' }).ok).toBe(false);
    expect(parseReadingTime(1e13, { format: 'epoch-s' })).toMatchObject({ ok: false, code: 'time_out_of_range' });
  });

  it('refuses fractional epoch milliseconds, sent as a number or as text alike', () => {
    expect(parseReadingTime(1796303000000.7)).toEqual({ ok: false, code: 'bad_time', reason: 'ts: 1796303000000.7 is not whole epoch milliseconds' });
    expect(parseReadingTime('1796303000003.5')).toEqual({ ok: false, code: 'bad_time', reason: 'ts: "1796303000003.5" is not whole epoch milliseconds' });
    expect(parseReadingTime(1796303000000.7, { format: 'epoch-ms' }).ok).toBe(false);
  });

  // ISO 8601-1:2019 §4.2.5.1: offset hours 00–23, minutes 00–59; offsets in use run from
  // −12:00 to +14:00 (IANA tz database: Etc/GMT+12 … Pacific/Kiritimati).
  it.each([
    ['2026-03-01T06:00:00+99:99', 'offset "+99:99" is not a valid UTC offset (hours 00–23, minutes 00–59)'],
    ['2026-03-01T06:00:00+2400', 'offset "+2400" is not a valid UTC offset (hours 00–23, minutes 00–59)'],
    ['2026-03-01T06:00:00+01:60', 'offset "+01:60" is not a valid UTC offset (hours 00–23, minutes 00–59)'],
    ['2026-03-01T06:00:00-23:59', 'offset "-23:59" is outside the UTC offsets in use (−12:00 to +14:00)'],
    ['2026-03-01T06:00:00+14:01', 'offset "+14:01" is outside the UTC offsets in use (−12:00 to +14:00)'],
    ['2026-03-01T06:00:00-12:01', 'offset "-12:01" is outside the UTC offsets in use (−12:00 to +14:00)'],
  ])('refuses the offset of %s', (raw, why) => {
    expect(parseReadingTime(raw)).toEqual({ ok: false, code: 'bad_time', reason: `ts: "${raw}": ${why}` });
  });

  it('accepts the outermost offsets in use', () => {
    expect(parseReadingTime('2026-03-01T14:00:00+14:00')).toEqual({ ok: true, ts: Date.UTC(2026, 2, 1, 0) });
    expect(parseReadingTime('2026-03-01T00:00:00-12:00')).toEqual({ ok: true, ts: Date.UTC(2026, 2, 1, 12) });
    expect(parseReadingTime('2026-03-01T05:45:00+0545')).toEqual({ ok: true, ts: Date.UTC(2026, 2, 1, 0) });
  });

  it('reads years below 100 as written, not as 19xx', () => {
    // Proleptic Gregorian: 0070-01-01 is 1900 years before 1970-01-01 (common practice: Date.UTC maps 0–99 to 1900–1999).
    const ts = parseReadingTime('0070-01-01T00:00:00Z');
    expect(ts.ok && ts.ts).toBe(new Date('0070-01-01T00:00:00Z').getTime());
    expect(ts.ok && ts.ts).toBeLessThan(0);
    expect(parseReadingTime('0004-02-29T00:00:00Z').ok).toBe(true); // year 4 is a leap year
    expect(parseReadingTime('0100-02-29T00:00:00Z').ok).toBe(false); // year 100 is not
  });

  it('refuses non-finite numbers and non-string, non-number values', () => {
    expect(parseReadingTime(Number.NaN).ok).toBe(false);
    expect(parseReadingTime(Infinity).ok).toBe(false);
    expect(parseReadingTime(null)).toEqual({ ok: false, code: 'bad_time', reason: 'ts: missing' });
    expect(parseReadingTime({})).toEqual({ ok: false, code: 'bad_time', reason: 'ts: missing' });
  });

  it('interprets local times in a named zone, including across daylight-saving changes', () => {
    // Europe/Berlin is UTC+1 in winter and UTC+2 in summer (IANA tz database).
    expect(parseReadingTime('2026-01-15T12:00:00', { timeZone: 'Europe/Berlin' })).toEqual({ ok: true, ts: Date.UTC(2026, 0, 15, 11) });
    expect(parseReadingTime('2026-07-15T12:00:00', { timeZone: 'Europe/Berlin' })).toEqual({ ok: true, ts: Date.UTC(2026, 6, 15, 10) });
    // 2026-10-25 02:30 happens twice in Berlin (clocks go back from 03:00 CEST to 02:00 CET at 01:00 UTC):
    // the first occurrence, 00:30 UTC (checked: `TZ=Europe/Berlin date -d '2026-10-25 02:30 CEST' -u` → 00:30 UTC).
    expect(parseReadingTime('2026-10-25T02:30:00', { timeZone: 'Europe/Berlin' })).toEqual({ ok: true, ts: Date.UTC(2026, 9, 25, 0, 30) });
    // the same rule west of UTC: 2026-11-01 01:30 in New York is first 05:30 UTC (EDT), then 06:30 (EST)
    expect(parseReadingTime('2026-11-01T01:30:00', { timeZone: 'America/New_York' })).toEqual({ ok: true, ts: Date.UTC(2026, 10, 1, 5, 30) });
    // 2026-03-29 02:30 does not exist in Berlin (clocks jump from 02:00 to 03:00).
    expect(parseReadingTime('2026-03-29T02:30:00', { timeZone: 'Europe/Berlin' }).ok).toBe(false);
  });

  it('reads epoch seconds when told to', () => {
    expect(parseReadingTime('1790000000', { format: 'epoch-s' })).toEqual({ ok: true, ts: 1790000000000 });
    expect(parseReadingTime('1790000000.5', { format: 'epoch-s' })).toEqual({ ok: true, ts: 1790000000500 });
  });

  it('agrees with Date for every instant written as ISO 8601 UTC (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 4_102_444_800_000 }), (ms) => {
        expect(parseReadingTime(new Date(ms).toISOString())).toEqual({ ok: true, ts: ms });
      }),
    );
  });
});
