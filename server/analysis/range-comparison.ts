import type { ChannelReadings, DiagnosticsAggregate } from './channel-diagnostics.ts';
import { compareMeans, type CompareMeansResult } from './compare-means.ts';
import { regularize } from './regularize.ts';

export interface RangeComparisonOptions {
  /** Grid step in milliseconds (cells aligned to whole steps of UTC, as in the diagnostics). */
  step: number;
  agg: DiagnosticsAggregate;
  alpha?: number;
}

/**
 * Before/after comparison of two ranges of readings as one worker-pool task: each range is put
 * on the regular grid the diagnostics use (`regularize`; empty cells stay missing, so the
 * autocorrelation behind each effective sample size follows R's na.pass rule), then
 * `compareMeans(a, b)` gives mean(b) − mean(a) with the interval from the effective sample
 * sizes beside the naive Welch interval.
 *
 * Cost: O(n log n) per range.
 */
export function rangeComparison(a: ChannelReadings, b: ChannelReadings, options: RangeComparisonOptions): CompareMeansResult {
  const gridA = regularize(a.timestamps, a.values, { step: options.step, agg: options.agg }).values;
  const gridB = regularize(b.timestamps, b.values, { step: options.step, agg: options.agg }).values;
  return compareMeans(gridA, gridB, options.alpha === undefined ? {} : { alpha: options.alpha });
}
