import { describe, expect, it } from 'vitest';
import { fillForDecomposition } from './fill-for-decomposition.ts';

describe('fillForDecomposition', () => {
  it('draws straight lines across inner gaps and marks them', () => {
    const r = fillForDecomposition([1, NaN, NaN, 4, 5], null)!;
    expect(Array.from(r.values)).toEqual([1, 2, 3, 4, 5]);
    expect(Array.from(r.filled)).toEqual([0, 1, 1, 0, 0]);
  });
  it('fills end runs from one cycle away when there is a cycle', () => {
    const r = fillForDecomposition([NaN, 2, 3, 1, 2, 3, 1, NaN], 3)!;
    expect(Array.from(r.values)).toEqual([1, 2, 3, 1, 2, 3, 1, 2]);
  });
  it('repeats the nearest reading at the ends without one', () => {
    expect(Array.from(fillForDecomposition([NaN, 2, 3, NaN], null)!.values)).toEqual([2, 2, 3, 3]);
  });
  it('gives null for an empty grid and leaves its input alone', () => {
    expect(fillForDecomposition([NaN, NaN], 2)).toBeNull();
    const x = Object.freeze([1, NaN, 3]);
    fillForDecomposition(x, null);
    expect(x).toEqual([1, NaN, 3]);
  });
});
