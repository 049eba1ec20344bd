import { describe, expect, it } from 'vitest';
import { leastSquares } from './least-squares.ts';
import { LONGLEY, LONGLEY_COEF, LONGLEY_RSS, LONGLEY_SE, longleyDesign, sineRegression } from './least-squares-reference.testkit.ts';

/** |a − b| ≤ tol · max(1, |b|) for every element. */
function expectClose(actual: ArrayLike<number>, expected: number[], tol: number) {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expect(Math.abs(actual[i] - expected[i])).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(expected[i])));
}

describe('leastSquares', () => {
  it("matches R's lm on the Longley data (condition number ≈ 10⁸ without centring)", () => {
    const { columns, y } = longleyDesign();
    const frozen = columns.map((c) => Float64Array.from(c));
    const fit = leastSquares(columns, y);
    expectClose(fit.coefficients, LONGLEY_COEF, 1e-7);
    expectClose(fit.standardErrors, LONGLEY_SE, 1e-7);
    expect(Math.abs(fit.residualSumOfSquares - LONGLEY_RSS)).toBeLessThan(1e-8);
    expect(columns).toEqual(frozen);
    expect(Array.from(y)).toEqual(LONGLEY.employed);
  });

  it("matches R's lm on 1,000 rows, which the row-block factorisation takes in four passes", () => {
    const r = sineRegression();
    const fit = leastSquares(r.columns, r.y);
    expectClose(fit.coefficients, r.coefficients, 1e-10);
    expectClose(fit.standardErrors, r.standardErrors, 1e-9);
    expect(Math.abs(fit.residualSumOfSquares - r.residualSumOfSquares)).toBeLessThan(1e-9);
  });

  it('is exact on an exactly linear relation with a zero residual (hand check)', () => {
    const x = Float64Array.from({ length: 600 }, (_, i) => i / 10);
    const fit = leastSquares(
      [new Float64Array(600).fill(1), x],
      Float64Array.from(x, (v) => 3 - 2 * v),
    );
    expectClose(fit.coefficients, [3, -2], 1e-12);
    expect(fit.residualSumOfSquares).toBeLessThan(1e-20);
  });
});
