import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { augmentedDickeyFuller, type AugmentedDickeyFullerResult } from './augmented-dickey-fuller.ts';
import { autocorrelation } from './autocorrelation.ts';
import { autocorrelationBands } from './autocorrelation-bands.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { detectPeriod } from './detect-period.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { explainVerdict } from './identify-process-explanation.ts';
import { integerOption } from './integer-option.ts';
import { lagOneCoefficient } from './lag-one-coefficient.ts';
import { ljungBox } from './ljung-box.ts';
import type { PortmanteauResult } from './portmanteau-test.ts';
import { readingsPerIndependent } from './readings-per-independent.ts';
import { armaSmallestRoot } from './arma-smallest-root.ts';
import type { FitArmaResult } from './fit-arma.ts';
import { selectArma, type SelectArmaResult } from './select-arma.ts';
import { stl } from './stl.ts';

export type ProcessVerdict = 'white-noise' | 'ar' | 'ma' | 'arma' | 'needs-differencing' | 'seasonal';
export type CorrelogramPattern = 'none' | 'cuts-off' | 'tails-off';

export interface IdentifyProcessOptions {
  /** Lags examined; default max(20, ⌊10·log10 n⌋), at most n/4. */
  maxLag?: number;
  /** Highest AR or MA order a cut-off may suggest (default 5). */
  maxOrder?: number;
  /** Overall significance level of the lag-by-lag judgements (default 0.05). */
  alpha?: number;
  /**
   * The cycle length already found on this same series by `detectPeriod` (its `best`, null for
   * none), so a caller that has run the period search does not pay for it twice.
   */
  knownPeriod?: number | null;
  /**
   * The sample ACF of this same series at lags 0..K (as `acf` returns it), when the caller has
   * it already; read instead of computed again when K reaches the lags examined.
   */
  acf?: Float64Array;
  /**
   * The seasonal component of this same series (as long as it), removed before the model is
   * fitted when a period is found; computed here by periodic STL when left out.
   */
  seasonal?: Float64Array;
  /** The model is fitted to at most this many of the most recent values (default 2,000). */
  fitCells?: number;
  /** Highest AR and MA orders among the fitted candidates (default 3 each). */
  maxP?: number;
  maxQ?: number;
  /**
   * Highest p + q among the candidates (default 3). On the identification benchmark BIC never
   * chose a larger model, and those are the slow ones to fit.
   */
  maxTotalOrder?: number;
}

/** The fitted ARMA model behind a verdict (as `fitArma` returns it), and what it was fitted on. */
export interface ProcessModelFit extends Pick<FitArmaResult, 'ar' | 'ma' | 'mean' | 'standardErrors' | 'sigma2' | 'logLik' | 'aicc' | 'converged'> {
  fittedOn: 'series' | 'remainder';
  /** Index of the first value fitted (the fit uses values [start, start + cells)). */
  start: number;
  cells: number;
  p: number;
  q: number;
  /** −2 log L + (p + q + 2) log n, n the values fitted. */
  bic: number;
  /** Every order tried; `admissible`: converged with all roots outside 1.01 (a pure AR model: stationary). */
  candidates: { p: number; q: number; aicc: number; bic: number; logLik: number; converged: boolean; admissible: boolean }[];
  /** The order with the lowest AICc (selectArma's choice), shown beside the BIC choice. */
  lowestAicc: { p: number; q: number };
  /** Ljung–Box on the chosen model's residuals, fitdf = p + q. */
  residualTest: { lag: number; statistic: number; df: number; pValue: number };
  /** n / n_eff for the mean that the model implies (1 for white noise). */
  readingsPerIndependent: number;
  /**
   * Smallest modulus of the AR polynomial's roots (Infinity without AR terms). Below 1.01 the
   * model sits at the edge of stationarity and `readingsPerIndependent` is not a figure to quote.
   */
  smallestArRoot: number;
  /** Set when the BIC choice differs from the lowest AICc, saying so. */
  criterionNote: string | null;
}

