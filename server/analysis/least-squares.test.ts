import { describe, expect, it } from 'vitest';
import { leastSquares } from './least-squares.ts';

/** |a − b| ≤ tol · max(1, |b|) for every element. */
function expectClose(actual: ArrayLike<number>, expected: number[], tol: number) {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expect(Math.abs(actual[i] - expected[i])).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(expected[i])));
}

// R 4.2.2, datasets::longley (Longley 1967, JASA 62:819–841; also NIST StRD "Longley"), a
// notoriously ill-conditioned regression:
//   fit <- lm(Employed ~ GNP.deflator + GNP + Unemployed + Armed.Forces + Population + Year, data = longley)
//   sprintf("%.17g", coef(fit)); sprintf("%.17g", summary(fit)$coefficients[, 2]); sum(residuals(fit)^2)
const LONGLEY = {
  deflator: [83, 88.5, 88.2, 89.5, 96.2, 98.1, 99, 100, 101.2, 104.6, 108.4, 110.8, 112.6, 114.2, 115.7, 116.9],
  gnp: [234.289, 259.426, 258.054, 284.599, 328.975, 346.999, 365.385, 363.112, 397.469, 419.18, 442.769, 444.546, 482.704, 502.601, 518.173, 554.894],
  unemployed: [235.6, 232.5, 368.2, 335.1, 209.9, 193.2, 187, 357.8, 290.4, 282.2, 293.6, 468.1, 381.3, 393.1, 480.6, 400.7],
  armed: [159, 145.6, 161.6, 165, 309.9, 359.4, 354.7, 335, 304.8, 285.7, 279.8, 263.7, 255.2, 251.4, 257.2, 282.7],
  population: [107.608, 108.632, 109.773, 110.929, 112.075, 113.27, 115.094, 116.219, 117.388, 118.734, 120.445, 121.95, 123.366, 125.368, 127.852, 130.081],
  year: Array.from({ length: 16 }, (_, i) => 1947 + i),
  employed: [60.323, 61.122, 60.171, 61.187, 63.221, 63.639, 64.989, 63.761, 66.019, 67.857, 68.169, 66.513, 68.655, 69.564, 69.331, 70.551],
};
const LONGLEY_COEF = [-3482.2586345958148, 0.015061872271372779, -0.035819179292591, -0.02020229803816824, -0.010332268671735891, -0.051104105653579195, 1.8291514646135503];
const LONGLEY_SE = [890.4203836073757, 0.084914925774767377, 0.033491007772243411, 0.0048839968165170283, 0.0021427416316167573, 0.22607320006937262, 0.45547849914221344];
const LONGLEY_RSS = 0.83642405550591969;

describe('leastSquares', () => {
  it("matches R's lm on the Longley data (condition number ≈ 10⁸ without centring)", () => {
    const L = LONGLEY;
    const f = (a: number[]) => Float64Array.from(a);
    const columns = [new Float64Array(16).fill(1), f(L.deflator), f(L.gnp), f(L.unemployed), f(L.armed), f(L.population), f(L.year)];
    const frozen = columns.map((c) => Float64Array.from(c));
    const y = f(L.employed);
    const fit = leastSquares(columns, y);
    expectClose(fit.coefficients, LONGLEY_COEF, 1e-7);
    expectClose(fit.standardErrors, LONGLEY_SE, 1e-7);
    expect(Math.abs(fit.residualSumOfSquares - LONGLEY_RSS)).toBeLessThan(1e-8);
    expect(columns).toEqual(frozen);
    expect(Array.from(y)).toEqual(L.employed);
  });

  it("matches R's lm on 1,000 rows, which the row-block factorisation takes in four passes", () => {
    // R 4.2.2: t <- 0:999; x1 <- sin(t/7); x2 <- cos(t/13) + t/1000; y <- 2 + 0.5*x1 - 1.5*x2 + 0.1*sin(t*1.7)
    //          f2 <- lm(y ~ x1 + x2); coef(f2); summary(f2)$coefficients[, 2]; sum(residuals(f2)^2)
    const t = Array.from({ length: 1000 }, (_, i) => i);
    const x1 = Float64Array.from(t, (i) => Math.sin(i / 7));
    const x2 = Float64Array.from(t, (i) => Math.cos(i / 13) + i / 1000);
    const y = Float64Array.from(t, (i) => 2 + 0.5 * x1[i] - 1.5 * x2[i] + 0.1 * Math.sin(i * 1.7));
    const fit = leastSquares([new Float64Array(1000).fill(1), x1, x2], y);
    expectClose(fit.coefficients, [2.0000564169940453, 0.49987618879536877, -1.499905668738909], 1e-10);
    expectClose(fit.standardErrors, [0.0026884977963380868, 0.0031703563214491924, 0.0029010977616298526], 1e-9);
    expect(Math.abs(fit.residualSumOfSquares - 4.9994564133333697)).toBeLessThan(1e-9);
  });

  it('is exact on an exactly linear relation with a zero residual (hand check)', () => {
    const x = Float64Array.from({ length: 600 }, (_, i) => i / 10);
    const fit = leastSquares([new Float64Array(600).fill(1), x], Float64Array.from(x, (v) => 3 - 2 * v));
    expectClose(fit.coefficients, [3, -2], 1e-12);
    expect(fit.residualSumOfSquares).toBeLessThan(1e-20);
  });
});
