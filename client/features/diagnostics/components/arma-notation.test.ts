import { describe, expect, it } from 'vitest';
import { armaName, armaOneLine, coefficientRows, subscript } from './arma-notation.ts';

// Model naming is the usual ARMA(p, q) notation (Box, Jenkins, Reinsel & Ljung 2015, ch. 3; common
// practice). The fitted numbers below are invented for formatting only.
describe('ARMA notation', () => {
  it('names the model by its orders', () => {
    expect(armaName(0, 0)).toBe('white noise');
    expect(armaName(2, 0)).toBe('AR(2)');
    expect(armaName(0, 1)).toBe('MA(1)');
    expect(armaName(1, 1)).toBe('ARMA(1, 1)');
    expect(subscript(12)).toBe('₁₂');
  });

  it('lists φ, θ and μ with their standard errors in order', () => {
    const m = {
      p: 1,
      q: 1,
      ar: [0.82],
      ma: [-0.3],
      mean: 21.5,
      standardErrors: { ar: [0.031], ma: [0.05], mean: 0.4 },
      sigma2: 0.1,
      logLik: -10,
      aicc: 28,
      converged: true,
    };
    expect(coefficientRows(m).map((r) => [r.symbol, r.estimate, r.standardError])).toEqual([
      ['φ₁', 0.82, 0.031],
      ['θ₁', -0.3, 0.05],
      ['μ', 21.5, 0.4],
    ]);
    expect(armaOneLine(m)).toBe('ARMA(1, 1): φ₁ = 0.820 ± 0.031, θ₁ = -0.300 ± 0.050');
    expect(armaOneLine({ ...m, p: 0, q: 0, ar: [], ma: [], standardErrors: { ar: [], ma: [], mean: 0.4 } })).toBe('white noise');
  });
});
