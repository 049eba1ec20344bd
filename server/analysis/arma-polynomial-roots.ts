/** Complex roots of a polynomial, real and imaginary parts. */
export interface PolynomialRoots {
  re: Float64Array;
  im: Float64Array;
}

/**
 * Roots of 1 + c_1 z + … + c_d z^d, where d is the index of the last non-zero coefficient
 * (trailing zeros are dropped; an empty or all-zero c gives no roots), by the Durand–Kerner
 * (Weierstrass) simultaneous iteration on the monic form (Kerner 1966, Numer. Math. 8:290–294;
 * Press et al., *Numerical Recipes*, 3rd ed., §9.5). Used for the ARMA engine's AR and MA
 * polynomials (d ≤ 5), where its accuracy (≈ 1e-13 relative on simple roots) is ample.
 *
 * Cost: O(d²) per iteration, at most 500 iterations.
 */
export function armaPolynomialRoots(c: ArrayLike<number>): PolynomialRoots {
  let degree = c.length;
  while (degree > 0 && c[degree - 1] === 0) degree--;
  const re = new Float64Array(degree);
  const im = new Float64Array(degree);
  if (degree === 0) return { re, im };
  if (degree === 1) {
    re[0] = -1 / c[0];
    return { re, im };
  }
  // Monic form: z^d + m_{d−1} z^{d−1} + … + m_0 with m_i = c_i / c_d (c_0 = 1).
  const lead = c[degree - 1];
  const monic = new Float64Array(degree);
  for (let i = 0; i < degree; i++) monic[i] = (i === 0 ? 1 : c[i - 1]) / lead;
  // Start points on a circle of the roots' geometric-mean radius, off the real axis.
  const radius = Math.pow(Math.abs(monic[0]), 1 / degree) || 1;
  for (let i = 0; i < degree; i++) {
    const angle = (2 * Math.PI * i) / degree + 0.4;
    re[i] = radius * Math.cos(angle);
    im[i] = radius * Math.sin(angle);
  }
  for (let iter = 0; iter < 500; iter++) {
    let moved = 0;
    for (let i = 0; i < degree; i++) {
      let pr = 1; // Horner: value of the monic polynomial at z_i
      let pi = 0;
      for (let k = degree - 1; k >= 0; k--) {
        const nr = pr * re[i] - pi * im[i] + monic[k];
        pi = pr * im[i] + pi * re[i];
        pr = nr;
      }
      let dr = 1; // Π_{j≠i} (z_i − z_j)
      let di = 0;
      for (let j = 0; j < degree; j++) {
        if (j === i) continue;
        const xr = re[i] - re[j];
        const xi = im[i] - im[j];
        const nr = dr * xr - di * xi;
        di = dr * xi + di * xr;
        dr = nr;
      }
      const den = dr * dr + di * di;
      if (den === 0) continue;
      const stepR = (pr * dr + pi * di) / den;
      const stepI = (pi * dr - pr * di) / den;
      re[i] -= stepR;
      im[i] -= stepI;
      moved = Math.max(moved, Math.hypot(stepR, stepI) / Math.max(1, Math.hypot(re[i], im[i])));
    }
    if (moved < 1e-15) break;
  }
  return { re, im };
}
