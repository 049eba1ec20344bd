import { CUTOFF_HIGH, CUTOFF_LOW } from './loess-thresholds.ts';
import { medianInPlace } from './median-in-place.ts';

/**
 * STL's robustness weights from the residuals `y − (trend + seasonal)`: Tukey's bisquare of
 * each residual scaled by six times the median absolute residual, `w = (1 − (|r| / 6m)²)²`
 * for `|r| < 6m` and 0 beyond, so that outliers stop pulling the next pass of the seasonal
 * and trend smoothers.
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend
 * Decomposition Procedure Based on Loess", J. Official Statistics 6(1):3–73, §2.3 (outer
 * loop), with the cut-offs of the authors' reference code (`stlrwt` in netlib's stl.f):
 * residuals within 0.001·6m get weight 1, those beyond 0.999·6m get 0. The median is exact
 * (the mean of the two middle values for an even count), found by selection; the reference
 * code's partial sort can miss it, so R's stl may differ here while statsmodels agrees.
 * Writes `out[0 .. n-1]`; `scratch` (n values) is overwritten; `residuals` is only read.
 * Cost: O(n) expected.
 */
export function robustnessWeights(residuals: Float64Array, n: number, out: Float64Array, scratch: Float64Array): void {
  for (let i = 0; i < n; i++) scratch[i] = Math.abs(residuals[i]);
  const scale = 6 * medianInPlace(scratch, n);
  const inner = CUTOFF_LOW * scale;
  const outer = CUTOFF_HIGH * scale;
  for (let i = 0; i < n; i++) {
    const r = Math.abs(residuals[i]);
    if (r <= inner) {
      out[i] = 1;
    } else if (r <= outer) {
      const u = r / scale;
      const t = 1 - u * u;
      out[i] = t * t;
    } else {
      out[i] = 0;
    }
  }
}
