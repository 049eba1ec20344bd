import { armaPolynomialRoots } from './arma-polynomial-roots.ts';

/**
 * Makes an MA polynomial θ(z) = 1 + θ_1 z + … + θ_q z^q invertible: every root inside the unit
 * circle is replaced by its reciprocal, which leaves the autocorrelations of the MA process
 * (hence the σ²-concentrated Gaussian likelihood) unchanged (Brockwell & Davis, *Time Series:
 * Theory and Methods*, 2nd ed., §4.4 and Prop. 3.5.1; Box, Jenkins, Reinsel & Ljung,
 * *Time Series Analysis*, 5th ed., §6.4.1). R's `arima` does the same after optimising
 * (`maInvert`): trailing zero coefficients are kept, MA(1) maps θ to 1/θ, and otherwise the
 * polynomial is rebuilt from its roots (`armaPolynomialRoots`). A root exactly on the unit
 * circle is left as it is. Returns a new array; the input is not changed. Cost: O(q²) per
 * root-finding iteration.
 */
export function armaInvertMa(theta: ArrayLike<number>): number[] {
  const out = Array.from(theta);
  let degree = out.length;
  while (degree > 0 && out[degree - 1] === 0) degree--;
  if (degree === 0) return out;
  if (degree === 1) {
    if (Math.abs(out[0]) > 1) out[0] = 1 / out[0];
    return out;
  }
  const { re, im } = armaPolynomialRoots(out);
  let flipped = false;
  for (let i = 0; i < degree; i++) {
    const m2 = re[i] * re[i] + im[i] * im[i];
    if (m2 < 1) {
      re[i] = re[i] / m2;
      im[i] = -im[i] / m2;
      flipped = true;
    }
  }
  if (!flipped) return out;
  // Rebuild Π_i (1 − z / z_i): coefficients of z^0..z^d, real and imaginary parts.
  const polyR = new Float64Array(degree + 1);
  const polyI = new Float64Array(degree + 1);
  polyR[0] = 1;
  for (let i = 0; i < degree; i++) {
    const m2 = re[i] * re[i] + im[i] * im[i];
    const invR = re[i] / m2;
    const invI = -im[i] / m2;
    for (let c = i + 1; c >= 1; c--) {
      polyR[c] -= polyR[c - 1] * invR - polyI[c - 1] * invI;
      polyI[c] -= polyR[c - 1] * invI + polyI[c - 1] * invR;
    }
  }
  for (let i = 0; i < degree; i++) out[i] = polyR[i + 1];
  return out;
}