export interface ProcessEvidence {
  n: number;
  maxLag: number;
  acf: Float64Array;
  pacf: Float64Array;
  /** Lags whose ACF leaves Bartlett's 95% band (MA null of the preceding lags). */
  significantAcfLags: number[];
  /** Lags whose PACF leaves the 95% white-noise band ±1.96/√n. */
  significantPacfLags: number[];
  /** End of the initial run of lags clearing the multiplicity-corrected ACF band (0 if none). */
  acfCutoff: number;
  /** End of the initial run of lags clearing the multiplicity-corrected PACF band (0 if none). */
  pacfCutoff: number;
  acfPattern: CorrelogramPattern;
  pacfPattern: CorrelogramPattern;
  ljungBox: PortmanteauResult & { lag: number };
  /** ADF test on the series with gaps closed; null when too short. */
  unitRoot: AugmentedDickeyFullerResult | null;
  period: number | null;
  /** What the correlogram alone suggested (the first look, before any model was fitted). */
  correlogram: { verdict: ProcessVerdict; p?: number; q?: number };
}

export interface ProcessIdentification {
  verdict: ProcessVerdict;
  /** AR order (verdict 'ar'; starting order for 'arma'). */
  p?: number;
  /** MA order (verdict 'ma'; starting order for 'arma'). */
  q?: number;
  /** Cycle length in samples (verdict 'seasonal'). */
  period?: number;
  explanation: string;
  evidence: ProcessEvidence;
  /** The model the verdict rests on; null when none could be fitted (see `modelNote`). */
  model: ProcessModelFit | null;
  /** Why no model was fitted, or a caution about the one fitted; null otherwise. */
  modelNote: string | null;
}

/** A cut-off must drop from at least this many band widths to inside the band. */
const CLEAR_DROP = 2;

/**
 * End of the initial run of lags (1-based) whose |value| exceeds its band, allowing one quiet lag
 * inside the run; 0 if lag 1 and lag 2 are both quiet. A stray exceedance far out is ignored.
 */
function endOfInitialRun(values: ArrayLike<number>, band: (lag: number) => number, maxLag: number): number {
  let last = 0;
  for (let k = 1; k <= maxLag && k - last <= 2; k++) if (Math.abs(values[k - 1]) > band(k)) last = k;
  return last;
}

/** Lag-1 persistence at or above which a series the ADF test cannot clear needs differencing. */
const UNIT_ROOT_PHI = 0.95;

/** The correlogram's own reading (Box, Jenkins & Reinsel Table 6.1), used as the first look. */
function correlogramVerdict(
  acf: Float64Array,
  pacf: Float64Array,
  p: number,
  q: number,
  acfCuts: boolean,
  pacfCuts: boolean,
): { verdict: ProcessVerdict; p?: number; q?: number } {
  if (p === 0 && q === 0) return { verdict: 'white-noise' };
  if (pacfCuts && acfCuts) {
    // Both look abrupt: the lower order wins (parsimony); on a tie, the sharper drop (next value
    // relative to the last significant one).
    if (p !== q) return p < q ? { verdict: 'ar', p } : { verdict: 'ma', q };
    const dropPacf = Math.abs(pacf[p] ?? 0) / Math.abs(pacf[p - 1]);
    const dropAcf = Math.abs(acf[q + 1] ?? 0) / Math.abs(acf[q]);
    return dropPacf <= dropAcf ? { verdict: 'ar', p } : { verdict: 'ma', q };
  }
  if (pacfCuts) return { verdict: 'ar', p };
  if (acfCuts) return { verdict: 'ma', q };
  return { verdict: 'arma', p: 1, q: 1 };
}

/** The class a fitted (p, q) belongs to. */
function verdictOfOrders(p: number, q: number): ProcessVerdict {
  return p === 0 ? (q === 0 ? 'white-noise' : 'ma') : q === 0 ? 'ar' : 'arma';
}

