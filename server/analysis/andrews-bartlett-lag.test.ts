import { describe, expect, it } from 'vitest';
import { andrewsBartlettLag } from './andrews-bartlett-lag.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('andrewsBartlettLag', () => {
  it('follows Andrews (1991) eq. 6.4 for an AR(1) path: S = 1.1447 (α n)^(1/3), lag ⌈S⌉ − 1', () => {
    const x = simulateArma({ ar: [0.9] }, 5000, 3);
    // ρ̂ estimated the same way by hand
    let mean = 0;
    for (const v of x) mean += v / x.length;
    let c = 0;
    let s = 0;
    for (let i = 1; i < x.length; i++) {
      c += (x[i] - mean) * (x[i - 1] - mean);
      s += (x[i - 1] - mean) ** 2;
    }
    const rho = c / s;
    const alpha = (4 * rho * rho) / ((1 - rho) ** 2 * (1 + rho) ** 2);
    expect(rho).toBeGreaterThan(0.85);
    expect(andrewsBartlettLag(x)).toBe(Math.ceil(1.1447 * Math.cbrt(alpha * 5000)) - 1);
  });

  it('grows with persistence and keeps the minimum for white noise', () => {
    const white = simulateArma({}, 5000, 4);
    expect(andrewsBartlettLag(white, 7)).toBe(7);
    expect(andrewsBartlettLag(simulateArma({ ar: [0.97] }, 5000, 4))).toBeGreaterThan(andrewsBartlettLag(simulateArma({ ar: [0.6] }, 5000, 4)));
  });

  it('never exceeds a quarter of the values and refuses fewer than 8', () => {
    const walk = simulateArma({ ar: [1] }, 40, 5, 0);
    expect(andrewsBartlettLag(walk)).toBeLessThanOrEqual(10);
    expect(() => andrewsBartlettLag([1, 2, 3])).toThrow('andrewsBartlettLag requires at least 8 values (got 3)');
  });
});
