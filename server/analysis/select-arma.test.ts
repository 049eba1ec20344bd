import { describe, expect, it } from 'vitest';
import { fitArma } from './fit-arma.ts';
import { ljungBox } from './ljung-box.ts';
import { selectArma } from './select-arma.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('selectArma', () => {
  it('fits every candidate, chooses the lowest AICc among admissible fits and returns that fit', () => {
    const x = simulateArma({ ar: [0.7] }, 400, 2024);
    const result = selectArma(x, { maxP: 2, maxQ: 2 });
    expect(result.candidates.map((c) => `${c.p},${c.q}`)).toEqual(['0,0', '0,1', '0,2', '1,0', '1,1', '1,2', '2,0', '2,1', '2,2']);
    const admissible = result.candidates.filter((c) => c.admissible);
    const lowest = Math.min(...admissible.map((c) => c.aicc));
    expect(result.aicc).toBe(lowest);
    expect(result.model.aicc).toBe(lowest);
    expect([result.p, result.q]).toEqual([1, 0]); // the simulated truth wins here
    const refit = fitArma(x, { p: result.p, q: result.q });
    expect(refit.logLik).toBeCloseTo(result.model.logLik, 6);
    for (const c of result.candidates) {
      expect(c.model.ar).toHaveLength(c.p);
      expect(c.model.ma).toHaveLength(c.q);
      expect(c.model.logLik).toBe(c.logLik);
    }
    expect(result.candidates.find((c) => c.p === result.p && c.q === result.q)!.model).toBe(result.model);
  });

  it("never leaves a candidate's likelihood below a nested candidate's (warm starts from nested fits)", () => {
    // Without the warm starts ARMA(3,3) ended 1.2 below ARMA(3,2) on this series.
    const x = simulateArma({ ar: [0.5, 0.2], ma: [0.4] }, 300, 5);
    const { candidates } = selectArma(x);
    const logLik = (p: number, q: number) => candidates.find((c) => c.p === p && c.q === q)!.logLik;
    for (const c of candidates) {
      if (c.p > 0) expect(c.logLik, `ARMA(${c.p},${c.q}) vs ARMA(${c.p - 1},${c.q})`).toBeGreaterThanOrEqual(logLik(c.p - 1, c.q) - 1e-6);
      if (c.q > 0) expect(c.logLik, `ARMA(${c.p},${c.q}) vs ARMA(${c.p},${c.q - 1})`).toBeGreaterThanOrEqual(logLik(c.p, c.q - 1) - 1e-6);
    }
  });

  it('tests the residuals with Ljung–Box, fitdf = p + q, lag min(10, n/5) but above fitdf', () => {
    const x = simulateArma({ ma: [0.5] }, 300, 7);
    const result = selectArma(x, { maxP: 1, maxQ: 1 });
    const fitdf = result.p + result.q;
    expect(result.residualTest.lag).toBe(10);
    const expected = ljungBox(result.model.residuals, { lag: 10, fitdf });
    expect(result.residualTest).toEqual({ ...expected, lag: 10 });
    expect(result.residualTest.df).toBe(10 - fitdf);

    const short = selectArma(simulateArma({ ar: [0.4] }, 30, 9), { maxP: 2, maxQ: 2 });
    expect(short.residualTest.lag).toBe(Math.max(6, short.p + short.q + 1));
  });

  it('leaves out candidates with too few points and refuses series too short for any model', () => {
    const x = simulateArma({ ar: [0.4] }, 22, 9);
    const result = selectArma(x, { maxP: 3, maxQ: 3 });
    expect(result.candidates.every((c) => 3 * (c.p + c.q + 1) + 10 <= 22)).toBe(true);
    expect(result.candidates.some((c) => c.p + c.q === 3)).toBe(true);
    expect(result.candidates.some((c) => c.p + c.q === 4)).toBe(false);
    expect(() => selectArma([1, 2, 3, 2, 1, 2, 3, 2, 1, 2])).toThrow('selectArma needs at least 13 points (got 10): choose a longer range of readings');
  });

  it('rejects a converged candidate whose AR and MA roots nearly cancel on the unit circle', () => {
    // ARMA(1,1) truth, n = 1000, seed 7: ARMA(3,3) reaches a higher likelihood with an AR and an MA
    // root pair of modulus ≈ 1.01 (checked with R 4.2.2: arima(x, order = c(3, 0, 3), fixed = …,
    // transform.pars = FALSE, method = "ML") gives the same loglik −1382.851973 at that point).
    const x = simulateArma({ ar: [0.6], ma: [0.3] }, 1000, 7);
    const result = selectArma(x);
    const c33 = result.candidates.find((c) => c.p === 3 && c.q === 3)!;
    expect(c33.smallestRoot).toBeLessThan(1.01);
    expect(c33.admissible).toBe(false);
    expect([result.p, result.q]).toEqual([1, 1]);
  });

  it('refuses bad options and does not mutate its input', () => {
    const x = Object.freeze(Array.from(simulateArma({ ar: [0.4] }, 60, 3)));
    const copy = [...x];
    selectArma(x, { maxP: 1, maxQ: 1 });
    expect(x).toEqual(copy);
    expect(() => selectArma(x, { maxP: 6 })).toThrow('selectArma: maxP must be a whole number from 0 to 5 (got 6)');
    expect(() => selectArma(x, { maxQ: 0.5 })).toThrow('selectArma: maxQ must be a whole number from 0 to 5 (got 0.5)');
    expect(() => selectArma('abc' as never)).toThrow('selectArma: the series must be an array of numbers');
    expect(() => selectArma(new Array(50).fill(2))).toThrow(
      'selectArma: the series is constant (every value is 2), so no ARMA model can be fitted: choose a range where the readings vary',
    );
  });

  it('skips candidates above maxTotalOrder (p + q) and fits the same models it keeps', () => {
    const x = simulateArma({ ar: [0.6] }, 300, 31);
    const capped = selectArma(x, { maxTotalOrder: 2 });
    expect(capped.candidates.map((c) => `${c.p}${c.q}`)).toEqual(['00', '01', '02', '10', '11', '20']);
    const full = selectArma(x);
    for (const c of capped.candidates) expect(c.logLik).toBeCloseTo(full.candidates.find((f) => f.p === c.p && f.q === c.q)!.logLik, 6);
    expect(() => selectArma(x, { maxTotalOrder: 11 })).toThrow('selectArma: maxTotalOrder must be a whole number from 0 to 10 (got 11)');
  });
});
