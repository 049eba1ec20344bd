import { describe, expect, it } from 'vitest';
import { decompositionChartOption, observedFromParts, observedOf } from './decomposition-chart-option.ts';
import {
  BERLIN_MARCH,
  BERLIN_MARCH_MIDNIGHTS,
  BERLIN_OCTOBER,
  BERLIN_OCTOBER_MIDNIGHTS,
  isoTicks,
  type TimeAxis,
} from '../../../components/charts/berlin-midnights.testkit.ts';

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
