import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { augmentedDickeyFuller, type AugmentedDickeyFullerResult } from './augmented-dickey-fuller.ts';
import { autocorrelation } from './autocorrelation.ts';
import { autocorrelationBands } from './autocorrelation-bands.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { detectPeriod } from './detect-period.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { explainVerdict } from './identify-process-explanation.ts';
import { integerOption } from './integer-option.ts';
import { ljungBox } from './ljung-box.ts';
import type { PortmanteauResult } from './portmanteau-test.ts';

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

/**
 * Suggests which simple process describes a channel — white noise, AR(p), MA(q), ARMA, a series
 * that must be differenced first, or a seasonal one — with the evidence behind the suggestion and
 * an explanation in plain language.
 *
 * Follows the Box–Jenkins identification rules (Box, Jenkins & Reinsel, *Time Series Analysis*,
 * 4th ed., §6.2, Table 6.1; Brockwell & Davis, *Introduction to Time Series and Forecasting*,
 * 2nd ed., §5.1 and §6.1): a unit root (augmented Dickey–Fuller, Said & Dickey 1984) means
 * difference first; a confirmed cycle (see `detectPeriod`) means seasonal; otherwise the PACF
 * cutting off after lag p marks AR(p), the ACF cutting off after lag q marks MA(q), both fading
 * marks ARMA. ACF lags are judged against Bartlett's (1946) MA bands and PACF lags against
 * ±z/√n (Quenouille 1949); for the cut-off the band uses z at α/(2·maxLag) so that a stray lag
 * among many does not pass for structure, the cut-off lag is the end of the initial run of
 * significant lags (one quiet lag allowed inside it), and a function "cuts off" when that last
 * lag stands at least twice the band high (our rules for "abrupt"). When both cut off, the one
 * of lower order wins, and on equal orders the one whose next value falls furthest relative to
 * the last significant one. The Ljung–Box
 * test (Ljung & Box 1978) is reported alongside.
 *
 * Cost: O(n log n + n · maxLag) time.
 */
export function identifyProcess(x: Series, options: IdentifyProcessOptions = {}): ProcessIdentification {
  const fn = 'identifyProcess';
  assertSeries(x, fn);
  let n = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) n++;
  const present = n === x.length && x instanceof Float64Array ? x : new Float64Array(n);
  if (present !== x) for (let i = 0, j = 0; i < x.length; i++) if (!Number.isNaN(x[i])) present[j++] = x[i];
  if (n < 30) throw new AnalysisInputError(`${fn} requires at least 30 data points (got ${n})`);
  const maxLag = integerOption(
    fn,
    'maxLag',
    options.maxLag ?? Math.min(Math.max(20, defaultMaxLag(n)), Math.floor(n / 4)),
    2,
    Math.floor(n / 4),
  );
  const maxOrder = integerOption(fn, 'maxOrder', options.maxOrder ?? 5, 1, maxLag - 1);
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
  const cutsOff = (values: ArrayLike<number>, lag: number, band: number) =>
    lag >= 1 && lag <= maxOrder && Math.abs(values[lag - 1]) >= CLEAR_DROP * band;
  const acfCuts = cutsOff(acfFromLag1, q, q ? strict[q - 1] : 0);
  const pacfCuts = cutsOff(pacf, p, whiteStrict);
  const pattern = (lag: number, cuts: boolean): CorrelogramPattern => (lag === 0 ? 'none' : cuts ? 'cuts-off' : 'tails-off');

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
  };
  const finish = (verdict: ProcessVerdict, extra: { p?: number; q?: number; period?: number } = {}) => ({
    verdict,
    ...extra,
    explanation: explainVerdict({ verdict, ...extra, ljungBoxP: ljung.pValue, lag1: acf[1] }),
    evidence,
  });

  if (unitRoot && !unitRoot.rejectsUnitRoot) return finish('needs-differencing');
  if (period !== null) return finish('seasonal', { period });
  if (p === 0 && q === 0) return finish('white-noise');
  if (pacfCuts && acfCuts) {
    // Both look abrupt: the lower order wins (parsimony); on a tie, the sharper drop (next value
    // relative to the last significant one).
    if (p !== q) return p < q ? finish('ar', { p }) : finish('ma', { q });
    const dropPacf = Math.abs(pacf[p] ?? 0) / Math.abs(pacf[p - 1]);
    const dropAcf = Math.abs(acf[q + 1] ?? 0) / Math.abs(acf[q]);
    return dropPacf <= dropAcf ? finish('ar', { p }) : finish('ma', { q });
  }
  if (pacfCuts) return finish('ar', { p });
  if (acfCuts) return finish('ma', { q });
  return finish('arma', { p: 1, q: 1 });
}
