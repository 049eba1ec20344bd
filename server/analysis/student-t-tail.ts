import { AnalysisInputError } from './analysis-input-error.ts';
import { incompleteBeta } from './incomplete-beta.ts';

/**
 * Upper tail probability P(T > t) of Student's t distribution with `df` > 0 degrees of freedom
 * (whole or fractional, as Welch–Satterthwaite gives them): the p-value of a t test is twice
 * this at |t|.
 *
 * P(T > t) = ½ I_{ν/(ν+t²)}(ν/2, ½) for t ≥ 0 (Abramowitz & Stegun 26.7.1 with 26.5.27), the
 * argument's complement passed as t²/(ν + t²) so no digit is lost near t = 0. Agrees with R's
 * `pt(t, df, lower.tail = FALSE)` to about 1e-14 relative in the tests.
 *
 * Cost: O(√df) at most.
 */
export function studentTTail(t: number, df: number): number {
  if (!(df > 0) || !Number.isFinite(df)) {
    throw new AnalysisInputError(`t distribution: degrees of freedom must be a positive number (got ${df})`);
  }
  if (Number.isNaN(t)) return NaN;
  if (t === 0) return 0.5;
  if (!Number.isFinite(t)) return t > 0 ? 0 : 1;
  const t2 = t * t;
  const tail = 0.5 * incompleteBeta(df / (df + t2), df / 2, 0.5, t2 / (df + t2));
  return t > 0 ? tail : 1 - tail;
}
