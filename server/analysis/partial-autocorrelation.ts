import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { integerOption } from './integer-option.ts';

export interface PartialAutocorrelationOptions {
  /** Highest lag (≥ 1); defaults to R's ⌊10·log10(n)⌋, capped at n − 1. */
  maxLag?: number;
}

/**
 * Sample partial autocorrelation function at lags 1..maxLag: the correlation between readings k
 * apart once the readings in between are accounted for. It cuts off after lag p for an AR(p)
 * process, which is why it is read to choose an autoregressive order.
 *
 * Computed by the Durbin–Levinson recursion on the sample autocorrelations (Brockwell & Davis,
 * *Introduction to Time Series and Forecasting*, 2nd ed., §2.5.3 and §5.2; Box, Jenkins &
 * Reinsel, *Time Series Analysis*, 4th ed., §3.2.6), as R's `pacf` does; missing values are
 * treated as in `acf` (R's na.pass).
 *
 * Cost: O(n · maxLag) or O(n log maxLag) for the autocorrelations plus O(maxLag²).
 */
export function partialAutocorrelation(x: Series, options: PartialAutocorrelationOptions = {}): Float64Array {
  const fn = 'pacf';
  assertSeries(x, fn);
  if (x.length < 2)
    throw new AnalysisInputError(`${fn} requires at least 2 data points (got ${x.length})`, { reason: 'too-few-values', need: 2, got: x.length });
  const maxLag = integerOption(fn, 'maxLag', options.maxLag ?? Math.max(1, defaultMaxLag(x.length)), 1, x.length - 1);
  const r = autocorrelation(x, { maxLag });
  return durbinLevinson(r, maxLag, { keepCoefficients: false }).partial;
}
