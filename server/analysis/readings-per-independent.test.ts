import { describe, expect, it } from 'vitest';
import { readingsPerIndependent } from './readings-per-independent.ts';
import { autocorrelation } from './autocorrelation.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('readingsPerIndependent', () => {
  it('is 1 for white noise (no AR or MA terms)', () => {
    expect(readingsPerIndependent([], [])).toBe(1);
  });

  it('is (1 + φ)/(1 − φ) for AR(1) (Brockwell & Davis §2.4.1, Var(x̄) of an AR(1))', () => {
    for (const phi of [-0.5, 0.3, 0.82, 0.97]) expect(readingsPerIndependent([phi], [])).toBeCloseTo((1 + phi) / (1 - phi), 9);
  });

  it('is (1 + θ)²/(1 + θ²) for MA(1): ρ(1) = θ/(1 + θ²), ρ(h > 1) = 0 (Brockwell & Davis §2.4.1)', () => {
    for (const theta of [-0.6, 0.4, 0.9]) expect(readingsPerIndependent([], [theta])).toBeCloseTo((1 + theta) ** 2 / (1 + theta * theta), 12);
  });

  it('matches 1 + 2 Σ ρ(h) summed from a long simulated ARMA(2,1) path (common practice: ratio of long-run variance to variance)', () => {
    const ar = [0.5, 0.2];
    const ma = [0.4];
    const x = simulateArma({ ar, ma }, 400_000, 11);
    const r = autocorrelation(x, { maxLag: 200 });
    let sum = 1;
    for (let k = 1; k <= 200; k++) sum += 2 * r[k];
    expect(readingsPerIndependent(ar, ma)).toBeCloseTo(sum, 0);
    expect(Math.abs(readingsPerIndependent(ar, ma) - sum) / sum).toBeLessThan(0.05);
  });

  it('refuses a unit root and a non-stationary AR part with a clear message', () => {
    expect(() => readingsPerIndependent([1], [])).toThrow('readingsPerIndependent: the AR part has a unit root, so the mean has no finite long-run variance');
    expect(() => readingsPerIndependent([1.2, -0.1], [])).toThrow(/not stationary/);
  });
});
