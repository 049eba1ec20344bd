import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { effectiveSampleSize } from './effective-sample-size.ts';
import { studentTQuantile } from './student-t-quantile.ts';
import { studentTTail } from './student-t-tail.ts';

/** Fewest non-missing readings in each range. */
const MIN_POINTS = 10;
/** Our rule of thumb: a range with fewer effective readings than this gets a caution (n < 10·τ). */
const CAUTION_EFFECTIVE = 10;
/**
 * Fewer effective readings than this leave the Welch–Satterthwaite df undefined: refused. A guard
 * only: Geyer's estimate on a range of ≥ 10 readings was never seen below 2.6 (ramps, steps, arcs).
 */
const MIN_EFFECTIVE = 2;

export interface CompareMeansOptions {
  /** 1 − confidence level of both intervals (default 0.05). */
  alpha?: number;
}

export interface RangeMeanSummary {
  /** Non-missing readings. */
  n: number;
  mean: number;
  /** Sample standard deviation (divisor n − 1). */
  sd: number;
  /** Integrated autocorrelation time τ (1 for a constant range, which adds no variance). */
  tau: number;
  /** Effective sample size n/τ (`effectiveSampleSize`). */
  nEff: number;
}

export interface MeanDifferenceTest {
  /** Standard error of mean(b) − mean(a). */
  standardError: number;
  /** Welch–Satterthwaite degrees of freedom. */
  df: number;
  /** difference / standardError. */
  statistic: number;
  /** Two-sided p-value of "equal means" from Student's t with df degrees of freedom. */
  pValue: number;
  /** difference ∓ t(1 − α/2; df) · standardError. */
  interval: [number, number];
}

export interface CompareMeansResult {
  /** mean(b) − mean(a): positive when the second range runs higher. */
  difference: number;
  alpha: number;
  a: RangeMeanSummary;
  b: RangeMeanSummary;
  /** With each range's effective sample size in place of n: respects autocorrelation. */
  effective: MeanDifferenceTest;
  /** Naive Welch test, independence assumed (R's t.test(b, a)). */
  welch: MeanDifferenceTest;
  /** Set when either range is shorter than 10 autocorrelation times (our rule of thumb), else null. */
  caution: string | null;
}

function summarise(x: Series, label: 'a' | 'b'): { summary: RangeMeanSummary; variance: number } {
  const fn = 'compareMeans';
  assertSeries(x, fn);
  let n = 0;
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    if (Number.isNaN(x[i])) continue;
    n++;
    sum += x[i];
  }
  if (n < MIN_POINTS)
    throw new AnalysisInputError(`${fn} requires at least ${MIN_POINTS} data points in range ${label} (got ${n})`, {
      reason: 'too-few-in-range',
      need: MIN_POINTS,
      got: n,
      range: label,
    });
  const mean = sum / n;
  let squares = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) squares += (x[i] - mean) ** 2;
  const variance = squares / (n - 1);
  if (variance === 0) return { summary: { n, mean, sd: 0, tau: 1, nEff: n }, variance };
  const { tau, ess } = effectiveSampleSize(x);
  if (ess < MIN_EFFECTIVE) {
    throw new AnalysisInputError(
      `${fn}: range ${label} carries only ${ess.toPrecision(2)} independent readings (n = ${n}, autocorrelation time ${tau.toPrecision(3)} steps), too few for an interval; choose a longer range`,
      { reason: 'too-few-independent', need: MIN_EFFECTIVE, got: ess, range: label },
    );
  }
  return { summary: { n, mean, sd: Math.sqrt(variance), tau, nEff: ess }, variance };
}

