/**
 * Test-only reference regressions with R's answers, shared by the least-squares tests (QR and
 * the cross-product route). Nothing in the engine imports this file.
 */

// R 4.2.2, datasets::longley (Longley 1967, JASA 62:819–841; also NIST StRD "Longley"), a
// notoriously ill-conditioned regression:
//   fit <- lm(Employed ~ GNP.deflator + GNP + Unemployed + Armed.Forces + Population + Year, data = longley)
//   sprintf("%.17g", coef(fit)); sprintf("%.17g", summary(fit)$coefficients[, 2]); sum(residuals(fit)^2)
export const LONGLEY = {
  deflator: [83, 88.5, 88.2, 89.5, 96.2, 98.1, 99, 100, 101.2, 104.6, 108.4, 110.8, 112.6, 114.2, 115.7, 116.9],
  gnp: [234.289, 259.426, 258.054, 284.599, 328.975, 346.999, 365.385, 363.112, 397.469, 419.18, 442.769, 444.546, 482.704, 502.601, 518.173, 554.894],
  unemployed: [235.6, 232.5, 368.2, 335.1, 209.9, 193.2, 187, 357.8, 290.4, 282.2, 293.6, 468.1, 381.3, 393.1, 480.6, 400.7],
  armed: [159, 145.6, 161.6, 165, 309.9, 359.4, 354.7, 335, 304.8, 285.7, 279.8, 263.7, 255.2, 251.4, 257.2, 282.7],
  population: [107.608, 108.632, 109.773, 110.929, 112.075, 113.27, 115.094, 116.219, 117.388, 118.734, 120.445, 121.95, 123.366, 125.368, 127.852, 130.081],
  year: Array.from({ length: 16 }, (_, i) => 1947 + i),
  employed: [60.323, 61.122, 60.171, 61.187, 63.221, 63.639, 64.989, 63.761, 66.019, 67.857, 68.169, 66.513, 68.655, 69.564, 69.331, 70.551],
};
export const LONGLEY_COEF = [
  -3482.2586345958148, 0.015061872271372779, -0.035819179292591, -0.02020229803816824, -0.010332268671735891, -0.051104105653579195, 1.8291514646135503,
];
export const LONGLEY_SE = [
  890.4203836073757, 0.084914925774767377, 0.033491007772243411, 0.0048839968165170283, 0.0021427416316167573, 0.22607320006937262, 0.45547849914221344,
];
export const LONGLEY_RSS = 0.83642405550591969;

/** Longley's design with its intercept column, and the response. */
export function longleyDesign(): { columns: Float64Array[]; y: Float64Array } {
  const f = (a: number[]) => Float64Array.from(a);
  const L = LONGLEY;
  return {
    columns: [new Float64Array(16).fill(1), f(L.deflator), f(L.gnp), f(L.unemployed), f(L.armed), f(L.population), f(L.year)],
    y: f(L.employed),
  };
}

/**
 * A well-conditioned regression of 1,000 rows and R's fit of it. R 4.2.2:
 *   t <- 0:999; x1 <- sin(t/7); x2 <- cos(t/13) + t/1000; y <- 2 + 0.5*x1 - 1.5*x2 + 0.1*sin(t*1.7)
 *   f2 <- lm(y ~ x1 + x2); coef(f2); summary(f2)$coefficients[, 2]; sum(residuals(f2)^2)
 */
export function sineRegression() {
  const t = Array.from({ length: 1000 }, (_, i) => i);
  const x1 = Float64Array.from(t, (i) => Math.sin(i / 7));
  const x2 = Float64Array.from(t, (i) => Math.cos(i / 13) + i / 1000);
  return {
    columns: [new Float64Array(1000).fill(1), x1, x2],
    y: Float64Array.from(t, (i) => 2 + 0.5 * x1[i] - 1.5 * x2[i] + 0.1 * Math.sin(i * 1.7)),
    coefficients: [2.0000564169940453, 0.49987618879536877, -1.499905668738909],
    standardErrors: [0.0026884977963380868, 0.0031703563214491924, 0.0029010977616298526],
    residualSumOfSquares: 4.9994564133333697,
  };
}
