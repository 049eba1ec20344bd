import type { Outliers } from '@shared/contract/diagnostics.ts';

/**
 * The outlier rule in words. With `pooledPhases` each cell was judged against the median and
 * spread of the remainder at its own position in the cycle (pooled with that many positions on
 * each side), so the whole-remainder figures are not quoted as if they were the rule.
 */
export function outlierRule(o: Outliers): string {
  if (o.pooledPhases === undefined) return `|remainder − ${o.median.toPrecision(3)}| > ${o.threshold} × ${o.robustSd.toPrecision(3)}`;
  const pooled = o.pooledPhases === 0 ? '' : `, pooled with ${o.pooledPhases} position${o.pooledPhases === 1 ? '' : 's'} on each side`;
  return `more than ${o.threshold} robust standard deviations from the median of the remainder at the same point of the cycle${pooled}`;
}
