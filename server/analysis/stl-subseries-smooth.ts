import { loessEstimate } from './loess-estimate.ts';
import { loessSmooth } from './loess-smooth.ts';
import { loessSymmetricFit } from './loess-symmetric-fit.ts';
import { loessSymmetricKernel } from './loess-symmetric-kernel.ts';

/** Reusable buffers for {@link stlSubseriesSmooth}; it grows them as needed (start empty). */
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
 * neighbour. With a fit at every position and a window shorter than every subseries (the
 * usual case), the interior is computed in time order straight from `y` and only the ends
 * of each subseries are copied out; otherwise each subseries is copied out whole. Both give
 * the same numbers. Cost: O(n·span / jump + n).
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
  if (jump === 1 && span % 2 === 1 && span < Math.floor(n / period)) {
    smoothInTimeOrder(y, n, period, span, degree, robustWeights, out, scratch);
  } else {
    smoothEachSubseries(y, n, period, span, degree, jump, robustWeights, out, scratch);
  }
}

function grown(a: Float64Array, size: number): Float64Array {
  return a.length >= size ? a : new Float64Array(size);
}

function smoothInTimeOrder(
  y: Float64Array,
  n: number,
  period: number,
  span: number,
  degree: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
  scratch: SubseriesScratch,
): void {
  const radius = (span - 1) / 2;
  const shortest = Math.floor(n / period);
  const longer = n % period; // phases below this have shortest + 1 values
  const kernel = loessSymmetricKernel(span);
  interior(y, n, period, radius, shortest, longer, kernel, degree, robustWeights, out);

  scratch.values = grown(scratch.values, span);
  scratch.weights = grown(scratch.weights, span);
  const { values, weights } = scratch;
  const subWeights = robustWeights === null ? null : weights;
  for (let phase = 0; phase < period; phase++) {
    const k = phase < longer ? shortest + 1 : shortest;
    // Head: the first `span` values; positions 0 .. radius − 1 and the one before the start.
    copyStrided(y, robustWeights, phase, period, span, values, weights);
    for (let i = 0; i < radius; i++) {
      const v = loessEstimate(values, k, span, degree, i, 0, span - 1, subWeights);
      out[(i + 1) * period + phase] = Number.isNaN(v) ? values[i] : v;
    }
    const before = loessEstimate(values, k, span, degree, -1, 0, span - 1, subWeights);
    out[phase] = Number.isNaN(before) ? out[period + phase] : before;
    // Tail: the last `span` values (subseries index k − span ..); the last radius positions
    // and the one after the end.
    const base = k - span;
    copyStrided(y, robustWeights, base * period + phase, period, span, values, weights);
    for (let i = k - radius; i < k; i++) {
      const v = loessEstimate(values, k, span, degree, i - base, 0, span - 1, subWeights);
      out[(i + 1) * period + phase] = Number.isNaN(v) ? values[i - base] : v;
    }
    const after = loessEstimate(values, k, span, degree, span, 0, span - 1, subWeights);
    out[(k + 1) * period + phase] = Number.isNaN(after) ? out[k * period + phase] : after;
  }
}

/** Every position whose window lies wholly inside its subseries, walking `y` in order. */
function interior(
  y: Float64Array,
  n: number,
  period: number,
  radius: number,
  shortest: number,
  longer: number,
  kernel: Float64Array,
  degree: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
): void {
  const last = n - 1 - radius * period;
  for (let t = radius * period, phase = 0; t <= last; t++) {
    const k = phase < longer ? shortest + 1 : shortest;
    const v = loessSymmetricFit(y, k, t, kernel, degree, robustWeights, period);
    out[t + period] = Number.isNaN(v) ? y[t] : v;
    if (++phase === period) phase = 0;
  }
}

/** Copies `count` values `from, from + step, …` of y (and of the weights, when given). */
function copyStrided(
  y: Float64Array,
  robustWeights: Float64Array | null,
  from: number,
  step: number,
  count: number,
  values: Float64Array,
  weights: Float64Array,
): void {
  for (let i = 0, t = from; i < count; i++, t += step) values[i] = y[t];
  if (robustWeights === null) return;
  for (let i = 0, t = from; i < count; i++, t += step) weights[i] = robustWeights[t];
}

function smoothEachSubseries(
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
  const longest = Math.ceil(n / period);
  const stride = longest + 2;
  scratch.values = grown(scratch.values, period * longest);
  scratch.weights = grown(scratch.weights, period * longest);
  scratch.smooth = grown(scratch.smooth, period * stride);
  const { values, weights, smooth } = scratch;
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
