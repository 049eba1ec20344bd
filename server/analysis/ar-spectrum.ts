/**
 * Spectrum of an autoregressive model, σ² / |1 − Σ_j φ_j e^{−2πi f j}|², at a frequency f in
 * cycles per step (0 ≤ f ≤ 1/2).
 *
 * This is 2π times the spectral density f_X(λ) of the causal AR(p) process
 * X_t = Σ φ_j X_{t−j} + Z_t, Z ~ WN(0, σ²), at λ = 2πf (Brockwell & Davis, *Introduction to
 * Time Series and Forecasting*, 2nd ed., §4.4, eq. 4.4.3 with θ(z) = 1; Priestley, *Spectral
 * Analysis and Time Series*, 1981, §7.8 for the autoregressive spectral estimate), i.e. the
 * scale on which the periodogram I(f) = n⁻¹|Σ x_t e^{−2πift}|² has expectation ≈ 2πf_X
 * (Brockwell & Davis §4.2). R's `spec.ar` reports the same numbers for a series of frequency 1.
 *
 * Cost: O(p) per frequency (the powers e^{−2πifj} by complex rotation).
 */
export function arSpectrum(coefficients: ArrayLike<number>, variance: number, frequency: number): number {
  const omega = 2 * Math.PI * frequency;
  const stepRe = Math.cos(omega);
  const stepIm = -Math.sin(omega);
  let zRe = 1;
  let zIm = 0;
  let re = 1;
  let im = 0;
  for (let j = 0; j < coefficients.length; j++) {
    // z = e^{−iω(j+1)}
    const nextRe = zRe * stepRe - zIm * stepIm;
    zIm = zRe * stepIm + zIm * stepRe;
    zRe = nextRe;
    re -= coefficients[j] * zRe;
    im -= coefficients[j] * zIm;
  }
  return variance / (re * re + im * im);
}
