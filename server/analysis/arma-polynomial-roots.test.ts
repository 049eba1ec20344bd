import { describe, expect, it } from 'vitest';
import { armaInvertMa } from './arma-invert-ma.ts';
import { armaPolynomialRoots } from './arma-polynomial-roots.ts';
import { armaSmallestRoot } from './arma-smallest-root.ts';

const moduli = (c: number[]): number[] => {
  const { re, im } = armaPolynomialRoots(c);
  return Array.from(re, (r, i) => Math.hypot(r, im[i])).sort((a, b) => a - b);
};

describe('armaPolynomialRoots', () => {
  it('finds real and complex roots of 1 + c1 z + … (expanded by hand from known factors)', () => {
    // (1 − z/2)(1 − z/3) = 1 − 5/6 z + 1/6 z².
    const m = moduli([-5 / 6, 1 / 6]);
    expect(m[0]).toBeCloseTo(2, 12);
    expect(m[1]).toBeCloseTo(3, 12);
    // 1 + 0.25 z² has roots ±2i.
    const { re, im } = armaPolynomialRoots([0, 0.25]);
    expect(Array.from(re).map(Math.abs)).toEqual([expect.closeTo(0, 12), expect.closeTo(0, 12)]);
    expect(Array.from(im).map(Math.abs)).toEqual([expect.closeTo(2, 12), expect.closeTo(2, 12)]);
    // Trailing zeros are dropped: 1 − 0.5 z has the single root 2.
    expect(moduli([-0.5, 0, 0])).toEqual([2]);
    expect(moduli([])).toEqual([]);
  });
});

describe('armaInvertMa', () => {
  it('flips roots inside the unit circle and keeps invertible polynomials as they are', () => {
    expect(armaInvertMa([2])).toEqual([0.5]);
    expect(armaInvertMa([0.4, 0])).toEqual([0.4, 0]);
    // (1 − 2z)(1 − z/4) = 1 − 2.25 z + 0.5 z² → (1 − z/2)(1 − z/4) = 1 − 0.75 z + 0.125 z².
    const inverted = armaInvertMa([-2.25, 0.5, 0]);
    expect(inverted[0]).toBeCloseTo(-0.75, 12);
    expect(inverted[1]).toBeCloseTo(0.125, 12);
    expect(inverted[2]).toBe(0);
    const ok = [0.3, 0.2];
    expect(armaInvertMa(ok)).toEqual(ok);
  });
});

describe('armaSmallestRoot', () => {
  it('takes the smaller root modulus of the AR polynomial 1 − φz and the MA polynomial 1 + θz', () => {
    expect(armaSmallestRoot([0.5], [0.25])).toBeCloseTo(2, 12);
    expect(armaSmallestRoot([0.1], [-0.8])).toBeCloseTo(1.25, 12);
    expect(armaSmallestRoot([], [])).toBe(Infinity);
  });
});
