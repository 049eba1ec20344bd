import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { augmentedDickeyFuller } from './augmented-dickey-fuller.ts';
import { dickeyFullerCrossProducts } from './dickey-fuller-cross-products.ts';
import { leastSquares } from './least-squares.ts';
import { leastSquaresFromGram } from './least-squares-from-gram.ts';
import { seededNormal, simulateArma } from './seeded-simulation.testkit.ts';

function differences(x: Float64Array): Float64Array {
  const d = new Float64Array(x.length - 1);
  for (let t = 1; t < x.length; t++) d[t - 1] = x[t] - x[t - 1];
  return d;
}

/** The ADF t-ratio by Householder QR on the regression's columns (the route the cross products replace). */
function statisticByQr(x: Float64Array, lags: number): number {
  const diff = differences(x);
  const { columns } = dickeyFullerCrossProducts(x, diff, lags, 0);
  const fit = leastSquares(columns, diff.subarray(lags));
  return fit.coefficients[0] / fit.standardErrors[0];
}

describe('dickeyFullerCrossProducts', () => {
  it('equals XᵀX, Xᵀy and yᵀy formed row by row from its own columns', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 12, maxLength: 200 }),
        fc.nat(),
        fc.double({ min: -10, max: 10, noNaN: true }),
        (values, lagSeed, shift) => {
          const x = Float64Array.from(values);
          const diff = differences(x);
          const lags = lagSeed % Math.floor((x.length - 4) / 2);
          const { columns, gram, xty, yty } = dickeyFullerCrossProducts(x, diff, lags, shift);
          const y = diff.subarray(lags);
          const k = lags + 2;
          expect(columns).toHaveLength(k);
          // Rounding allowance: the products' absolute sum, and for the telescoped window sums the
          // size of the values themselves.
          const largest = values.reduce((m, v) => Math.max(m, Math.abs(v)), 0) * x.length;
          const scale = (a: Float64Array, b: ArrayLike<number>) => {
            let s = largest;
            for (let r = 0; r < y.length; r++) s += Math.abs(a[r] * b[r]);
            return s;
          };
          const direct = (a: Float64Array, b: ArrayLike<number>) => {
            let s = 0;
            for (let r = 0; r < y.length; r++) s += a[r] * b[r];
            return s;
          };
          for (let i = 0; i < k; i++) {
            expect(columns[i]).toHaveLength(y.length);
            for (let j = 0; j < k; j++)
              expect(Math.abs(gram[i * k + j] - direct(columns[i], columns[j]))).toBeLessThanOrEqual(1e-12 * (scale(columns[i], columns[j]) + 1));
            expect(Math.abs(xty[i] - direct(columns[i], y))).toBeLessThanOrEqual(1e-12 * (scale(columns[i], y) + 1));
          }
          expect(Math.abs(yty - direct(y as Float64Array, y))).toBeLessThanOrEqual(1e-12 * (yty + 1));
          // the level column is shifted, the last one is the constant
          for (let r = 0; r < y.length; r++) expect(columns[0][r]).toBe(x[lags + r] - shift);
          expect(columns[k - 1].every((v) => v === 1)).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
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

  it('gives the statistic of a Householder QR fit of the same regression on stationary, random-walk, seasonal and offset series', () => {
    const normal = seededNormal(11);
    const seasonal = Float64Array.from({ length: 3000 }, (_, t) => 10 * Math.sin((2 * Math.PI * t) / 24) + normal());
    const offset = Float64Array.from(simulateArma({ ar: [0.9] }, 3000, 5), (v) => 1013.25 + 0.01 * v);
    const cases: Array<[string, Float64Array]> = [
      ['AR(1) 0.9', simulateArma({ ar: [0.9] }, 3000, 3)],
      ['random walk', simulateArma({ ar: [1] }, 3000, 4, 0)],
      ['daily cycle', seasonal],
      ['a level far from zero', offset],
    ];
    for (const [, x] of cases) {
      for (const lags of [0, 3, 12]) {
        const expected = statisticByQr(x, lags);
        expect(Math.abs(augmentedDickeyFuller(x, { lags }).statistic - expected)).toBeLessThanOrEqual(1e-9 * Math.abs(expected));
      }
    }
  });

  it('falls back to QR when the lagged differences are nearly collinear', () => {
    // Differences of a sampled sine obey an exact two-term recursion, so beyond two lags the
    // columns are dependent up to the added noise.
    const normal = seededNormal(12);
    const x = Float64Array.from({ length: 2000 }, (_, t) => Math.sin(t / 40) + 1e-7 * normal());
    const diff = differences(x);
    const lags = 6;
    const { columns, gram, xty, yty } = dickeyFullerCrossProducts(x, diff, lags, 0);
    expect(leastSquaresFromGram(gram, xty, yty, columns, diff.subarray(lags))).toBeNull();
    const expected = statisticByQr(x, lags);
    // (the engine shifts the level by its mean first, which changes only rounding)
    expect(Math.abs(augmentedDickeyFuller(x, { lags }).statistic - expected)).toBeLessThanOrEqual(1e-9 * Math.abs(expected));
  });
});