/**
 * Fits every ARMA(p, q) candidate to the most recent `fitCells` values of `series`
 * (`selectArma`, exact likelihood, AICc) and takes the admissible candidate with the lowest BIC
 * for the verdict. BIC is a consistent order estimator for ARMA processes while AIC and AICc
 * over-fit with positive probability however long the series (Schwarz 1978, Ann. Statist.
 * 6:461–464; Hannan 1980, Ann. Statist. 8:1071–1081; Shibata 1976, Biometrika 63:117–126): the
 * verdict names an order, so the consistent criterion decides it; the AICc choice is kept beside it.
 */
function fitModel(series: Float64Array, fittedOn: 'series' | 'remainder', options: IdentifyProcessOptions): ProcessModelFit {
  const cells = Math.min(series.length, options.fitCells ?? 2000);
  const start = series.length - cells;
  const window = series.subarray(start);
  const selection = selectArma(window, { maxP: options.maxP ?? 3, maxQ: options.maxQ ?? 3, maxTotalOrder: options.maxTotalOrder ?? 3 });
  const bic = (c: { p: number; q: number; logLik: number }) => -2 * c.logLik + (c.p + c.q + 2) * Math.log(cells);
  // A pure AR model has no MA root for an AR root to cancel, so only stationarity matters there:
  // a very persistent channel (φ above 1/1.01) keeps its AR(1) instead of losing it to the 1.01 rule.
  const usable = (c: SelectArmaResult['candidates'][number]) => c.admissible || (c.converged && c.q === 0 && Number.isFinite(c.aicc));
  const candidates = selection.candidates.map((c) => ({
    p: c.p,
    q: c.q,
    aicc: c.aicc,
    bic: bic(c),
    logLik: c.logLik,
    converged: c.converged,
    admissible: usable(c),
  }));
  const chosen = selection.candidates.filter(usable).sort((a, b) => bic(a) - bic(b))[0];
  const model = chosen ? chosen.model : selection.model;
  let residualTest = selection.residualTest;
  let criterionNote: string | null = null;
  if (chosen && (chosen.p !== selection.p || chosen.q !== selection.q)) {
    const lag = Math.max(selection.residualTest.lag, chosen.p + chosen.q + 1);
    residualTest = { lag, ...ljungBox(model.residuals, { lag, fitdf: chosen.p + chosen.q }) };
    criterionNote = `The lowest AICc was ARMA(${selection.p},${selection.q}); the verdict follows the lowest BIC, ARMA(${chosen.p},${chosen.q}), the criterion that finds the true order as the series grows.`;
  }
  const p = model.ar.length;
  const q = model.ma.length;
  return {
    fittedOn,
    start,
    cells,
    p,
    q,
    ar: model.ar,
    ma: model.ma,
    mean: model.mean,
    standardErrors: model.standardErrors,
    sigma2: model.sigma2,
    logLik: model.logLik,
    aicc: model.aicc,
    bic: bic({ p, q, logLik: model.logLik }),
    converged: model.converged,
    candidates,
    lowestAicc: { p: selection.p, q: selection.q },
    residualTest: { lag: residualTest.lag, statistic: residualTest.statistic, df: residualTest.df, pValue: residualTest.pValue },
    readingsPerIndependent: readingsPerIndependent(model.ar, model.ma),
    smallestArRoot: armaSmallestRoot(model.ar, []),
    criterionNote,
  };
}

/** The series less its seasonal component (periodic STL of the series when none is handed in). */
function seasonallyAdjusted(x: Float64Array, period: number, seasonal: Float64Array | undefined): Float64Array {
  const component = seasonal && seasonal.length === x.length ? seasonal : stl(x, { period, seasonalWindow: 'periodic' }).seasonal;
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = x[i] - component[i];
  return out;
}

