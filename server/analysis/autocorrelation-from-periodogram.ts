import { AnalysisInputError } from './analysis-input-error.ts';
import { fftOfSize } from './fft-of-size.ts';

/**
 * Sample autocorrelations r_0..r_maxLag of a gap-free series from its zero-padded periodogram,
 * for a caller that has the periodogram already (the period search needs both views).
 *
 * The periodogram is the Fourier transform of the sample autocovariances,
 * I(ω) = Σ_{|h|<n} γ̂(h) e^{−ihω} (Brockwell & Davis, *Introduction to Time Series and
 * Forecasting*, 2nd ed., §4.2, Prop. 4.2.1), so on the Fourier grid of a length N ≥ n + maxLag
 * the inverse transform returns γ̂(h) free of wrap-around (the correlation theorem with zero
 * padding: Bloomfield, *Fourier Analysis of Time Series*, 2nd ed., §8.2). `power` is
 * `periodogram(x, …).power` (frequencies j/size, j = 1..size/2) and `zeroPower` the ordinate at
 * frequency 0, (Σ (x_t − x̄))²/n. A grid of `size` that is larger than needed is thinned to
 * every 2^s-th frequency: those ordinates are exactly the transform on the coarser grid. The
 * periodogram is real and even, so one real transform inverts it. Gives the same numbers as
 * `autocorrelation(x, { maxLag })` to rounding (≈1e-14); correlations are clipped to [−1, 1].
 *
 * Cost: O(N log N) time and O(N) space, N the smallest power of two ≥ n + maxLag on the grid.
 */
export function autocorrelationFromPeriodogram(power: Float64Array, size: number, zeroPower: number, n: number, maxLag: number): Float64Array {
  let grid = size;
  while (grid % 2 === 0 && grid / 2 >= n + maxLag && grid / 2 >= 4) grid /= 2;
  if (grid < n + maxLag || maxLag > grid / 2)
    throw new RangeError(`autocorrelationFromPeriodogram: a grid of ${size} is too short for ${n} values and ${maxLag} lags`);
  const stride = size / grid;
  const half = grid >> 1;
  const even = new Float64Array(grid);
  even[0] = zeroPower;
  for (let j = 1; j <= half; j++) {
    const p = power[j * stride - 1];
    even[j] = p;
    if (j < half) even[grid - j] = p;
  }
  const spectrum = new Float64Array(2 * grid);
  fftOfSize(grid).realTransform(spectrum, even);
  const out = new Float64Array(maxLag + 1);
  const c0 = spectrum[0];
  // The same refusal as `autocorrelation` for a series without variation.
  if (!(c0 > 0)) throw new AnalysisInputError('acf: the series is constant, so its autocorrelation is undefined', { reason: 'constant' });
  for (let k = 0; k <= maxLag; k++) {
    const r = spectrum[2 * k] / c0;
    out[k] = r > 1 ? 1 : r < -1 ? -1 : r;
  }
  return out;
}
