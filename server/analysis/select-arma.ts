import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { type FitArmaResult, fitArma } from './fit-arma.ts';
import { armaSmallestRoot } from './arma-smallest-root.ts';
import { integerOption } from './integer-option.ts';
import { ljungBox } from './ljung-box.ts';

export interface SelectArmaOptions {
  /** Highest AR order tried, 0..5 (default 3). */
  maxP?: number;
  /** Highest MA order tried, 0..5 (default 3). */
  maxQ?: number;
  /**
   * Highest p + q tried (default maxP + maxQ: every pair). A cap skips the large redundant
   * models, which cost the most to fit (a flat likelihood ridge) and which BIC hardly ever
   * chooses; R's `forecast::auto.arima` caps p + q the same way (its `max.order`, default 5).
   */
  maxTotalOrder?: number;
}

/** One fitted candidate of `selectArma`. */
export interface ArmaCandidate {
  p: number;
  q: number;
  aicc: number;
  logLik: number;
  converged: boolean;
  /** Smallest modulus of the fitted AR and MA polynomials' roots (Infinity for ARMA(0, 0)). */
  smallestRoot: number;
  /** Whether the candidate may be chosen: converged, and smallestRoot ≥ 1.01. */
  admissible: boolean;
  /**
   * The candidate's fit itself, so a caller choosing by another criterion (e.g. BIC) needs no
   * refit. It holds the residuals (n values): pick fields before serialising a candidate.
   */
  model: FitArmaResult;
}

export interface SelectArmaResult {
  /** Orders of the chosen model. */
  p: number;
  q: number;
  /** AICc of the chosen model. */
  aicc: number;
  /** Every candidate fitted, in order p = 0..maxP, then q = 0..maxQ. */
  candidates: ArmaCandidate[];
  /** Ljung–Box on the chosen model's residuals, fitdf = p + q, lag = max(min(10, ⌊n/5⌋), p + q + 1). */
  residualTest: { statistic: number; df: number; pValue: number; lag: number };
  /** The chosen model itself, as `fitArma` returns it. */
  model: FitArmaResult;
}

/**
 * Chooses an ARMA(p, q) model with a mean for a stationary series: fits every p ≤ maxP,
 * q ≤ maxQ by exact maximum likelihood (`fitArma`), keeps the lowest AICc among the admissible
 * fits (Hurvich & Tsai 1989, Biometrika 76:297–307; the full search of Hyndman & Khandakar
 * 2008, J. Stat. Softw. 27(3), §3.2, without differencing), and tests the
 * chosen model's residuals with Ljung–Box (Ljung & Box 1978) with fitdf = p + q, as R's
 * `Box.test(residuals, lag, "Ljung-Box", fitdf = p + q)`.
 *
 * Lag of the residual test: min(10, ⌊n/5⌋) (Hyndman & Athanasopoulos, *Forecasting: Principles
 * and Practice*, 3rd ed., §5.4), raised to p + q + 1 when smaller so the test keeps ≥ 1 degree of
 * freedom; n counts the present values.
 *
 * Admissible means the optimiser converged and no AR or MA root has modulus below 1.01: a
 * root that close to the unit circle is almost always an AR root cancelling an MA root, a
 * redundant model whose higher likelihood is spurious (Box, Jenkins, Reinsel & Ljung 2015,
 * §7.3.5). R's `forecast::auto.arima` (8.20) rejects candidates by the same 1.01 bound.
 *
 * Each candidate's optimiser also starts from the better of its two nested fits (one AR or MA
 * term fewer, padded with a zero), so a candidate's likelihood is never below that of a model it
 * contains: AICc then compares the models' real maxima, not an optimiser's luck.
 *
 * A candidate with too few values for `fitArma` (3·(p + q + 1) + 10) is left out of
 * `candidates`; the search fails with an AnalysisInputError when no candidate is admissible. Ties in AICc go to the first candidate in the order above (fewer AR
 * terms first). Cost: (maxP + 1)(maxQ + 1) fits.
 */
export function selectArma(x: Series, options: SelectArmaOptions = {}): SelectArmaResult {
  const fn = 'selectArma';
  if (typeof x === 'string') throw new AnalysisInputError(`${fn}: the series must be an array of numbers`);
  assertSeries(x, fn);
  const maxP = integerOption(fn, 'maxP', options.maxP ?? 3, 0, 5);
  const maxQ = integerOption(fn, 'maxQ', options.maxQ ?? 3, 0, 5);
  const maxTotalOrder = integerOption(fn, 'maxTotalOrder', options.maxTotalOrder ?? maxP + maxQ, 0, 10);
  let present = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) present++;

  const candidates: ArmaCandidate[] = [];
  const fits = new Map<string, FitArmaResult>();
  let best: { p: number; q: number; fit: FitArmaResult } | null = null;
  for (let p = 0; p <= maxP; p++) {
    for (let q = 0; q <= maxQ; q++) {
      if (p + q > maxTotalOrder) continue;
      if (p + q > 0 && present < 3 * (p + q + 1) + 10) continue;
      // Warm start from the better of the two nested fits (one AR or one MA term fewer).
      const nested = [fits.get(`${p - 1},${q}`), fits.get(`${p},${q - 1}`)].filter((f) => f !== undefined);
      const warm = nested.sort((a, b) => b.logLik - a.logLik)[0];
      const fit = fitOrExplain(x, p, q, warm);
      fits.set(`${p},${q}`, fit);
      const smallestRoot = armaSmallestRoot(fit.ar, fit.ma);
      const admissible = fit.converged && smallestRoot >= 1.01 && Number.isFinite(fit.aicc);
      candidates.push({ p, q, aicc: fit.aicc, logLik: fit.logLik, converged: fit.converged, smallestRoot, admissible, model: fit });
      if (admissible && (best === null || fit.aicc < best.fit.aicc)) best = { p, q, fit };
    }
  }
  if (best === null) {
    throw new AnalysisInputError(
      `${fn}: none of the ${candidates.length} candidate models converged with roots clear of the unit circle: choose a longer or steadier range`,
      { reason: 'unstable-model' },
    );
  }
  const fitdf = best.p + best.q;
  const lag = Math.max(Math.min(10, Math.floor(present / 5)), fitdf + 1);
  const test = ljungBox(best.fit.residuals, { lag, fitdf });
  return {
    p: best.p,
    q: best.q,
    aicc: best.fit.aicc,
    candidates,
    residualTest: { statistic: test.statistic, df: test.df, pValue: test.pValue, lag },
    model: best.fit,
  };
}

/** fitArma, with its input complaints (raised by the first candidate) worded for selectArma. */
function fitOrExplain(x: Series, p: number, q: number, warm: FitArmaResult | undefined): FitArmaResult {
  try {
    return fitArma(x, { p, q, starts: warm ? [warm] : undefined });
  } catch (error) {
    if (error instanceof AnalysisInputError && p + q === 0) {
      throw new AnalysisInputError(
        error.message
          .replace(/^fitArma/, 'selectArma')
          .replace(' for ARMA(0,0)', '')
          .replace('or a lower order', 'of readings'),
        error.detail,
      );
    }
    throw error;
  }
}
