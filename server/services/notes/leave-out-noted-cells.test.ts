import { describe, expect, it } from 'vitest';
import { leaveOutNotedCells } from './leave-out-noted-cells.ts';

const cols = (ts: number[], values = ts.map((t) => t / 10)) => ({ ts: Float64Array.from(ts), values: Float64Array.from(values) });

describe('leaveOutNotedCells', () => {
  it('drops every reading whose cell overlaps a span, a partly covered cell whole', () => {
    // cells of 10: [0,10) [10,20) [20,30) [30,40); the span [12, 21) touches cells 1 and 2
    const data = cols([0, 5, 10, 15, 19, 20, 29, 30, 35]);
    const { data: kept, cellsRemoved } = leaveOutNotedCells(data, [{ start: 12, end: 21 }], 10);
    expect(Array.from(kept.ts)).toEqual([0, 5, 30, 35]);
    expect(Array.from(kept.values)).toEqual([0, 0.5, 3, 3.5]);
    expect(cellsRemoved).toEqual([2]);
  });

  it('an end on a cell boundary leaves the next cell alone; overlapping spans count their cells each', () => {
    const data = cols([0, 10, 20, 30, 40]);
    const out = leaveOutNotedCells(
      data,
      [
        { start: 10, end: 30 },
        { start: 20, end: 40 },
      ],
      10,
    );
    expect(Array.from(out.data.ts)).toEqual([0, 40]);
    expect(out.cellsRemoved).toEqual([2, 2]);
  });

  it('with 1 ms cells it drops exactly the readings in [start, end) (nested and unsorted spans)', () => {
    const data = cols([1, 2, 3, 4, 5, 6, 7, 8]);
    const out = leaveOutNotedCells(
      data,
      [
        { start: 6, end: 8 },
        { start: 2, end: 5 },
        { start: 3, end: 4 },
      ],
      1,
    );
    expect(Array.from(out.data.ts)).toEqual([1, 5, 8]);
    expect(out.cellsRemoved).toEqual([2, 3, 1]);
  });

  it('no spans, or spans with no readings: the input comes back as it is, never modified', () => {
    const data = cols([0, 10, 20]);
    const frozen = Array.from(data.ts);
    expect(leaveOutNotedCells(data, [], 10).data).toBe(data);
    const out = leaveOutNotedCells(data, [{ start: 100, end: 200 }], 10);
    expect(out.data).toBe(data);
    expect(out.cellsRemoved).toEqual([0]);
    leaveOutNotedCells(data, [{ start: 0, end: 30 }], 10);
    expect(Array.from(data.ts)).toEqual(frozen);
  });

  it('handles an empty series, negative times and refuses a step that is not positive', () => {
    expect(leaveOutNotedCells(cols([]), [{ start: 0, end: 5 }], 10).data.ts.length).toBe(0);
    expect(Array.from(leaveOutNotedCells(cols([-15, -5, 5]), [{ start: -10, end: -1 }], 10).data.ts)).toEqual([-15, 5]);
    expect(() => leaveOutNotedCells(cols([1]), [], 0)).toThrow('leaveOutNotedCells: stepMs must be positive (got 0)');
  });
});
