import { laggedProductsDirect } from './lagged-products-direct.ts';
import { laggedProductsFft } from './lagged-products-fft.ts';

/**
 * Below this many lags the direct sum wins. Measured on the 2-core development machine with
 * fft.js 4.0.4: at n = 10⁵ the direct sum takes 6.5 ms for 50 lags and the blocked FFT 8.0 ms;
 * at 200 lags the FFT is 5–6 times faster (see tests/bench/analysis-correlation.bench.ts).
 */
export const FFT_MIN_LAGS = 64;

/**
 * Lagged product sums `out[k] = Σ_{i=0}^{n-k-1} a[i + k] · b[i]` for k = 0..maxLag, by direct
 * summation or by the fast Fourier transform, whichever is cheaper for this n and maxLag.
 * Both give the same numbers to rounding (≈1e-14 relative to the lag-0 sum), so callers never
 * need to know which one ran. `method` forces one path (tests compare the two).
 *
 * Cost: O(n · min(maxLag, log n)) time.
 */
export function laggedProducts(a: Float64Array, b: Float64Array, maxLag: number, method: 'auto' | 'direct' | 'fft' = 'auto'): Float64Array {
  const useFft = method === 'fft' || (method === 'auto' && maxLag + 1 >= FFT_MIN_LAGS);
  return useFft ? laggedProductsFft(a, b, maxLag) : laggedProductsDirect(a, b, maxLag);
}
