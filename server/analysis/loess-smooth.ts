import { loessEstimate } from './loess-estimate.ts';
import { loessSymmetricFit } from './loess-symmetric-fit.ts';
import { loessSymmetricKernel } from './loess-symmetric-kernel.ts';

/**
 * Loess smoothing of a whole series at the integer positions, as STL uses it for its
 * cycle-subseries, low-pass and trend smoothers: a fit of `span` nearest neighbours at every
 * `jump`-th position (and at the last one), with straight-line interpolation in between.
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend
 * Decomposition Procedure Based on Loess", J. Official Statistics 6(1):3–73, §2.1 (loess)
 * and §5 (the jump speed-up), with the window placement, end handling and interpolation of
 * the authors' reference code (`stless` in netlib's stl.f, which R's stats::stl calls). Where
 * every weight is zero the input value is kept, as there.
 *
 * Writes `n` values to `out[outOffset ..]`; reads `y[0 .. n-1]` and, when given,
 * `robustWeights[0 .. n-1]`. Cost: O(n·span / jump + n); allocates only the small kernel of
 * tricube weights for the centred windows.
 */
export function loessSmooth(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  jump: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
  outOffset: number,
): void {
  if (n < 2) {
    out[outOffset] = y[0];
    return;
  }
  const step = Math.min(jump, n - 1);
  const kernel = span < n && span % 2 === 1 ? loessSymmetricKernel(span) : null;
  // Each sweep returns the left end of its last window (which spans `span` values, or the
  // whole series), which the reference code reuses below.
  const lastLeft =
    span >= n
      ? sweepWholeSeries(y, n, span, degree, step, robustWeights, out, outOffset)
      : step === 1
        ? sweepEveryPosition(y, n, span, degree, robustWeights, kernel, out, outOffset)
        : sweepWithJumps(y, n, span, degree, step, robustWeights, kernel, out, outOffset);
  if (step === 1) return;
  const last = n - 1 - ((n - 1) % step);
  interpolate(out, outOffset, 0, last, step);
  if (last !== n - 1) {
    // The last position is fitted with the window of the last regular fit (it may lie wholly
    // before n - 1 when the jump is larger than half the span), then joined by a line.
    const lastRight = span >= n ? n - 1 : lastLeft + span - 1;
    fitAt(y, n, span, degree, n - 1, lastLeft, lastRight, robustWeights, out, outOffset);
    if (last !== n - 2) interpolate(out, outOffset, last, n - 1, n - 1 - last);
  }
}

function sweepWholeSeries(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  step: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
  outOffset: number,
): number {
  for (let i = 0; i < n; i += step) fitAt(y, n, span, degree, i, 0, n - 1, robustWeights, out, outOffset);
  return 0;
}

function sweepEveryPosition(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  robustWeights: Float64Array | null,
  kernel: Float64Array | null,
  out: Float64Array,
  outOffset: number,
): number {
  const half = (span + 1) >> 1;
  let left = 0;
  let right = span - 1;
  for (let i = 0; i < n; i++) {
    if (i + 1 > half && right !== n - 1) {
      left++;
      right++;
    }
    if (kernel !== null && i - left === right - i) {
      const v = loessSymmetricFit(y, n, i, kernel, degree, robustWeights, 1);
      out[outOffset + i] = Number.isNaN(v) ? y[i] : v;
    } else {
      fitAt(y, n, span, degree, i, left, right, robustWeights, out, outOffset);
    }
  }
  return left;
}

function sweepWithJumps(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  step: number,
  robustWeights: Float64Array | null,
  kernel: Float64Array | null,
  out: Float64Array,
  outOffset: number,
): number {
  const half = (span + 1) >> 1;
  let left = 0;
  let right: number;
  for (let i = 0; i < n; i += step) {
    if (i + 1 < half) {
      left = 0;
      right = span - 1;
    } else if (i >= n - half) {
      left = n - span;
      right = n - 1;
    } else {
      left = i - half + 1;
      right = span + i - half;
      if (kernel !== null) {
        const v = loessSymmetricFit(y, n, i, kernel, degree, robustWeights, 1);
        out[outOffset + i] = Number.isNaN(v) ? y[i] : v;
        continue;
      }
    }
    fitAt(y, n, span, degree, i, left, right, robustWeights, out, outOffset);
  }
  return left;
}

/** One loess fit written to `out`; where every weight is zero the input value is kept. */
function fitAt(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  i: number,
  left: number,
  right: number,
  robustWeights: Float64Array | null,
  out: Float64Array,
  outOffset: number,
): void {
  const v = loessEstimate(y, n, span, degree, i, left, right, robustWeights);
  out[outOffset + i] = Number.isNaN(v) ? y[i] : v;
}

/** Fills the gaps between fitted positions `from, from + step, .. to` by straight lines. */
function interpolate(out: Float64Array, offset: number, from: number, to: number, step: number): void {
  for (let i = from; i + step <= to; i += step) {
    const a = out[offset + i];
    const delta = (out[offset + i + step] - a) / step;
    for (let j = 1; j < step; j++) out[offset + i + j] = a + delta * j;
  }
}
