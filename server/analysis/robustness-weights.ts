import { CUTOFF_HIGH, CUTOFF_LOW } from './loess-thresholds.ts';

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
export function robustnessWeights(
  residuals: Float64Array,
  n: number,
  out: Float64Array,
  scratch: Float64Array,
): void {
  for (let i = 0; i < n; i++) scratch[i] = Math.abs(residuals[i]);
  const upper = n >> 1;
  const upperValue = selectInPlace(scratch, upper, n);
  // After selection every value left of `upper` is at most scratch[upper]; for an even count
  // the lower middle value is the largest of them.
  const lowerValue = n % 2 === 0 ? largest(scratch, upper) : upperValue;
  const scale = 3 * (upperValue + lowerValue);
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

function largest(a: Float64Array, count: number): number {
  let max = -Infinity;
  for (let i = 0; i < count; i++) if (a[i] > max) max = a[i];
  return max;
}

/**
 * Rearranges `a[0 .. n-1]` so that `a[k]` holds the value of rank k, smaller-or-equal values
 * before it and greater-or-equal after (Hoare's FIND, CACM 4(7):321–322, 1961), and returns it.
 */
function selectInPlace(a: Float64Array, k: number, n: number): number {
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] < a[lo]) swap(a, mid, lo);
    if (a[hi] < a[lo]) swap(a, hi, lo);
    if (a[hi] < a[mid]) swap(a, hi, mid);
    const pivot = a[mid];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
