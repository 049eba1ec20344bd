import { describe, expect, it } from 'vitest';
import { decompositionChartOption, observedFromParts, observedOf } from './decomposition-chart-option.ts';

// The additive identity observed = trend + seasonal + remainder (Cleveland et al. 1990, eq. 1 —
// equation number from memory); parts invented for the test.
describe('observedFromParts', () => {
  it('adds the parts back and leaves empty or incomplete cells missing', () => {
    const d = {
      method: 'classical' as const,
      period: 2,
      cells: null,
      thinned: null,
      trend: [null, 10, 11, 12],
      seasonal: [1, -1, 1, -1],
      remainder: [null, 0.5, 0.25, -0.5],
      weights: null,
      outliers: { threshold: 3, median: 0, robustSd: 1, indices: [], times: [], values: [] },
    };
    expect(observedFromParts(d, [])).toEqual([null, 9.5, 12.25, 10.5]);
    expect(observedFromParts(d, [2])).toEqual([null, 9.5, null, 10.5]);
  });

  it('puts thinned parts at their kept cells: the empty-cell rule and the time axis follow `cells`', () => {
    const d = {
      method: 'stl' as const,
      period: 4,
      cells: [0, 5, 9],
      thinned: { cells: 3, of: 10, bucketCells: 5, note: 'Thinned for drawing: 3 of 10 cells' },
      trend: [10, 11, 12],
      seasonal: [1, -1, 0],
      remainder: [0, 0.5, -0.5],
      weights: null,
      outliers: { threshold: 3, median: 0, robustSd: 1, indices: [], times: [], values: [] },
    };
    // cell 5 held no reading; the value at index 1 is cell 5, the one at index 2 is cell 9
    expect(observedFromParts(d, [5])).toEqual([11, null, 11.5]);
    const option = decompositionChartOption(d, { start: 1_000, stepMs: 60_000, emptyCells: [] }, 'UTC') as {
      series: Array<{ data: Array<[number, number | null]> }>;
    };
    expect(option.series[1].data).toEqual([
      [1_000, 10],
      [1_000 + 5 * 60_000, 11],
      [1_000 + 9 * 60_000, 12],
    ]);
  });
});

// Berlin midnights around the two daylight-saving Sundays of 2026 (29 March, 25 October), from the IANA
// time zone database as Python 3.11's zoneinfo reads it (`/usr/bin/python3`:
// `datetime(2026, 3, 30, tzinfo=ZoneInfo('Europe/Berlin')).astimezone(timezone.utc)` → 2026-03-29T22:00Z).
const BERLIN_MARCH = { from: Date.parse('2026-03-26T12:00:00Z'), to: Date.parse('2026-03-31T12:00:00Z') };
const BERLIN_MARCH_MIDNIGHTS = [
  '2026-03-26T23:00:00.000Z',
  '2026-03-27T23:00:00.000Z',
  '2026-03-28T23:00:00.000Z',
  '2026-03-29T22:00:00.000Z',
  '2026-03-30T22:00:00.000Z',
];
const BERLIN_OCTOBER = { from: Date.parse('2026-10-23T12:00:00Z'), to: Date.parse('2026-10-27T12:00:00Z') };
const BERLIN_OCTOBER_MIDNIGHTS = ['2026-10-23T22:00:00.000Z', '2026-10-24T22:00:00.000Z', '2026-10-25T23:00:00.000Z', '2026-10-26T23:00:00.000Z'];
type TimeAxis = { axisTick: { customValues: number[] }; axisLabel: { customValues: number[]; formatter: (v: number) => string } };
const isoTicks = (x: TimeAxis) => x.axisTick.customValues.map((t) => new Date(t).toISOString());

describe('decomposition time axes', () => {
  it('tick at the logger’s local midnights on every panel, labels on the bottom one only', () => {
    const parts = (n: number) => ({
      method: 'stl' as const,
      period: 24,
      cells: null,
      thinned: null,
      trend: new Array<number>(n).fill(1),
      seasonal: new Array<number>(n).fill(0),
      remainder: new Array<number>(n).fill(0),
      weights: null,
      outliers: { threshold: 3, median: 0, robustSd: 1, indices: [], times: [], values: [] },
    });
    for (const [range, midnights] of [
      [BERLIN_MARCH, BERLIN_MARCH_MIDNIGHTS],
      [BERLIN_OCTOBER, BERLIN_OCTOBER_MIDNIGHTS],
    ] as const) {
      // hourly cells from the range's start to its end
      const n = (range.to - range.from) / 3_600_000 + 1;
      const option = decompositionChartOption(parts(n), { start: range.from, stepMs: 3_600_000, emptyCells: [] }, 'Europe/Berlin') as {
        xAxis: Array<TimeAxis & { axisLabel: { show: boolean } }>;
      };
      expect(option.xAxis).toHaveLength(4);
      for (const x of option.xAxis) expect(isoTicks(x)).toEqual(midnights);
      expect(option.xAxis.map((x) => x.axisLabel.show)).toEqual([false, false, false, true]);
    }
  });
});

describe('observedOf', () => {
  it('draws the observed values the server sent, whole, where the classical trend is undefined at the ends', () => {
    // hand-made parts: a trend missing in the first and last cell, as decompose() leaves it (R docs, ?decompose)
    const d = {
      method: 'classical' as const,
      period: 2,
      cells: null,
      thinned: null,
      observed: [10, 11, 12, 13],
      trend: [null, 11, 12, null],
      seasonal: [0.5, -0.5, 0.5, -0.5],
      remainder: [null, 0.5, -0.5, null],
      weights: null,
      outliers: { cells: [], values: [] },
    } as unknown as Parameters<typeof observedOf>[0];
    expect(observedOf(d, [])).toEqual([10, 11, 12, 13]);
    // without the server's values, the sum of the parts leaves the ends missing
    expect(observedOf({ ...d, observed: undefined }, [])).toEqual([null, 11, 12, null]);
  });
});