/**
 * Suggests which simple process describes a channel — white noise, AR(p), MA(q), ARMA, a series
 * that must be differenced first, or a seasonal one — with the fitted model it rests on, the
 * evidence behind it and an explanation in plain language.
 *
 * Box–Jenkins in two steps (Box, Jenkins, Reinsel & Ljung, *Time Series Analysis*, 5th ed.,
 * §6.2 and ch. 7; Brockwell & Davis, *Introduction to Time Series and Forecasting*, 3rd ed.,
 * §5.1 and §5.5):
 * 1. the first look: a unit root (augmented Dickey–Fuller, Said & Dickey 1984) means difference
 *    first; a confirmed cycle (`detectPeriod`) means seasonal; the correlogram patterns (PACF
 *    cutting off → AR, ACF cutting off → MA, both fading → ARMA; Table 6.1) are kept as
 *    `evidence.correlogram`. ACF lags are judged against Bartlett's MA bands, PACF lags against
 *    ±z/√n, with z at α/(2·maxLag) for the cut-off so a stray lag among many does not count;
 * 2. the model: every ARMA(p, q) with p ≤ maxP, q ≤ maxQ is fitted by exact maximum likelihood
 *    (`selectArma`) to the most recent `fitCells` values — to the series less its seasonal
 *    component when it has a period — and the admissible model with the lowest BIC gives
 *    the verdict (white noise, AR, MA or ARMA with its orders; a seasonal series keeps the
 *    verdict 'seasonal' and carries the remainder's model). The correlogram verdict stands in
 *    only when no model can be fitted (`modelNote` says why).
 *
 * Cost: O(n log n + n · maxLag) for the first look, plus (maxP + 1)(maxQ + 1) likelihood
 * optimisations of O(fitCells · (p + q)²) each.
 */
