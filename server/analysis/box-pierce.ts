import type { Series } from './analysis-input-error.ts';
import { portmanteauTest, type PortmanteauOptions, type PortmanteauResult } from './portmanteau-test.ts';

/**
 * Box–Pierce portmanteau test that the first `lag` autocorrelations are jointly zero:
 * Q = n Σ_{k=1}^{h} r_k², referred to χ²(h − fitdf) (Box & Pierce 1970, J. Amer. Statist. Assoc.
 * 65:1509–1526, eq. 4.2). Equals R's `Box.test(x, lag, type = "Box-Pierce", fitdf)`; the p-value
 * is the exact upper tail, where R prints 1 − pchisq.
 *
 * Cost: O(n · h) time.
 */
export function boxPierce(x: Series, options: PortmanteauOptions): PortmanteauResult {
  return portmanteauTest('boxPierce', x, options, (n) => n);
}
