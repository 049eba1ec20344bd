import { describe, expect, it } from 'vitest';
import {
  formatInstant,
  formatOffset,
  formatZoned,
  instantMs,
  relativeText,
  toZonedInput,
  zoneCaption,
  zoneLabel,
  zoneOffsetLabel,
  zoneOffsetMinutes,
} from './format.ts';

// Check values: the IANA time zone database's rules (tzdata, as shipped with Node's ICU).
// - Europe/Berlin: UTC+1 in winter, UTC+2 in summer; the change is at 01:00 UTC on the last
//   Sunday of March and of October (EU Directive 2000/84/EC, arts. 2–3): 2026-03-29, 2026-10-25.
// - America/New_York: UTC−5 / UTC−4; the change is at 02:00 local on the second Sunday of March
//   and the first Sunday of November (US Energy Policy Act of 2005, §110): 2026-03-08, 2026-11-01.
// - Asia/Kolkata UTC+5:30 all year; Asia/Kathmandu UTC+5:45; America/St_Johns UTC−3:30 in
//   winter; Pacific/Auckland UTC+13 in (southern) summer — tzdata.
const at = (iso: string) => Date.parse(iso);

describe('formatInstant: one display form', () => {
  it('writes 24-hour ISO-like text with the zone named by its offset', () => {
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'Europe/Berlin')).toBe('2026-12-03 14:00 UTC+01:00');
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'UTC')).toBe('2026-12-03 13:00 UTC');
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'Etc/UTC')).toBe('2026-12-03 13:00 UTC');
    // An afternoon hour is never written as 1:00 PM.
    expect(formatInstant(at('2026-12-03T13:05:09Z'), 'UTC', { seconds: true })).toBe('2026-12-03 13:05:09 UTC');
  });

  it('handles zones on both sides of UTC, across the date line', () => {
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'Pacific/Auckland')).toBe('2026-12-04 02:00 UTC+13:00');
    expect(formatInstant(at('2026-12-03T03:00:00Z'), 'America/Los_Angeles')).toBe('2026-12-02 19:00 UTC−08:00');
  });

  it('handles half- and quarter-hour zones', () => {
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'Asia/Kolkata')).toBe('2026-12-03 18:30 UTC+05:30');
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'Asia/Kathmandu')).toBe('2026-12-03 18:45 UTC+05:45');
    expect(formatInstant(at('2026-12-03T13:00:00Z'), 'America/St_Johns')).toBe('2026-12-03 09:30 UTC−03:30');
  });

  it('gives the date alone (no zone unless asked) and the time alone (zone named)', () => {
    expect(formatInstant(at('2026-12-03T23:30:00Z'), 'Europe/Berlin', { part: 'date' })).toBe('2026-12-04');
    expect(formatInstant(at('2026-12-03T23:30:00Z'), 'Europe/Berlin', { part: 'date', named: true })).toBe('2026-12-04 UTC+01:00');
    expect(formatInstant(at('2026-12-03T23:30:00Z'), 'Europe/Berlin', { part: 'time' })).toBe('00:30 UTC+01:00');
    expect(formatInstant(at('2026-12-03T23:30:00Z'), 'Europe/Berlin', { named: false })).toBe('2026-12-04 00:30');
  });
});

describe('daylight-saving days', () => {
  it('Europe/Berlin spring forward: 01:59:59 CET is followed by 03:00 CEST', () => {
    expect(formatInstant(at('2026-03-29T00:59:59Z'), 'Europe/Berlin', { seconds: true })).toBe('2026-03-29 01:59:59 UTC+01:00');
    expect(formatInstant(at('2026-03-29T01:00:00Z'), 'Europe/Berlin')).toBe('2026-03-29 03:00 UTC+02:00');
  });

  it('Europe/Berlin fall back: 02:30 happens twice, told apart by the offset', () => {
    expect(formatInstant(at('2026-10-25T00:30:00Z'), 'Europe/Berlin')).toBe('2026-10-25 02:30 UTC+02:00');
    expect(formatInstant(at('2026-10-25T01:30:00Z'), 'Europe/Berlin')).toBe('2026-10-25 02:30 UTC+01:00');
  });

  it('America/New_York spring forward and fall back', () => {
    expect(formatInstant(at('2026-03-08T06:59:00Z'), 'America/New_York')).toBe('2026-03-08 01:59 UTC−05:00');
    expect(formatInstant(at('2026-03-08T07:00:00Z'), 'America/New_York')).toBe('2026-03-08 03:00 UTC−04:00');
    expect(formatInstant(at('2026-11-01T05:30:00Z'), 'America/New_York')).toBe('2026-11-01 01:30 UTC−04:00');
    expect(formatInstant(at('2026-11-01T06:30:00Z'), 'America/New_York')).toBe('2026-11-01 01:30 UTC−05:00');
  });
});

describe('zone names', () => {
  it('labels UTC as UTC and other zones by their offset at that instant', () => {
    expect(zoneLabel(at('2026-01-15T12:00:00Z'), 'UTC')).toBe('UTC');
    expect(zoneLabel(at('2026-01-15T12:00:00Z'), 'Europe/London')).toBe('UTC+00:00');
    expect(zoneLabel(at('2026-07-15T12:00:00Z'), 'Europe/London')).toBe('UTC+01:00');
    expect(zoneCaption(at('2026-01-15T12:00:00Z'), 'America/St_Johns')).toBe('America/St Johns, UTC−03:30');
    expect(zoneCaption(at('2026-01-15T12:00:00Z'), 'UTC')).toBe('UTC');
  });
});

describe('primitives', () => {
  it('reads the offset of a zone at an instant', () => {
    expect(zoneOffsetMinutes(at('2026-01-15T12:00:00Z'), 'Europe/Berlin')).toBe(60);
    expect(zoneOffsetMinutes(at('2026-07-15T12:00:00Z'), 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMinutes(at('2026-07-15T12:00:00Z'), 'Asia/Kolkata')).toBe(330);
    expect(zoneOffsetLabel(at('2026-01-15T12:00:00Z'), 'America/St_Johns')).toBe('UTC−03:30');
    expect(formatOffset(0)).toBe('UTC+00:00');
  });

  it('formats the wall clock without a zone for inputs and CSV cells', () => {
    expect(formatZoned(at('2026-03-29T01:00:00Z'), 'Europe/Berlin', { date: false })).toBe('03:00');
    expect(toZonedInput(at('2026-01-15T12:00:00Z'), 'Europe/Berlin')).toBe('2026-01-15T13:00');
  });

  it('reads API instants and refuses unreadable ones', () => {
    expect(instantMs('2026-12-03T13:00:00.000Z')).toBe(at('2026-12-03T13:00:00Z'));
    expect(instantMs(5)).toBe(5);
    expect(instantMs('not a time')).toBeNull();
  });
});

describe('relativeText', () => {
  // Wording: ECMA-402 Intl.RelativeTimeFormat, English, numeric 'auto' (CLDR relative-time data).
  const now = at('2026-12-03T14:00:00Z');
  it('says how long ago in the largest whole unit', () => {
    expect(relativeText(now - 12 * 60_000, now)).toBe('12 minutes ago');
    expect(relativeText(now - 86_400_000, now)).toBe('yesterday');
    expect(relativeText(now + 2 * 3_600_000, now)).toBe('in 2 hours');
    expect(relativeText(now, now)).toBe('now');
  });
});
