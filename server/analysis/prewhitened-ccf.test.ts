import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { arYuleWalker } from './ar-yule-walker.ts';
import { crossCorrelation } from './cross-correlation.ts';
import { prewhitenedCcf } from './prewhitened-ccf.ts';
import { seededNormal, simulateArma } from './seeded-simulation.testkit.ts';

/** Seeded delayed response with its own persistence: y_t = 0.9·y_{t−1} + 0.5·x_{t−d} + e_t (issue #16's model). */
function delayedResponse(input: Float64Array, delay: number, seed: number): Float64Array {
  const e = seededNormal(seed);
  const y = new Float64Array(input.length);
  for (let t = 0; t < input.length; t++) {
    y[t] = (t > 0 ? 0.9 * y[t - 1] : 0) + (t >= delay ? 0.5 * input[t - delay] : 0) + e();
  }
  return y;
}

const PAIRS = 200;
const N = 1000;

describe('prewhitenedCcf', () => {
  it('filters both series by the AR model of the input (second argument) and cross-correlates them as ccf does', () => {
    const input = simulateArma({ ar: [0.7] }, 400, 31);
    const response = delayedResponse(input, 3, 32);
    const r = prewhitenedCcf(response, input, { maxLag: 8 });
    const model = arYuleWalker(input);
    expect(r.ar.order).toBe(model.order);
    expect(Array.from(r.ar.coefficients)).toEqual(Array.from(model.coefficients));
    expect(r.ar.variance).toBe(model.variance);
    // Hand-built filter e_t = (s_t − s̄) − Σ φ_i (s_{t−i} − s̄), first p missing.
    const filter = (s: Float64Array) => {
      const mean = s.reduce((a, b) => a + b, 0) / s.length;
      return Array.from(s, (_, t) => {
        if (t < model.order) return NaN;
        let v = s[t] - mean;
        for (let i = 1; i <= model.order; i++) v -= model.coefficients[i - 1] * (s[t - i] - mean);
        return v;
      });
    };
    const expected = crossCorrelation(filter(response), filter(input), { maxLag: 8 });
    for (let i = 0; i < expected.values.length; i++) expect(r.values[i]).toBeCloseTo(expected.values[i], 14);
    expect(Array.from(r.lags)).toEqual(Array.from({ length: 17 }, (_, i) => i - 8));
    expect(r.pairs).toBe(400 - model.order);
    expect(r.strongest).toMatchObject({ lag: 3, significant: true });
  });

  it('bands: per lag z(0.975)/√pairs; Šidák over 2·maxLag + 1 lags, z(1 − (1 − (1 − α)^{1/m})/2)/√pairs', () => {
    const x = simulateArma({ ar: [0.5] }, 500, 4);
    const y = simulateArma({ ar: [0.5] }, 500, 5);
    const r = prewhitenedCcf(x, y, { maxLag: 10 });
    expect(r.simultaneousMethod).toBe('sidak');
    // R 4.2.2: qnorm(0.975) = 1.959963984540054; qnorm(1 - (1 - 0.95^(1/21))/2) = 3.03073937355245.
    expect(r.band * Math.sqrt(r.pairs)).toBeCloseTo(1.959963984540054, 12);
    expect(r.simultaneousBand * Math.sqrt(r.pairs)).toBeCloseTo(3.03073937355245, 10);
    const wider = prewhitenedCcf(x, y, { maxLag: 10, alpha: 0.01 });
    expect(wider.simultaneousBand).toBeGreaterThan(r.simultaneousBand);
  });

  it(`independent AR(1) pairs (φ = 0.9, n = ${N}): a relation is claimed in ≤ 5 % (issue #16 target), raw CCF per-lag band far more`, () => {
    let claimed = 0;
    let rawClaimed = 0;
    for (let s = 0; s < PAIRS; s++) {
      const a = simulateArma({ ar: [0.9] }, N, 1000 + s);
      const b = simulateArma({ ar: [0.9] }, N, 5000 + s);
      const r = prewhitenedCcf(a, b);
      if (r.strongest?.significant) claimed++;
      const raw = crossCorrelation(a, b, { maxLag: (r.lags.length - 1) / 2 });
      if (raw.values.some((v) => Math.abs(v) > r.band)) rawClaimed++;
    }
    expect(claimed / PAIRS).toBeLessThanOrEqual(0.05);
    expect(rawClaimed / PAIRS).toBeGreaterThan(0.5);
  });

  it(`delayed response y_t = 0.9·y_{t−1} + 0.5·x_{t−6} + e_t with x AR(1) φ = 0.7 (n = ${N}): the strongest significant lag is +6 in ≥ 80 %`, () => {
    let hits = 0;
    for (let s = 0; s < PAIRS; s++) {
      const input = simulateArma({ ar: [0.7] }, N + 200, 9000 + s);
      const response = delayedResponse(input, 6, 13000 + s);
      // Channel = response (first argument), partner = input (second), as the diagnostics use it.
      const r = prewhitenedCcf(response.subarray(200), input.subarray(200), { maxLag: 30 });
      if (r.strongest?.significant && r.strongest.lag === 6) hits++;
    }
    expect(hits / PAIRS).toBeGreaterThanOrEqual(0.8);
  });

  it('supports gaps with the na.pass rule: a missing reading removes the pairs whose filter uses it', () => {
    const input = simulateArma({ ar: [0.6] }, 300, 7);
    const response = delayedResponse(input, 2, 8);
    const gappy = Float64Array.from(response);
    gappy[100] = NaN;
    const r = prewhitenedCcf(gappy, input, { maxLag: 5 });
    expect(r.pairs).toBe(300 - r.ar.order - (r.ar.order + 1));
    expect(r.values.every((v) => Number.isFinite(v))).toBe(true);
  });

  it('property: positive affine changes of either series leave the values alone; negating the response negates them', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10_000 }),
        fc.double({ min: 1e-2, max: 1e3, noNaN: true }),
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        (seed, scale, shift) => {
          const input = simulateArma({ ar: [0.6] }, 150, seed);
          const response = delayedResponse(input, 2, seed + 1);
          const r = prewhitenedCcf(response, input, { maxLag: 6 });
          const s = prewhitenedCcf(
            response.map((v) => scale * v + shift),
            input.map((v) => v / scale - shift),
            { maxLag: 6 },
          );
          const flipped = prewhitenedCcf(
            response.map((v) => -v),
            input,
            { maxLag: 6 },
          );
          for (let i = 0; i < r.values.length; i++) {
            expect(Math.abs(s.values[i] - r.values[i])).toBeLessThanOrEqual(1e-9);
            expect(Math.abs(flipped.values[i] + r.values[i])).toBeLessThanOrEqual(1e-12);
          }
          expect(s.ar.order).toBe(r.ar.order);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('never mutates its inputs', () => {
    const x = simulateArma({ ar: [0.5] }, 200, 1);
    const y = simulateArma({ ar: [0.5] }, 200, 2);
    const [xc, yc] = [Float64Array.from(x), Float64Array.from(y)];
    prewhitenedCcf(x, y);
    expect(() => prewhitenedCcf(Object.freeze(Array.from(x)), Object.freeze(Array.from(y)))).not.toThrow(); // a write would throw
    expect(x).toEqual(xc);
    expect(y).toEqual(yc);
  });

  it('refuses bad input with a clear message', () => {
    const x = Array.from({ length: 50 }, (_, i) => Math.sin(i) + i / 10);
    const y = Array.from({ length: 50 }, (_, i) => Math.cos(i * 1.3));
    const fails = (f: () => unknown, message: string) => {
      expect(f).toThrow(AnalysisInputError);
      expect(f).toThrow(message);
    };
    fails(() => prewhitenedCcf(x, y.slice(1)), 'prewhitenedCcf: the two series must have the same length (got 50 and 49)');
    fails(() => prewhitenedCcf(x.slice(0, 4), y.slice(0, 4)), 'prewhitenedCcf requires at least 10 data points in each series (got 4)');
    fails(() => prewhitenedCcf(x, new Array(50).fill(3)), 'prewhitenedCcf: the input (second argument) is constant, so it has no cross-correlation');
    fails(() => prewhitenedCcf(new Array(50).fill(3), y), 'prewhitenedCcf: the response (first argument) is constant, so it has no cross-correlation');
    fails(() => prewhitenedCcf(x, y, { alpha: 1.5 }), 'prewhitenedCcf: alpha must be between 0 and 1 (got 1.5)');
    fails(() => prewhitenedCcf(x, y, { maxLag: 2.5 }), 'prewhitenedCcf: maxLag must be a whole number from 0 to');
    fails(() => prewhitenedCcf(null as never, y), 'prewhitenedCcf: the series must be an array of numbers');
    const gaps = y.map((v, i) => (i % 2 ? NaN : v));
    fails(
      () =>
        prewhitenedCcf(
          x.map((v, i) => (i % 2 ? v : NaN)),
          gaps,
        ),
      'prewhitenedCcf: after the AR(0) filter only 0 time steps have both series present (at least 10 needed); fill the gaps or choose a longer range',
    );
  });
});
