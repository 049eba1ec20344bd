import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { identifyProcess } from './identify-process.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

/** Simulated processes (fixed seeds, n = 2000) must be recognised; seeds are not hand-picked: 1–3. */
const SEEDS = [1, 2, 3];

describe('identifyProcess on simulated processes', () => {
  const cases: [string, { ar?: number[]; ma?: number[] }, Partial<{ verdict: string; p: number; q: number }>][] = [
    ['white noise', {}, { verdict: 'white-noise' }],
    ['AR(1) φ = 0.7', { ar: [0.7] }, { verdict: 'ar', p: 1 }],
    ['AR(2) φ = (0.5, 0.3)', { ar: [0.5, 0.3] }, { verdict: 'ar', p: 2 }],
    ['MA(1) θ = 0.6', { ma: [0.6] }, { verdict: 'ma', q: 1 }],
    ['MA(2) θ = (0.5, 0.4)', { ma: [0.5, 0.4] }, { verdict: 'ma', q: 2 }],
  ];
  for (const [label, spec, expected] of cases) {
    it(label, () => {
      for (const seed of SEEDS) {
        const result = identifyProcess(simulateArma(spec, 2000, seed));
        expect({ seed, verdict: result.verdict, p: result.p, q: result.q }).toMatchObject({ seed, ...expected });
      }
    });
  }

  it('a random walk needs differencing', () => {
    const walk = simulateArma({ ar: [1] }, 2000, 5, 0);
    const result = identifyProcess(walk);
    expect(result.verdict).toBe('needs-differencing');
    expect(result.evidence.unitRoot?.rejectsUnitRoot).toBe(false);
    expect(result.explanation).toMatch(/differences/);
  });

  it('takes a period already found by the caller instead of searching again (knownPeriod)', () => {
    const noise = simulateArma({ ar: [0.5] }, 288 * 10, 6);
    const daily = noise.map((v, t) => v + 1.5 * Math.sin((2 * Math.PI * t) / 288));
    expect(identifyProcess(daily, { knownPeriod: 288 })).toMatchObject({ verdict: 'seasonal', period: 288 });
    expect(identifyProcess(daily, { knownPeriod: null }).verdict).not.toBe('seasonal');
  });

  it('a daily cycle in 5-minute readings is seasonal with s ≈ 288', () => {
    const noise = simulateArma({ ar: [0.5] }, 288 * 10, 6);
    const result = identifyProcess(noise.map((v, t) => v + 1.5 * Math.sin((2 * Math.PI * t) / 288)));
    expect(result.verdict).toBe('seasonal');
    expect(Math.abs((result.period ?? 0) - 288)).toBeLessThanOrEqual(3);
  });

  it('reports its evidence and a plain-language explanation', () => {
    const result = identifyProcess(simulateArma({ ar: [0.7] }, 2000, 1));
    expect(result.explanation).toMatch(/^Each reading is largely carried over from the previous one/);
    expect(result.evidence.pacfPattern).toBe('cuts-off');
    expect(result.evidence.acfPattern).toBe('tails-off');
    expect(result.evidence.significantPacfLags[0]).toBe(1);
    expect(result.evidence.ljungBox.pValue).toBeLessThan(1e-10);
    expect(result.evidence.period).toBeNull();
  });

  it('reads an ACF handed in (a longer one is cut to its lags) and reaches the same verdict and evidence', () => {
    const x = simulateArma({ ma: [0.5, 0.4] }, 2000, 2);
    const own = identifyProcess(x);
    const given = identifyProcess(x, { acf: autocorrelation(x, { maxLag: 300 }) });
    expect(given.verdict).toBe(own.verdict);
    expect(given.q).toBe(own.q);
    expect(given.evidence.acf).toHaveLength(own.evidence.acf.length);
    for (let k = 0; k < own.evidence.acf.length; k++) expect(Math.abs(given.evidence.acf[k] - own.evidence.acf[k])).toBeLessThan(1e-12);
    expect(Math.abs(given.evidence.ljungBox.statistic - own.evidence.ljungBox.statistic)).toBeLessThan(1e-9);
    expect(given.evidence.significantAcfLags).toEqual(own.evidence.significantAcfLags);
  });

  it('does not quote an information figure for a model at the edge of a wandering level (AR root within 1.01)', () => {
    const x = simulateArma({ ar: [0.997] }, 40_000, 23);
    const result = identifyProcess(x, { knownPeriod: null });
    expect(result.evidence.unitRoot?.rejectsUnitRoot).toBe(true);
    expect(result.model?.smallestArRoot).toBeLessThan(1.01);
    expect(result.explanation).toContain('cannot say how many readings are independent information');
    expect(result.explanation).not.toMatch(/about 1 in [\d,.]+ readings/);
  });
});
