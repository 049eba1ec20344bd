import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { csvField, csvLine, togetherCsv, togetherCsvTable, zonedIso } from './together-csv.ts';
import { plottedPoints, type DrawnLine } from './together-chart-option.ts';
import { planLines } from './together-lines.ts';
import { BOARDWALK, buckets, fenChannel, readings, WEIR } from './together-fixture.ts';

const T0 = Date.parse('2026-03-29T00:00:00Z');
const MIN = 60_000;

function drawn(series: Array<DrawnLine['series']>): DrawnLine[] {
  const { lines } = planLines([
    fenChannel(1, 'Air temperature', '°C', WEIR),
    fenChannel(2, 'Relative humidity', '%', WEIR),
    fenChannel(3, 'Water temperature', '°C', BOARDWALK),
  ]);
  return lines.map((l, i) => ({ ...l, series: series[i] }));
}

describe('togetherCsvTable', () => {
  const lines = drawn([
    readings([T0, T0 + 10 * MIN, T0 + 40 * MIN, T0 + 60 * MIN], [4.5, 4.75, null, 6]),
    buckets(T0, 30 * MIN, [81, null, 77.5]),
    readings([T0 + 10 * MIN, T0 + 20 * MIN], [3.25, 3.5]),
  ]);

  it('has one row per plotted instant, the value of each line there or empty, on the shown clock and in UTC', () => {
    // Europe/Berlin moves from UTC+01:00 to UTC+02:00 at 2026-03-29 01:00 UTC (IANA tzdata, EU rule:
    // last Sunday of March, 01:00 UTC). Buckets are drawn at their middle (00:15, 01:15 UTC).
    const { header, rows } = togetherCsvTable(lines, 'Europe/Berlin');
    expect(header).toEqual([
      'time on the clock of Europe/Berlin',
      'time in UTC',
      'Weir mast · Air temperature (°C) · raw readings',
      'Weir mast · Relative humidity (%) · mean per 30 min',
      'Boardwalk box · Water temperature (°C) · raw readings',
    ]);
    expect(rows).toEqual([
      ['2026-03-29T01:00:00+01:00', '2026-03-29T00:00:00.000Z', 4.5, null, null],
      ['2026-03-29T01:10:00+01:00', '2026-03-29T00:10:00.000Z', 4.75, null, 3.25],
      ['2026-03-29T01:15:00+01:00', '2026-03-29T00:15:00.000Z', null, 81, null],
      ['2026-03-29T01:20:00+01:00', '2026-03-29T00:20:00.000Z', null, null, 3.5],
      ['2026-03-29T03:00:00+02:00', '2026-03-29T01:00:00.000Z', 6, null, null],
      ['2026-03-29T03:15:00+02:00', '2026-03-29T01:15:00.000Z', null, 77.5, null],
    ]);
  });

  it('writes the CSV with CRLF lines and the same rows', () => {
    const text = togetherCsv(lines, 'UTC');
    const out = text.split('\r\n');
    expect(out[0]).toBe(
      'time on the clock of UTC,time in UTC,Weir mast · Air temperature (°C) · raw readings,Weir mast · Relative humidity (%) · mean per 30 min,Boardwalk box · Water temperature (°C) · raw readings',
    );
    expect(out[2]).toBe('2026-03-29T00:10:00+00:00,2026-03-29T00:10:00.000Z,4.75,,3.25');
    expect(out).toHaveLength(6 + 2); // header, six rows, and the empty string after the last CRLF
  });

  it('holds every plotted point exactly once, and nothing else (property over random series)', () => {
    const values = fc.array(fc.option(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }), { nil: null }), { maxLength: 40 });
    fc.assert(
      fc.property(values, values, fc.array(fc.integer({ min: 0, max: 200 }), { maxLength: 40 }), (a, b, offsets) => {
        const times = [...new Set(offsets)].sort((x, y) => x - y).map((o) => T0 + o * MIN);
        const lines = drawn([
          readings(
            times,
            times.map((_, i) => a[i] ?? null),
          ),
          buckets(T0, 20 * MIN, b),
          readings([], []),
        ]);
        const { rows } = togetherCsvTable(lines, 'Europe/Berlin');
        const cells = rows.flatMap((r) => r.slice(2).map((v, col) => (v === null ? null : `${col}@${Date.parse(String(r[1]))}=${v}`))).filter(Boolean);
        const plotted = lines.flatMap((l, col) => plottedPoints(l.series).flatMap(([t, v]) => (v === null ? [] : [`${col}@${t}=${v}`])));
        expect(cells.sort()).toEqual(plotted.sort());
        expect(rows.every((r) => r.slice(2).some((v) => v !== null))).toBe(true);
      }),
    );
  });
});

describe('zonedIso', () => {
  it('writes the offset in force, across both daylight-saving changes (IANA tzdata)', () => {
    // America/New_York: EDT (UTC−04:00) from 2026-03-08 07:00 UTC; EST (UTC−05:00) in January.
    expect(zonedIso(Date.parse('2026-03-29T12:00:00Z'), 'America/New_York')).toBe('2026-03-29T08:00:00-04:00');
    expect(zonedIso(Date.parse('2026-01-15T12:00:00.250Z'), 'America/New_York')).toBe('2026-01-15T07:00:00.250-05:00');
    // Europe/Berlin: back to UTC+01:00 at 2026-10-25 01:00 UTC, so 02:30 local occurs twice.
    expect(zonedIso(Date.parse('2026-10-25T00:30:00Z'), 'Europe/Berlin')).toBe('2026-10-25T02:30:00+02:00');
    expect(zonedIso(Date.parse('2026-10-25T01:30:00Z'), 'Europe/Berlin')).toBe('2026-10-25T02:30:00+01:00');
  });
});

// The cases of server/http/csv-field.test.ts (OWASP "CSV Injection"; RFC 4180 §2 quoting): the
// client copy must behave the same.
describe('csvField (client copy of the server’s formula guard)', () => {
  it.each([
    ['=1+1', "'=1+1"],
    ['+1+cmd', "'+1+cmd"],
    ['-3+cmd', "'-3+cmd"],
    ['@SUM(1)', "'@SUM(1)"],
    ['\tnote', "'\tnote"],
    ['\r=cmd', `"'\r=cmd"`],
    ['=HYPERLINK("http://x","y")', `"'=HYPERLINK(""http://x"",""y"")"`],
    ['-3.2', '-3.2'],
    ['+4', '+4'],
    ['-', "'-"],
    ['-3.2.1', "'-3.2.1"],
    ['a=b', 'a=b'],
    ['a,b', '"a,b"'],
    ['', ''],
  ])('%j → %j', (text, expected) => expect(csvField(text)).toBe(expected));

  it('writes numbers as numbers and empty cells for null', () => {
    expect(csvLine([-3.2, null, 1e-7, 'x'])).toBe('-3.2,,1e-7,x\r\n');
  });

  it('guards a header made from a hostile logger name', () => {
    const { lines } = planLines([fenChannel(1, 'T', '°C', { id: 9, name: '=cmd|calc', timezone: 'UTC' })]);
    const text = togetherCsv([{ ...lines[0], series: readings([T0], [1]) }], 'UTC');
    expect(text.split('\r\n')[0]).toBe("time on the clock of UTC,time in UTC,'=cmd|calc · T (°C) · raw readings");
  });
});
