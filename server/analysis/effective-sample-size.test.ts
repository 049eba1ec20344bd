import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { effectiveSampleSize } from './effective-sample-size.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('effectiveSampleSize', () => {
  it('AR(1) with φ = 0.5: τ = (1 + φ)/(1 − φ) = 3 (Brockwell & Davis ITSF §2.4: Σ_h ρ(h) for AR(1))', () => {
    const n = 20_000;
    const r = effectiveSampleSize(simulateArma({ ar: [0.5] }, n, 3));
    expect(r.tau).toBeGreaterThan(3 * 0.9);
    expect(r.tau).toBeLessThan(3 * 1.1);
    expect(r.ess).toBeCloseTo(n / r.tau, 9);
  });

  it('white noise keeps nearly all of n', () => {
    const r = effectiveSampleSize(simulateArma({}, 5000, 8));
    expect(r.ess / 5000).toBeGreaterThan(0.85);
    expect(r.ess / 5000).toBeLessThan(1.15);
  });

  it('standard error and interval follow from τ: se = s·√(τ/n), CI = mean ∓ 1.959964·se', () => {
    const x = simulateArma({ ar: [0.8] }, 3000, 12);
    const r = effectiveSampleSize(x);
    const mean = x.reduce((a, b) => a + b, 0) / x.length;
    const s2 = x.reduce((a, b) => a + (b - mean) ** 2, 0) / (x.length - 1);
    expect(r.mean).toBeCloseTo(mean, 12);
    expect(r.standardError).toBeCloseTo(Math.sqrt((s2 * r.tau) / x.length), 12);
    expect(r.confidenceInterval[1] - r.mean).toBeCloseTo(1.959963984540054 * r.standardError, 10); // qnorm(0.975), R 4.2.2
  });

  it('an ACF handed in gives the same answer as the one it computes, and a too-short one is extended', () => {
    const x = simulateArma({ ar: [0.95] }, 20_000, 9);
    const own = effectiveSampleSize(x);
    const long = effectiveSampleSize(x, { acf: autocorrelation(x, { maxLag: 3000 }) });
    const short = effectiveSampleSize(x, { acf: autocorrelation(x, { maxLag: 3 }) });
    for (const r of [long, short]) {
      expect(r.lagsUsed).toBe(own.lagsUsed);
      expect(Math.abs(r.tau - own.tau)).toBeLessThan(1e-9 * own.tau);
      expect(Math.abs(r.ess - own.ess)).toBeLessThan(1e-9 * own.ess);
    }
    expect(own.lagsUsed).toBeGreaterThan(3);
  });
});
