import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { fftOfSize } from './fft-of-size.ts';
import { maskMissing } from './missing-values.ts';
import { powerOfTwoAtLeast } from './power-of-two-at-least.ts';

export interface PeriodogramResult {
  /** Frequencies j/N in cycles per sample, j = 1..N/2 (N the padded length). */
  frequencies: Float64Array;
  /** I(f_j) = |Σ_t (x_t − x̄) e^{−2πi f_j t}|² / n. */
  power: Float64Array;
  /** Padded transform length N (a power of two ≥ n). */
  size: number;
}

/**
 * Raw periodogram of the mean-corrected series, I(f) = n⁻¹ |Σ_t (x_t − x̄) e^{−2πift}|²
 * (Brockwell & Davis, *Introduction to Time Series and Forecasting*, 2nd ed., §4.2, eq. 4.2.4;
 * Schuster 1898), evaluated on the grid j/N after zero padding to a power of two N ≥ n. A
 * cycle of period s samples shows up as a peak near f = 1/s. Missing values are set to the
 * mean, i.e. contribute nothing. The zero frequency (the mean) is left out.
 *
 * Cost: O(N log N) time, O(N) space.
 */
export function periodogram(x: Series, padTo?: number): PeriodogramResult {
  const fn = 'periodogram';
  assertSeries(x, fn);
  if (x.length < 4)
    throw new AnalysisInputError(`${fn} requires at least 4 data points (got ${x.length})`, { reason: 'too-few-values', need: 4, got: x.length });
  const n = x.length;
  const size = powerOfTwoAtLeast(Math.max(n, padTo ?? 0));
  const padded = new Float64Array(size);
  padded.set(maskMissing(x, true).values);
  const spectrum = new Float64Array(2 * size);
  fftOfSize(size).realTransform(spectrum, padded);
  const half = size >> 1;
  const frequencies = new Float64Array(half);
  const power = new Float64Array(half);
  for (let j = 1; j <= half; j++) {
    const re = spectrum[2 * j];
    const im = spectrum[2 * j + 1];
    frequencies[j - 1] = j / size;
    power[j - 1] = (re * re + im * im) / n;
  }
  return { frequencies, power, size };
}
