import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { lagOneCoefficient } from './lag-one-coefficient.ts';

/**
 * Data-driven truncation lag of the Bartlett (Newey–West) kernel for a long-run variance: the
 * series' lag-1 autocorrelation ρ is estimated by least squares of u_t on u_{t−1} (mean
 * removed), Andrews' AR(1) plug-in α(1) = 4ρ² / ((1 − ρ)² (1 + ρ)²) gives the bandwidth
 * S = 1.1447 (α(1) n)^{1/3}, and the lag is ⌈S⌉ − 1 because a Newey–West lag L weights lag j by
 * 1 − j / (L + 1), i.e. bandwidth L + 1 (Andrews 1991, Econometrica 59:817–858, eq. 5.3 and
 * §6, eq. 6.4 for one series; Newey & West 1994, Rev. Econ. Stud. 61:631–653 on why the fixed
 * ⌊4 (n/100)^{2/9}⌋ lag is too short for persistent series). The result is at least
 * `minimum` and at most ⌊n / 4⌋. NaN values are skipped together with their neighbours' pairs.
 *
 * Use it on regression residuals (a trend line's, for `trendTest`). Cost: O(n).
 */
export function andrewsBartlettLag(u: Series, minimum = 1): number {
  let count = 0;
  for (let i = 0; i < u.length; i++) if (!Number.isNaN(u[i])) count++;
  if (count < 8)
    throw new AnalysisInputError(`andrewsBartlettLag requires at least 8 values (got ${count})`, { reason: 'too-few-values', need: 8, got: count });
  const rho = Math.max(-0.99, Math.min(0.99, lagOneCoefficient(u)));
  const alpha1 = (4 * rho * rho) / ((1 - rho) ** 2 * (1 + rho) ** 2);
  const bandwidth = 1.1447 * Math.cbrt(alpha1 * count);
  return Math.max(minimum, Math.min(Math.floor(count / 4), Math.ceil(bandwidth) - 1));
}
