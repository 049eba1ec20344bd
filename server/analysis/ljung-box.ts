import type { Series } from './analysis-input-error.ts';
import { portmanteauTest, type PortmanteauOptions, type PortmanteauResult } from './portmanteau-test.ts';

/**
 * Ljung–Box portmanteau test that the first `lag` autocorrelations are jointly zero (the series,
 * or a model's residuals, is white noise): Q* = n(n + 2) Σ_{k=1}^{h} r_k² / (n − k), referred to
 * χ²(h − fitdf) (Ljung & Box 1978, Biometrika 65:297–303, eq. 2.2). Its small-sample distribution
 * is closer to χ² than Box–Pierce's. Equals R's `Box.test(x, lag, type = "Ljung-Box", fitdf)`;
 * the p-value is the exact upper tail, where R prints 1 − pchisq.
 *
 * Cost: O(n · h) time.
 */
export function ljungBox(x: Series, options: PortmanteauOptions): PortmanteauResult {
  return portmanteauTest('ljungBox', x, options, (n, k) => (n * (n + 2)) / (n - k));
}
