import { describe, expect, it } from 'vitest';
import { formatOffset, formatZoned, fromZonedInput, toZonedInput, zoneOffsetLabel, zoneOffsetMinutes } from './zoned-time.ts';

// Offsets below are the IANA time zone database's rules (tzdata, as shipped with Node's ICU):
// Europe/Berlin is UTC+1 in winter and UTC+2 from the last Sunday of March 01:00 UTC;
// Asia/Kolkata is UTC+5:30 all year; America/St_Johns is UTC−3:30 in winter.
describe('zoned time', () => {
  it('reads the offset of a zone at an instant', () => {
    expect(zoneOffsetMinutes(Date.parse('2026-01-15T12:00:00Z'), 'Europe/Berlin')).toBe(60);
    expect(zoneOffsetMinutes(Date.parse('2026-07-15T12:00:00Z'), 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMinutes(Date.parse('2026-07-15T12:00:00Z'), 'Asia/Kolkata')).toBe(330);
    expect(zoneOffsetLabel(Date.parse('2026-01-15T12:00:00Z'), 'America/St_Johns')).toBe('UTC−03:30');
    expect(formatOffset(0)).toBe('UTC+00:00');
  });

  it('formats an instant on the zone’s clock, including across the spring change', () => {
    // 2026-03-29 01:00 UTC is the change: 00:59:59 UTC is 01:59:59 CET, 01:00 UTC is 03:00 CEST.
    expect(formatZoned(Date.parse('2026-03-29T00:59:59Z'), 'Europe/Berlin', { seconds: true })).toBe('2026-03-29 01:59:59');
    expect(formatZoned(Date.parse('2026-03-29T01:00:00Z'), 'Europe/Berlin')).toBe('2026-03-29 03:00');
    expect(formatZoned(Date.parse('2026-03-29T01:00:00Z'), 'Europe/Berlin', { date: false })).toBe('03:00');
  });

  it('turns a wall-clock time typed in the zone back into the same instant', () => {
    expect(fromZonedInput('2026-01-15T13:00', 'Europe/Berlin')).toBe(Date.parse('2026-01-15T12:00:00Z'));
    expect(fromZonedInput('2026-07-15T14:00', 'Europe/Berlin')).toBe(Date.parse('2026-07-15T12:00:00Z'));
    expect(fromZonedInput('2026-07-15T17:30', 'Asia/Kolkata')).toBe(Date.parse('2026-07-15T12:00:00Z'));
    const ms = Date.parse('2026-10-02T21:17:00Z');
    expect(fromZonedInput(toZonedInput(ms, 'America/St_Johns'), 'America/St_Johns')).toBe(ms);
    expect(fromZonedInput('15.07.2026 14:00', 'Europe/Berlin')).toBeNull();
  });
});
