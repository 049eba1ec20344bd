import { describe, expect, it } from 'vitest';
import { arYuleWalker } from './ar-yule-walker.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('arYuleWalker', () => {
  it('recovers a simulated AR(2) and picks order 2 by AIC', () => {
    const fit = arYuleWalker(simulateArma({ ar: [0.5, 0.3] }, 5000, 21), { maxOrder: 10 });
    expect(fit.order).toBe(2);
    expect(fit.coefficients[0]).toBeCloseTo(0.5, 1);
    expect(fit.coefficients[1]).toBeCloseTo(0.3, 1);
    expect(fit.variance).toBeCloseTo(1, 1);
    expect(fit.aic[2]).toBe(0);
  });
});
