import { CUTOFF_HIGH, CUTOFF_LOW } from './loess-thresholds.ts';

/**
 * Tricube neighbourhood weights `(1 − (d/h)³)³` of loess for the integer distances
 * `d = from .. to` from the fitting position, written to `out[d]`, with the cut-offs of STL's
 * reference code: weight 1 within 0.001·h and none beyond 0.999·h. Returns the largest
 * distance that has a positive weight, so callers can skip the rest of the window.
 *
 * Method: Cleveland (1979), "Robust locally weighted regression and smoothing
 * scatterplots", JASA 74:829–836 (tricube weight function); thresholds from Cleveland,
 * Cleveland, McRae & Terpenning (1990), J. Official Statistics 6(1):3–73 (`stlest` in
 * netlib's stl.f). Cost: O(to − from).
 */
export function loessTricubeWeights(h: number, from: number, to: number, out: Float64Array): number {
  const hInner = CUTOFF_LOW * h;
  const reach = Math.floor(CUTOFF_HIGH * h);
  for (let d = from; d <= to; d++) {
    if (d > reach) {
      out[d] = 0;
    } else if (d <= hInner) {
      out[d] = 1;
    } else {
      const u = d / h;
      const t = 1 - u * u * u;
      out[d] = t * t * t;
    }
  }
  return reach;
}
