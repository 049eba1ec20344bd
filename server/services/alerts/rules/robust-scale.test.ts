import { describe, expect, it } from 'vitest';
import { median, robustScale } from './robust-scale.ts';

describe('robustScale', () => {
  it("matches R's median() and mad() (R 4.2.2: x <- c(3.1,2.7,9.4,3.3,2.9,3.0,3.6,2.2); median(x); mad(x))", () => {
    const x = Object.freeze([3.1, 2.7, 9.4, 3.3, 2.9, 3.0, 3.6, 2.2]);
    const r = robustScale(x);
    expect(r.center).toBeCloseTo(3.05, 12); // R: 3.05
    expect(r.scale).toBeCloseTo(0.44478, 12); // R: mad(x) = 0.44478
  });

  it('one wild value barely moves it (R 4.2.2: mad(c(1,2,3,4,100)) = 1.4826)', () => {
    expect(robustScale([1, 2, 3, 4, 100]).scale).toBeCloseTo(1.4826, 12);
  });

  it('empty input gives NaN', () => {
    expect(median([])).toBeNaN();
    expect(robustScale([]).center).toBeNaN();
  });
});
