import { describe, expect, it } from 'vitest';
import { detectPeriod } from './detect-period.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

/** Simulation (not a reference value): 14 days of 5-minute readings, daily sine plus AR(1) noise. */
function dailyCycle(seed: number): Float64Array {
  const noise = simulateArma({ ar: [0.8] }, 288 * 14, seed);
  return noise.map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 288) + 0.001 * t);
}

describe('detectPeriod', () => {
  it('finds the 288-sample day in 5-minute data (within 1%, as the spectral resolution allows)', () => {
    for (const seed of [1, 2, 3]) {
      const result = detectPeriod(dailyCycle(seed));
      expect(result.best).not.toBeNull();
      expect(Math.abs((result.best ?? 0) - 288)).toBeLessThanOrEqual(3);
      expect(result.candidates[0].sources).toEqual(['periodogram', 'acf']);
    }
  });

  it('reports no period for white noise, AR(1) or AR(2) with real roots', () => {
    for (const seed of [1, 2, 3]) {
      expect(detectPeriod(simulateArma({}, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ar: [0.7] }, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ar: [0.5, 0.3] }, 2000, seed)).best).toBeNull();
    }
  });

  it('finds 12 in monthly data with a yearly cycle and a trend', () => {
    const noise = simulateArma({ ar: [0.5] }, 240, 4);
    const x = noise.map((v, t) => 0.05 * t + 3 * Math.cos((2 * Math.PI * t) / 12));
    expect(detectPeriod(x).best).toBe(12);
  });
});
