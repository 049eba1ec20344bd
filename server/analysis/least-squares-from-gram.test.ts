import { describe, expect, it } from 'vitest';
import { leastSquaresFromGram } from './least-squares-from-gram.ts';
import { longleyDesign, sineRegression } from './least-squares-reference.testkit.ts';

/** XᵀX, Xᵀy and yᵀy formed row by row (the plain definition the route's inputs must equal). */
function crossProducts(columns: Float64Array[], y: Float64Array) {
  const k = columns.length;
  const gram = new Float64Array(k * k);
  const xty = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) for (let r = 0; r < y.length; r++) gram[i * k + j] += columns[i][r] * columns[j][r];
    for (let r = 0; r < y.length; r++) xty[i] += columns[i][r] * y[r];
  }
  let yty = 0;
  for (let r = 0; r < y.length; r++) yty += y[r] * y[r];
  return { gram, xty, yty };
}

function fit(columns: Float64Array[], y: Float64Array) {
  const { gram, xty, yty } = crossProducts(columns, y);
  return leastSquaresFromGram(gram, xty, yty, columns, y);
}

/** |a − b| ≤ tol · max(1, |b|) for every element. */
function expectClose(actual: ArrayLike<number>, expected: number[], tol: number) {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expect(Math.abs(actual[i] - expected[i])).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(expected[i])));
}

describe('leastSquaresFromGram', () => {
  it("matches R's lm on a well-conditioned regression of 1,000 rows", () => {
    // R 4.2.2's lm (see the testkit)
    const r = sineRegression();
    const result = fit(r.columns, r.y);
    expect(result).not.toBeNull();
    expectClose(result!.coefficients, r.coefficients, 1e-10);
    expectClose(result!.standardErrors, r.standardErrors, 1e-9);
    expect(Math.abs(result!.residualSumOfSquares - r.residualSumOfSquares)).toBeLessThan(1e-9);
  });

  it('refuses an ill-conditioned design (Longley 1967: NIST StRD "Longley", κ(X) ≈ 10⁸ unscaled) so the caller uses QR', () => {
    const { columns, y } = longleyDesign();
    expect(fit(columns, y)).toBeNull();
  });

  it('refuses a design with a zero column or exactly repeated columns', () => {
    const x = Float64Array.from({ length: 50 }, (_, i) => Math.sin(i));
    const y = Float64Array.from({ length: 50 }, (_, i) => Math.cos(i));
    expect(fit([new Float64Array(50), x], y)).toBeNull();
    expect(fit([x, Float64Array.from(x)], y)).toBeNull();
  });

  it('sums the residuals of an exact fit instead of cancelling yᵀy − βᵀXᵀy (hand check)', () => {
    const x = Float64Array.from({ length: 600 }, (_, i) => i / 10);
    const result = fit(
      [new Float64Array(600).fill(1), x],
      Float64Array.from(x, (v) => 3 - 2 * v),
    );
    expectClose(result!.coefficients, [3, -2], 1e-12);
    // yᵀy ≈ 2.7·10⁶: the shortcut alone gives 9.3·10⁻¹⁰ here (rounding noise), the residuals 0.
    expect(result!.residualSumOfSquares).toBeLessThan(1e-20);
  });
});
