import { describe, expect, it } from 'vitest';
import { arYuleWalker } from './ar-yule-walker.ts';
import { augmentedDickeyFuller } from './augmented-dickey-fuller.ts';
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

describe('augmentedDickeyFuller', () => {
  it('rejects a unit root for stationary AR(1) paths, and for random walks only at about its 5% level', () => {
    const seeds = Array.from({ length: 10 }, (_, i) => i + 1);
    for (const seed of seeds) expect(augmentedDickeyFuller(simulateArma({ ar: [0.5] }, 500, seed)).rejectsUnitRoot).toBe(true);
    // Under a unit root a 5% test rejects in 5% of samples: 3 or more of 10 has probability ≈ 1%.
    const rejected = seeds.filter((seed) => augmentedDickeyFuller(simulateArma({ ar: [1] }, 500, seed, 0)).rejectsUnitRoot);
    expect(rejected.length).toBeLessThanOrEqual(2);
  });
});
