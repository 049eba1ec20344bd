import { CUTOFF_LOW } from './loess-thresholds.ts';

/**
 * Loess value at position `i` of a series of `n` values for a full window centred on `i`:
 * `kernel[d]` holds the tricube weight of distance d (zero beyond the reach), so the window
 * is `i − r .. i + r` with `r = kernel.length − 1` (see {@link loessSymmetricKernel}). The
 * series may be laid out with a `stride` (a cycle-subseries read in place: its neighbours of
 * `i` are at `i ± d·stride`). Without robustness weights the weights are symmetric, the
 * local line's slope term vanishes and the result is the weighted mean for degree 0 and 1; with them, the weighted mean (degree 0) or the weighted least-squares
 * line evaluated at `i` (degree 1). Returns NaN when every weight is zero.
 *
 * This is the interior case of {@link loessEstimate} (same method: Cleveland, Cleveland,
 * McRae & Terpenning 1990, J. Official Statistics 6(1):3–73, §2.1 and `stlest` in netlib's
 * stl.f, including its rule to skip the line when the weighted spread of the positions is
 * below 0.001 of the series range), summed in pairs `i ± d` and without per-call setup, which
 * is where STL spends most of its time. Cost: O(r), no allocation.
 */
export function loessSymmetricFit(
  y: Float64Array,
  n: number,
  i: number,
  kernel: Float64Array,
  degree: number,
  robustWeights: Float64Array | null,
  stride: number,
): number {
  const r = kernel.length - 1;
  if (robustWeights === null) {
    let sw = 0;
    let sy = 0;
    for (let d = 1, o = stride; d <= r; d++, o += stride) {
      const k = kernel[d];
      sw += k;
      sy += k * (y[i - o] + y[i + o]);
    }
    return (kernel[0] * y[i] + sy) / (kernel[0] + 2 * sw);
  }
  const k0 = kernel[0] * robustWeights[i];
  let sw = k0;
  let sy = k0 * y[i];
  if (degree === 0) {
    for (let d = 1, o = stride; d <= r; d++, o += stride) {
      const a = kernel[d] * robustWeights[i - o];
      const b = kernel[d] * robustWeights[i + o];
      sw += a + b;
      sy += a * y[i - o] + b * y[i + o];
    }
    return sw > 0 ? sy / sw : NaN;
  }
  // Moments of the positions about i: sd = Σ w·d, sdd = Σ w·d², sdy = Σ w·d·y.
  let sd = 0;
  let sdd = 0;
  let sdy = 0;
  for (let d = 1, o = stride; d <= r; d++, o += stride) {
    const a = kernel[d] * robustWeights[i - o];
    const b = kernel[d] * robustWeights[i + o];
    const left = a * y[i - o];
    const right = b * y[i + o];
    sw += a + b;
    sy += left + right;
    sd += (b - a) * d;
    sdd += (a + b) * (d * d);
    sdy += (right - left) * d;
  }
  if (!(sw > 0)) return NaN;
  const mean = sy / sw;
  const centre = sd / sw;
  const spread = sdd / sw - centre * centre;
  if (!(Math.sqrt(spread) > CUTOFF_LOW * (n - 1))) return mean;
  const slope = (sdy / sw - centre * mean) / spread;
  return mean - slope * centre;
}
