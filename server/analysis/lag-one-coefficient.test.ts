import { describe, expect, it } from 'vitest';
import { lagOneCoefficient } from './lag-one-coefficient.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('lagOneCoefficient', () => {
  it('is Σ(x_t − x̄)(x_{t−1} − x̄)/Σ(x_{t−1} − x̄)² worked by hand on 1, 2, 4, 3 (x̄ = 2.5: 0.75 / 4.75)', () => {
    // cross: (−0.5)(−1.5) + (1.5)(−0.5) + (0.5)(1.5) = 0.75; squares of x_{t−1} − x̄: 2.25 + 0.25 + 2.25 = 4.75
    expect(lagOneCoefficient([1, 2, 4, 3])).toBeCloseTo(0.75 / 4.75, 15);
  });

  it('recovers φ of a long simulated AR(1) path and skips pairs with a gap', () => {
    const x = simulateArma({ ar: [0.8] }, 50_000, 9);
    expect(lagOneCoefficient(x)).toBeCloseTo(0.8, 1);
    const gappy = Float64Array.from(x);
    gappy[100] = NaN;
    expect(Math.abs(lagOneCoefficient(gappy) - lagOneCoefficient(x))).toBeLessThan(1e-3);
  });

  it('is 0 for a constant series', () => {
    expect(lagOneCoefficient([3, 3, 3, 3])).toBe(0);
  });
});
