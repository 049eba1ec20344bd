import { describe, expect, it } from 'vitest';
import { crossCorrelation } from './cross-correlation.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('crossCorrelation', () => {
  it("follows R's sign convention: x lagging y by 3 peaks at lag +3", () => {
    const y = simulateArma({}, 3000, 9);
    const x = new Float64Array(3000);
    for (let t = 3; t < 3000; t++) x[t] = y[t - 3]; // x[t + 3] = y[t]
    const { lags, values } = crossCorrelation(x, y, { maxLag: 6 });
    const peak = lags[values.indexOf(Math.max(...values))];
    expect(peak).toBe(3);
    expect(values[6 + 3]).toBeGreaterThan(0.99);
  });
  it('covariance type is unscaled', () => {
    const x = [1, 2, 3, 4];
    const r = crossCorrelation(x, x, { maxLag: 0, type: 'covariance' });
    expect(r.values[0]).toBeCloseTo(1.25, 15); // Σ(x − 2.5)² / 4 = 5/4
  });
});