export function identifyProcess(x: Series, options: IdentifyProcessOptions = {}): ProcessIdentification {
  const fn = 'identifyProcess';
  assertSeries(x, fn);
  let n = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) n++;
  const present = n === x.length && x instanceof Float64Array ? x : new Float64Array(n);
  if (present !== x) for (let i = 0, j = 0; i < x.length; i++) if (!Number.isNaN(x[i])) present[j++] = x[i];
  if (n < 30) throw new AnalysisInputError(`${fn} requires at least 30 data points (got ${n})`, { reason: 'too-few-values', need: 30, got: n });
  const maxLag = integerOption(fn, 'maxLag', options.maxLag ?? Math.min(Math.max(20, defaultMaxLag(n)), Math.floor(n / 4)), 2, Math.floor(n / 4));
  const maxOrder = integerOption(fn, 'maxOrder', options.maxOrder ?? 5, 1, maxLag - 1);
  integerOption(fn, 'fitCells', options.fitCells ?? 2000, 30, Number.MAX_SAFE_INTEGER);
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);

  const acf = options.acf && options.acf.length > maxLag ? options.acf.slice(0, maxLag + 1) : autocorrelation(x, { maxLag });
  const pacf = durbinLevinson(acf, maxLag, { keepCoefficients: false }).partial;
  const lbLag = Math.min(10, Math.floor(n / 5));
  const ljung = { ...ljungBox(x, lbLag <= maxLag ? { lag: lbLag, acf } : { lag: lbLag }), lag: lbLag };
  // Schwert's lag rule grows like n^¼ (95 lags at 400 000 readings) and the regression costs
  // n·lags²; 24 lags already absorb the short-term structure a unit-root decision needs, and
  // beyond 20 000 readings 12 do (the test's power then comes from n, not from more lags).
  const adfLags = Math.min(Math.floor(12 * (n / 100) ** 0.25), n > 20_000 ? 12 : 24, Math.floor((n - 4) / 2));
  const unitRoot = n >= 50 ? augmentedDickeyFuller(present, { lags: adfLags }) : null;
  const period = options.knownPeriod !== undefined ? options.knownPeriod : detectPeriod(x, { maxPeriod: Math.floor(x.length / 2) }).best;

  const ordinary = autocorrelationBands(acf, { n, alpha, kind: 'bartlett' }).limits;
  const strict = autocorrelationBands(acf, { n, alpha: alpha / maxLag, kind: 'bartlett' }).limits;
  const whiteZ = autocorrelationBands(acf, { n, alpha, kind: 'white-noise' }).limits[0];
  const whiteStrict = autocorrelationBands(acf, { n, alpha: alpha / maxLag, kind: 'white-noise' }).limits[0];
  const acfFromLag1 = acf.subarray(1);
  const significantAcfLags: number[] = [];
  const significantPacfLags: number[] = [];
  for (let k = 1; k <= maxLag; k++) {
    if (Math.abs(acf[k]) > ordinary[k - 1]) significantAcfLags.push(k);
    if (Math.abs(pacf[k - 1]) > whiteZ) significantPacfLags.push(k);
  }
  const q = endOfInitialRun(acfFromLag1, (k) => strict[k - 1], maxLag);
  const p = endOfInitialRun(pacf, () => whiteStrict, maxLag);
  const cutsOff = (values: ArrayLike<number>, lag: number, band: number) => lag >= 1 && lag <= maxOrder && Math.abs(values[lag - 1]) >= CLEAR_DROP * band;
  const acfCuts = cutsOff(acfFromLag1, q, q ? strict[q - 1] : 0);
  const pacfCuts = cutsOff(pacf, p, whiteStrict);
  const pattern = (lag: number, cuts: boolean): CorrelogramPattern => (lag === 0 ? 'none' : cuts ? 'cuts-off' : 'tails-off');
  const firstLook = correlogramVerdict(acf, pacf, p, q, acfCuts, pacfCuts);

  const evidence: ProcessEvidence = {
    n,
    maxLag,
    acf,
    pacf,
    significantAcfLags,
    significantPacfLags,
    acfCutoff: q,
    pacfCutoff: p,
    acfPattern: pattern(q, acfCuts),
    pacfPattern: pattern(p, pacfCuts),
    ljungBox: ljung,
    unitRoot,
    period,
    correlogram: firstLook,
  };
  const finish = (
    verdict: ProcessVerdict,
    extra: { p?: number; q?: number; period?: number },
    model: ProcessModelFit | null,
    modelNote: string | null,
  ): ProcessIdentification => ({
    verdict,
    ...extra,
    explanation: explainVerdict({ verdict, ...extra, ljungBoxP: ljung.pValue, lag1: acf[1], model }),
    evidence,
    model,
    modelNote,
  });

  // The ADF test has little power against persistence just below a unit root in short series
  // (DeJong, Nankervis, Savin & Whiteman 1992, J. Econometrics 53:323–343): a series it cannot
  // clear is called non-stationary only when its fitted AR(1) coefficient is also 0.95 or more
  // (our rule); below that, the stationary model is fitted and the explanation says so.
  let unitRootDoubt = false;
  if (unitRoot && !unitRoot.rejectsUnitRoot) {
    const phi = present.length === x.length ? lagOneCoefficient(present) : 1;
    if (phi >= UNIT_ROOT_PHI) return finish('needs-differencing', {}, null, 'No model is fitted to a series that still needs differencing.');
    unitRootDoubt = true;
  }
  if (present.length !== x.length) {
    const note = 'The series has gaps; fill them (the channel diagnostics interpolate) to fit a model.';
    return period !== null ? finish('seasonal', { period }, null, note) : finish(firstLook.verdict, { p: firstLook.p, q: firstLook.q }, null, note);
  }
  let model: ProcessModelFit;
  try {
    model = period !== null ? fitModel(seasonallyAdjusted(present, period, options.seasonal), 'remainder', options) : fitModel(present, 'series', options);
  } catch (err) {
    if (!(err instanceof AnalysisInputError)) throw err;
    const note = `No model could be fitted: ${err.message}`;
    return period !== null ? finish('seasonal', { period }, null, note) : finish(firstLook.verdict, { p: firstLook.p, q: firstLook.q }, null, note);
  }
  const orders = { ...(model.p > 0 ? { p: model.p } : {}), ...(model.q > 0 ? { q: model.q } : {}) };
  const doubt = unitRootDoubt
    ? `The unit-root test could not rule out a wandering level at this length (ADF statistic ${unitRoot!.statistic.toFixed(2)} above the 5 % critical value ${unitRoot!.criticalValues['5%'].toFixed(2)}), but the fitted persistence stays below 0.95, so a stationary model is used.`
    : null;
  if (period !== null) return finish('seasonal', { period, ...orders }, model, doubt);
  return finish(verdictOfOrders(model.p, model.q), orders, model, doubt);
}
