import { describe, expect, it } from 'vitest';
import { timeAxisTicks, timeLabel, zonedTimeAxis } from './time-axis.ts';

// Check instants: the IANA time zone database as Python 3.11's zoneinfo reads it
// (`/usr/bin/python3`: `datetime(2026, 3, 29, 0, tzinfo=ZoneInfo('Europe/Berlin')).astimezone(timezone.utc)`),
// which agrees with EU Directive 2000/84/EC arts. 2–3: summer time starts and ends at 01:00 UTC on the
// last Sunday of March and of October (2026-03-29 and 2026-10-25).
const iso = (ms: number[]) => ms.map((t) => new Date(t).toISOString().replace(':00.000Z', 'Z'));
const at = (s: string) => Date.parse(s);

describe('time axis ticks on the zone clock', () => {
  it('puts day ticks at Berlin midnights across the spring change (a 23-hour day)', () => {
    const t = timeAxisTicks(at('2026-03-26T12:00:00Z'), at('2026-03-31T12:00:00Z'), 'Europe/Berlin');
    expect(t.step).toEqual({ unit: 'days', size: 1 });
    // zoneinfo: 03-27 → 03-26T23:00Z … 03-29 → 03-28T23:00Z, 03-30 → 03-29T22:00Z, 03-31 → 03-30T22:00Z
    expect(iso(t.ticks)).toEqual(['2026-03-26T23:00Z', '2026-03-27T23:00Z', '2026-03-28T23:00Z', '2026-03-29T22:00Z', '2026-03-30T22:00Z']);
    expect(t.ticks.map((v) => t.labels.get(v))).toEqual(['2026-03-27', '03-28', '03-29', '03-30', '03-31']);
  });

  it('puts day ticks at Berlin midnights across the autumn change (a 25-hour day)', () => {
    const t = timeAxisTicks(at('2026-10-23T12:00:00Z'), at('2026-10-27T12:00:00Z'), 'Europe/Berlin');
    // zoneinfo: 10-24 → 10-23T22:00Z, 10-25 → 10-24T22:00Z, 10-26 → 10-25T23:00Z, 10-27 → 10-26T23:00Z
    expect(iso(t.ticks)).toEqual(['2026-10-23T22:00Z', '2026-10-24T22:00Z', '2026-10-25T23:00Z', '2026-10-26T23:00Z']);
    expect(t.ticks[2] - t.ticks[1]).toBe(25 * 3_600_000);
  });

  it('hour ticks follow the wall clock on the spring day: 02:00 does not exist and is not drawn', () => {
    const t = timeAxisTicks(at('2026-03-28T23:00:00Z'), at('2026-03-29T04:00:00Z'), 'Europe/Berlin', 8);
    expect(t.step).toEqual({ unit: 'hours', size: 1 });
    // zoneinfo: 00:00 → 23:00Z, 01:00 → 00:00Z, 03:00 → 01:00Z, 04:00 → 02:00Z, 05:00 → 03:00Z, 06:00 → 04:00Z
    expect(iso(t.ticks)).toEqual([
      '2026-03-28T23:00Z',
      '2026-03-29T00:00Z',
      '2026-03-29T01:00Z',
      '2026-03-29T02:00Z',
      '2026-03-29T03:00Z',
      '2026-03-29T04:00Z',
    ]);
    expect(t.ticks.map((v) => t.labels.get(v))).toEqual(['2026-03-29', '01:00', '03:00', '04:00', '05:00', '06:00']);
  });

  it('hour ticks on the autumn day: 02:00 comes twice and is drawn once, at its first reading', () => {
    const t = timeAxisTicks(at('2026-10-24T22:00:00Z'), at('2026-10-25T04:00:00Z'), 'Europe/Berlin', 8);
    // zoneinfo (fold=0): 00:00 → 22:00Z, 01:00 → 23:00Z, 02:00 → 00:00Z, 03:00 → 02:00Z, 04:00 → 03:00Z, 05:00 → 04:00Z
    expect(iso(t.ticks)).toEqual([
      '2026-10-24T22:00Z',
      '2026-10-24T23:00Z',
      '2026-10-25T00:00Z',
      '2026-10-25T02:00Z',
      '2026-10-25T03:00Z',
      '2026-10-25T04:00Z',
    ]);
  });

  it('uses 3, 6 and 12 hour steps at whole local hours for ranges under two days', () => {
    const day = timeAxisTicks(at('2026-12-03T05:20:00Z'), at('2026-12-04T05:20:00Z'), 'Europe/Berlin');
    expect(day.step).toEqual({ unit: 'hours', size: 3 });
    // Berlin is UTC+01:00 in December (zoneinfo): 09:00 local = 08:00Z
    expect(iso(day.ticks)[0]).toBe('2026-12-03T08:00Z');
    expect(day.ticks.map((v) => day.labels.get(v))).toEqual(['12-03 09:00', '12:00', '15:00', '18:00', '21:00', '12-04', '03:00', '06:00']);
    expect(timeAxisTicks(at('2026-12-03T00:00:00Z'), at('2026-12-04T12:00:00Z'), 'UTC').step).toEqual({ unit: 'hours', size: 6 });
    expect(timeAxisTicks(at('2026-12-03T00:00:00Z'), at('2026-12-05T00:00:00Z'), 'UTC').step).toEqual({ unit: 'hours', size: 6 });
    expect(timeAxisTicks(at('2026-12-03T00:00:00Z'), at('2026-12-05T00:00:00Z'), 'UTC', 4).step).toEqual({ unit: 'hours', size: 12 });
  });

  it('follows zones with half-hour offsets: Kolkata midnights are 18:30 UTC', () => {
    // Asia/Kolkata is UTC+05:30 all year (zoneinfo)
    const t = timeAxisTicks(at('2026-06-01T00:00:00Z'), at('2026-06-04T00:00:00Z'), 'Asia/Kolkata');
    expect(iso(t.ticks)).toEqual(['2026-06-01T18:30Z', '2026-06-02T18:30Z', '2026-06-03T18:30Z']);
  });

  it('a day whose midnight the clock skips gets its tick at the first instant of the day, labelled with its date', () => {
    // America/Santiago moves from 00:00 to 01:00 on 2026-09-06; zoneinfo: 09-05 → 04:00Z, 09-06 → 04:00Z (01:00 −03), 09-07 → 03:00Z
    const t = timeAxisTicks(at('2026-09-05T00:00:00Z'), at('2026-09-07T12:00:00Z'), 'America/Santiago');
    expect(iso(t.ticks)).toEqual(['2026-09-05T04:00Z', '2026-09-06T04:00Z', '2026-09-07T03:00Z']);
    expect(t.ticks.map((v) => t.labels.get(v))).toEqual(['2026-09-05', '09-06', '09-07']);
  });

  it('long ranges: Mondays, then months, naming the year where it changes', () => {
    const month = timeAxisTicks(at('2026-12-01T00:00:00Z'), at('2026-12-31T00:00:00Z'), 'UTC');
    expect(month.step).toEqual({ unit: 'weeks', size: 1 });
    // ISO 8601 weeks start on Monday; 2026-12-07 is a Monday (common practice: calendar)
    expect(iso(month.ticks)).toEqual(['2026-12-07T00:00Z', '2026-12-14T00:00Z', '2026-12-21T00:00Z', '2026-12-28T00:00Z']);
    const year = timeAxisTicks(at('2026-09-15T00:00:00Z'), at('2027-03-15T00:00:00Z'), 'Europe/Berlin');
    expect(year.step).toEqual({ unit: 'months', size: 1 });
    expect(year.ticks.map((v) => year.labels.get(v))).toEqual(['2026-10-01', '11-01', '12-01', '2027-01-01', '02-01', '03-01']);
    // Berlin midnight of 1 October (summer time, UTC+02:00) and of 1 November (UTC+01:00), zoneinfo
    expect(iso(year.ticks.slice(0, 2))).toEqual(['2026-09-30T22:00Z', '2026-10-31T23:00Z']);
    const years = timeAxisTicks(at('2020-06-01T00:00:00Z'), at('2026-06-01T00:00:00Z'), 'UTC');
    expect(years.ticks.map((v) => years.labels.get(v))).toEqual(['2021', '2022', '2023', '2024', '2025', '2026']);
  });

  it('never gives more ticks than asked for, and none outside the range', () => {
    for (const span of [600_000, 3_600_000, 86_400_000, 5 * 86_400_000, 40 * 86_400_000, 400 * 86_400_000]) {
      const from = at('2026-03-27T10:17:00Z');
      const t = timeAxisTicks(from, from + span, 'Europe/Berlin', 8);
      expect(t.ticks.length).toBeGreaterThan(0);
      expect(t.ticks.length).toBeLessThanOrEqual(9);
      expect(t.ticks.every((v) => v >= from && v <= from + span)).toBe(true);
      expect([...t.ticks].sort((a, b) => a - b)).toEqual(t.ticks);
    }
    expect(timeAxisTicks(10, 5, 'UTC').ticks).toEqual([]);
  });
});

describe('the ECharts axis parts', () => {
  it('hands the ticks to axisTick and axisLabel and writes their labels', () => {
    const axis = zonedTimeAxis(at('2026-03-26T12:00:00Z'), at('2026-03-31T12:00:00Z'), 'Europe/Berlin', { show: false });
    expect(iso(axis.axisTick.customValues)).toContain('2026-03-29T22:00Z');
    expect(axis.axisLabel.customValues).toBe(axis.axisTick.customValues);
    expect(axis.axisLabel.show).toBe(false);
    expect(axis.axisLabel.formatter(at('2026-03-29T22:00:00Z'))).toBe('03-30');
    // a value that is not a tick gets the full wording
    expect(axis.axisLabel.formatter(at('2026-03-29T22:05:00Z'))).toBe('2026-03-30 00:05');
    expect(timeLabel(at('2026-12-03T13:00:00Z'), 'Europe/Berlin')).toBe('2026-12-03 14:00');
  });
});