/** Welch's test of mean(b) − mean(a) with per-range sizes `sizeA`, `sizeB` (n or n_eff). */
function welchTest(difference: number, varA: number, sizeA: number, varB: number, sizeB: number, alpha: number): MeanDifferenceTest {
  const va = varA / sizeA;
  const vb = varB / sizeB;
  const standardError = Math.sqrt(va + vb);
  const df = (va + vb) ** 2 / (va ** 2 / (sizeA - 1) + vb ** 2 / (sizeB - 1));
  const statistic = difference / standardError;
  const q = studentTQuantile(1 - alpha / 2, df);
  return {
    standardError,
    df,
    statistic,
    pValue: Math.min(1, 2 * studentTTail(Math.abs(statistic), df)),
    interval: [difference - q * standardError, difference + q * standardError],
  };
}

function cautionFor(label: 'a' | 'b', s: RangeMeanSummary): string | null {
  if (s.nEff >= CAUTION_EFFECTIVE) return null;
  return `range ${label} holds about ${s.nEff.toFixed(1)} independent readings (n = ${s.n}, autocorrelation time ${s.tau.toFixed(1)} steps)`;
}

/**
 * Before/after comparison of two means that respects autocorrelation: two ranges of one channel,
 * or the same range of two channels. Reports mean(b) − mean(a) (b is the second argument, the
 * "after" range) with two intervals side by side:
 *
 * - effective: each mean's variance is s²/n_eff with n_eff = n/τ from `effectiveSampleSize`
 *   (τ = 1 + 2 Σ ρ_k by Geyer's initial monotone sequence) — the effective number of
 *   independent observations of Bayley & Hammersley (1946, J. R. Stat. Soc. Suppl. 8:184–197),
 *   used for tests of the mean as the "equivalent sample size" by Zwiers & von Storch (1995,
 *   J. Climate 8:336–351); SE = √(s_a²/n_eff,a + s_b²/n_eff,b) and the degrees of freedom by
 *   Welch–Satterthwaite with the effective sizes (Satterthwaite 1946, Biometrics Bull.
 *   2:110–114; Welch 1947, Biometrika 34:28–35), a t interval. Combining the effective sizes
 *   with Welch–Satterthwaite is our choice; Zwiers & von Storch show that estimated equivalent
 *   sample sizes are unreliable in short samples, hence the caution below.
 * - welch: the same with n in place of n_eff, R's `t.test(b, a)` (var.equal = FALSE), which
 *   assumes independent readings and is too narrow for persistent ones.
 *
 * `caution` is set when either range holds fewer than 10 effective readings, i.e. is shorter
 * than 10 autocorrelation times (n < 10·τ): our rule of thumb for when τ itself, and so the
 * interval, is poorly determined. Missing readings (NaN) are left out of means and SDs; the
 * autocorrelation behind τ follows R's na.pass rule. A constant range counts with τ = 1 (it
 * adds no variance).
 *
 * Throws AnalysisInputError for fewer than 10 readings in a range, both ranges constant, a bad
 * alpha, or a range with fewer than 2 effective readings.
 *
 * Cost: O(n log n) per range (the ACF behind τ).
 */
export function compareMeans(a: Series, b: Series, options: CompareMeansOptions = {}): CompareMeansResult {
  const fn = 'compareMeans';
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  const first = summarise(a, 'a');
  const second = summarise(b, 'b');
  if (first.variance === 0 && second.variance === 0) {
    throw new AnalysisInputError(`${fn}: both ranges are constant, so the difference of their means has no sampling error to estimate`, { reason: 'constant' });
  }
  const sa = first.summary;
  const sb = second.summary;
  const difference = sb.mean - sa.mean;
  const notes = [cautionFor('a', sa), cautionFor('b', sb)].filter((s): s is string => s !== null);
  const caution = notes.length
    ? `${notes.join('; ')}: shorter than 10 autocorrelation times, so the autocorrelation-aware interval is rough (our rule of thumb asks for n ≥ 10·τ); choose longer ranges if you can.`
    : null;
  return {
    difference,
    alpha,
    a: sa,
    b: sb,
    effective: welchTest(difference, first.variance, sa.nEff, second.variance, sb.nEff, alpha),
    welch: welchTest(difference, first.variance, sa.n, second.variance, sb.n, alpha),
    caution,
  };
}
