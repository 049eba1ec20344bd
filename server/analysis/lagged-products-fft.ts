import { fftOfSize } from './fft-of-size.ts';
import { powerOfTwoAtLeast } from './power-of-two-at-least.ts';

/** Block transform size: small enough to stay in cache, large enough to waste little on overlap. */
function fftBlockSize(n: number, maxLag: number): number {
  return powerOfTwoAtLeast(Math.min(n + maxLag, Math.max(2048, 8 * (maxLag + 1))));
}

/**
 * Lagged product sums through the fast Fourier transform: for every lag k in 0..maxLag,
 * `out[k] = Σ_{i=0}^{n-k-1} a[i + k] · b[i]`, the same quantity as `laggedProductsDirect`.
 *
 * Uses the correlation theorem (Brockwell & Davis, *Time Series: Theory and Methods*, 2nd ed.,
 * §10.3; Bloomfield, *Fourier Analysis of Time Series*, 2nd ed., §8.2): the inverse transform
 * of A · conj(B) is the circular cross-product sum, free of wrap-around for lags ≤ maxLag once
 * both inputs are zero-padded to at least n + maxLag. For long series the sum is split into
 * blocks (the overlap-save idea of Oppenheim & Schafer, *Discrete-Time Signal Processing*,
 * §8.7): block j of `b` against the matching stretch of `a` extended by maxLag values, each
 * padded to one cache-sized power of two M. Spectra are accumulated and inverted once, so the
 * result equals the single large transform. Missing values must already be zeros.
 *
 * Cost: O(n log M) time with M ≈ max(2048, 8·maxLag), O(M + maxLag) extra space.
 */
export function laggedProductsFft(a: Float64Array, b: Float64Array, maxLag: number): Float64Array {
  const n = Math.min(a.length, b.length);
  const size = fftBlockSize(n, maxLag);
  const block = size - maxLag;
  const fft = fftOfSize(size);
  const half = size >> 1;
  const segment = new Float64Array(size);
  const specA = new Float64Array(2 * size);
  const specB = new Float64Array(2 * size);
  const acc = new Float64Array(2 * size);

  for (let start = 0; start < n; start += block) {
    const endB = Math.min(start + block, n);
    const endA = Math.min(start + block + maxLag, n);
    segment.set(a.subarray(start, endA));
    segment.fill(0, endA - start);
    fft.realTransform(specA, segment);
    segment.set(b.subarray(start, endB));
    segment.fill(0, endB - start);
    fft.realTransform(specB, segment);
    for (let j = 0; j <= half; j++) {
      const ar = specA[2 * j];
      const ai = specA[2 * j + 1];
      const br = specB[2 * j];
      const bi = specB[2 * j + 1];
      // A · conj(B)
      acc[2 * j] += ar * br + ai * bi;
      acc[2 * j + 1] += ai * br - ar * bi;
    }
  }

  // Real inputs give a Hermitian spectrum: fill the upper half, then invert once.
  fft.completeSpectrum(acc);
  fft.inverseTransform(specA, acc);
  const out = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) out[k] = specA[2 * k];
  return out;
}
