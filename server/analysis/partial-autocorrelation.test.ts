import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { partialAutocorrelation } from './partial-autocorrelation.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('partialAutocorrelation', () => {
  it('Durbin–Levinson on the theoretical ACF of an AR(2) returns φ_22 = φ_2 and zeros after', () => {
    // AR(2) φ = (0.5, 0.3): ρ1 = φ1/(1 − φ2), ρk = φ1 ρ_{k−1} + φ2 ρ_{k−2} (Brockwell & Davis, ITSF §3.2).
    const rho = [1, 0.5 / 0.7];
    for (let k = 2; k <= 6; k++) rho.push(0.5 * rho[k - 1] + 0.3 * rho[k - 2]);
    const { partial, coefficients, variances } = durbinLevinson(rho, 6);
    expect(partial[0]).toBeCloseTo(0.5 / 0.7, 14);
    expect(partial[1]).toBeCloseTo(0.3, 14);
    for (let k = 2; k < 6; k++) expect(Math.abs(partial[k])).toBeLessThan(1e-14);
    expect(coefficients[1][0]).toBeCloseTo(0.5, 14);
    expect(coefficients[1][1]).toBeCloseTo(0.3, 14);
    // v_2 = γ0 (1 − ρ1²)(1 − φ22²) = 1/γ0-normalised innovation variance σ²/γ0.
    expect(variances[2]).toBeCloseTo((1 - (0.5 / 0.7) ** 2) * (1 - 0.09), 14);
  });

  it('a simulated AR(1) has its PACF inside ±3/√n beyond lag 1', () => {
    const x = simulateArma({ ar: [0.6] }, 5000, 42);
    const p = partialAutocorrelation(x, { maxLag: 10 });
    expect(p[0]).toBeGreaterThan(0.55);
    for (let k = 1; k < 10; k++) expect(Math.abs(p[k])).toBeLessThan(3 / Math.sqrt(5000));
  });

  it('without the coefficients of every order, Durbin–Levinson gives the same partials and variances', () => {
    const x = simulateArma({ ar: [0.6, -0.2] }, 3000, 5);
    const r = autocorrelation(x, { maxLag: 200 });
    const full = durbinLevinson(r, 200);
    const lean = durbinLevinson(r, 200, { keepCoefficients: false });
    expect(lean.partial).toEqual(full.partial);
    expect(lean.variances).toEqual(full.variances);
    expect(lean.coefficients).toEqual([]);
    expect(full.coefficients).toHaveLength(200);
  });
});
