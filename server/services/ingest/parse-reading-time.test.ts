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
    expect(parseReadingTime(raw)).toEqual({ ok: false, reason });
  });

  it('refuses non-finite numbers and non-string, non-number values', () => {
    expect(parseReadingTime(Number.NaN).ok).toBe(false);
    expect(parseReadingTime(Infinity).ok).toBe(false);
    expect(parseReadingTime(null)).toEqual({ ok: false, reason: 'ts: missing' });
    expect(parseReadingTime({})).toEqual({ ok: false, reason: 'ts: missing' });
  });

  it('interprets local times in a named zone, including across daylight-saving changes', () => {
    // Europe/Berlin is UTC+1 in winter and UTC+2 in summer (IANA tz database).
    expect(parseReadingTime('2026-01-15T12:00:00', { timeZone: 'Europe/Berlin' })).toEqual({ ok: true, ts: Date.UTC(2026, 0, 15, 11) });
    expect(parseReadingTime('2026-07-15T12:00:00', { timeZone: 'Europe/Berlin' })).toEqual({ ok: true, ts: Date.UTC(2026, 6, 15, 10) });
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
