/**
 * R's default number of lags for `acf`/`pacf` on one series of length n: ⌊10·log10(n)⌋,
 * at most n − 1 (R Core Team, `stats::acf`; a rule of thumb, common practice since the
 * 1970s). `series` > 1 gives the cross-correlation default ⌊10·log10(n / series)⌋.
 *
 * Cost: O(1).
 */
export function defaultMaxLag(n: number, series = 1): number {
  return Math.max(0, Math.min(Math.floor(10 * Math.log10(n / series)), n - 1));
}
