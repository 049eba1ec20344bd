import { armaPolynomialRoots } from './arma-polynomial-roots.ts';

/**
 * Smallest modulus among the roots of a fitted model's AR polynomial 1 − φ_1 z − … − φ_p z^p
 * and MA polynomial 1 + θ_1 z + … + θ_q z^q (Infinity when both are constant). Values near 1
 * flag a model on the edge of stationarity or invertibility, often an AR root cancelling an MA
 * root (Box, Jenkins, Reinsel & Ljung, *Time Series Analysis*, 5th ed., §7.3.5, parameter
 * redundancy). Cost: that of `armaPolynomialRoots` for each polynomial.
 */
export function armaSmallestRoot(ar: ArrayLike<number>, ma: ArrayLike<number>): number {
  let smallest = Infinity;
  for (const c of [Array.from(ar, (v) => -v), Array.from(ma)]) {
    const { re, im } = armaPolynomialRoots(c);
    for (let i = 0; i < re.length; i++) smallest = Math.min(smallest, Math.hypot(re[i], im[i]));
  }
  return smallest;
}
