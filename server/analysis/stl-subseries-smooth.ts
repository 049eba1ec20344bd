import { loessEstimate } from './loess-estimate.ts';
import { loessSmooth } from './loess-smooth.ts';

/**
 * Scratch for {@link stlSubseriesSmooth}: `values` and `weights` hold
 * `period · ceil(n / period)` values, `smooth` holds `period · (ceil(n / period) + 2)`.
 */
export interface SubseriesScratch {
  values: Float64Array;
  weights: Float64Array;
  smooth: Float64Array;
}

/**
 * Cycle-subseries smoothing, STL's step 2: every subseries of values one period apart (all
 * Januaries, all Februaries …) is smoothed by loess and extended by one fitted value before
 * its first and after its last element, giving a series of `n + 2·period` values laid out
 * in time order in `out` (position `i + period` of `out` belongs to `y[i]`).
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), J. Official Statistics
 * 6(1):3–73, §2.2 step 2, with the extrapolation and fallbacks of the authors' reference
 * code (`stlss` in netlib's stl.f): an end value whose weights are all zero repeats its
 * neighbour. The subseries are gathered and scattered in single sequential passes, which
 * keeps long series cache-friendly. Cost: O(n·span / jump + n).
 */
export function stlSubseriesSmooth(
  y: Float64Array,
  n: number,
  period: number,
  span: number,
  degree: number,
  jump: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
  scratch: SubseriesScratch,
): void {
  const { values, weights, smooth } = scratch;
  const longest = Math.ceil(n / period);
  const stride = longest + 2;
  gather(y, n, period, longest, values);
  if (robustWeights !== null) gather(robustWeights, n, period, longest, weights);
  for (let phase = 0; phase < period; phase++) {
    const k = Math.floor((n - 1 - phase) / period) + 1;
    const sub = values.subarray(phase * longest, phase * longest + k);
    const subWeights = robustWeights === null ? null : weights.subarray(phase * longest, phase * longest + k);
    const base = phase * stride;
    loessSmooth(sub, k, span, degree, jump, subWeights, smooth, base + 1);
    const before = loessEstimate(sub, k, span, degree, -1, 0, Math.min(span, k) - 1, subWeights);
    smooth[base] = Number.isNaN(before) ? smooth[base + 1] : before;
    const after = loessEstimate(sub, k, span, degree, k, Math.max(0, k - span), k - 1, subWeights);
    smooth[base + k + 1] = Number.isNaN(after) ? smooth[base + k] : after;
  }
  // out[m·period + phase] = smooth[phase·stride + m], walking `out` in order.
  const total = n + 2 * period;
  for (let t = 0, m = 0, phase = 0; t < total; t++) {
    out[t] = smooth[phase * stride + m];
    if (++phase === period) {
      phase = 0;
      m++;
    }
  }
}

/** Copies `x[i·period + phase]` to `to[phase·longest + i]` in one sequential pass over x. */
function gather(x: Float64Array, n: number, period: number, longest: number, to: Float64Array): void {
  for (let t = 0, i = 0, phase = 0; t < n; t++) {
    to[phase * longest + i] = x[t];
    if (++phase === period) {
      phase = 0;
      i++;
    }
  }
}
