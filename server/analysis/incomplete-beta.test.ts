import { describe, expect, it } from 'vitest';
import { incompleteBeta } from './incomplete-beta.ts';

describe('incompleteBeta', () => {
  it('equals R 4.2.2 pbeta(x, a, b) in both branches', () => {
    // R 4.2.2: pbeta(0.3, 2.5, 4), pbeta(1e-4, 3, 2), pbeta(0.999, 50, 0.5), pbeta(0.5, 200, 180)
    const cases: [number, number, number, number][] = [
      [0.3, 2.5, 4, 0.35219758590676714],
      [1e-4, 3, 2, 3.9997000000000093e-12],
      [0.999, 50, 0.5, 0.75236901996537675],
      [0.5, 200, 180, 0.15212954940791309],
    ];
    for (const [x, a, b, r] of cases) expect(Math.abs(incompleteBeta(x, a, b) - r) / r, `pbeta(${x}, ${a}, ${b})`).toBeLessThan(1e-13);
  });
  it('is 0 and 1 at the ends and NaN for NaN', () => {
    expect(incompleteBeta(0, 2, 3)).toBe(0);
    expect(incompleteBeta(1, 2, 3)).toBe(1);
    expect(Number.isNaN(incompleteBeta(Number.NaN, 2, 3))).toBe(true);
  });
});
