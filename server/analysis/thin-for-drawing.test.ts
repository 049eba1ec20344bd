import { describe, expect, it } from 'vitest';
import { thinForDrawing } from './thin-for-drawing.ts';

// Behaviour checks of the min/max-per-bucket rule (Jugel et al. 2014); the series are invented.
describe('thinForDrawing', () => {
  it('keeps every cell when the series is short enough', () => {
    const { cells, bucketCells } = thinForDrawing([[1, 2, 3]], 3, { maxPoints: 3 });
    expect(Array.from(cells)).toEqual([0, 1, 2]);
    expect(bucketCells).toBe(1);
  });

  it('keeps each bucket’s first, last, lowest and highest cell of every series, and the cells asked for', () => {
    // 12 cells, 1 series: 4 points per bucket → maxPoints 8 gives 2 buckets of 6 cells
    const a = [5, 9, 1, 4, 4, 4, /* bucket 2 */ 4, 4, -3, 4, 8, 4];
    const { cells, bucketCells } = thinForDrawing([a], 12, { maxPoints: 8, always: [3] });
    expect(bucketCells).toBe(6);
    // bucket 1: first 0, last 5, min at 2, max at 1; bucket 2: first 6, last 11, min at 8, max at 10; plus 3
    expect(Array.from(cells)).toEqual([0, 1, 2, 3, 5, 6, 8, 10, 11]);
  });

  it('shares one set of cells across series and ignores missing values', () => {
    const a = [NaN, NaN, 7, 0, 0, 0, 0, 0];
    const b = [0, 0, 0, 0, 0, 2, -2, 0];
    const { cells } = thinForDrawing([a, b], 8, { maxPoints: 6 });
    // one bucket of 8: first 0, last 7; a's min 3 (first of the zeros) and max 2; b's min 6 and max 5
    expect(Array.from(cells)).toEqual([0, 2, 3, 5, 6, 7]);
  });

  it('stays within the budget on a long series and keeps its extremes', () => {
    const n = 100_000;
    const s = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 500));
    s[54_321] = 40;
    const { cells } = thinForDrawing([s, s, s], n, { maxPoints: 4000 });
    expect(cells.length).toBeLessThanOrEqual(4000);
    expect(Array.from(cells)).toContain(54_321);
    for (let i = 1; i < cells.length; i++) expect(cells[i]).toBeGreaterThan(cells[i - 1]);
  });
});
