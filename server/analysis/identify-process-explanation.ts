import type { ProcessModelFit } from './identify-process.ts';

/** What the explanation needs to know about the verdict. */
export interface ExplanationFacts {
  verdict: 'white-noise' | 'ar' | 'ma' | 'arma' | 'needs-differencing' | 'seasonal';
  p?: number;
  q?: number;
  period?: number;
  ljungBoxP: number;
  lag1: number;
  /** The fitted model behind the verdict, when there is one. */
  model?: ProcessModelFit | null;
}

const plural = (k: number, word: string) => `${k} ${word}${k === 1 ? '' : 's'}`;

/** An AR root closer to the unit circle than this makes the model's information figure unreliable (auto.arima's bound). */
export const NEAR_UNIT_ROOT = 1.01;

/** `0.82 ± 0.03` with two significant decimals of the standard error. */
function withError(value: number, se: number): string {
  const digits = Number.isFinite(se) && se > 0 ? Math.min(6, Math.max(2, 1 - Math.floor(Math.log10(se)))) : 3;
  return Number.isFinite(se) ? `${value.toFixed(digits)} ± ${se.toFixed(digits)}` : value.toFixed(digits);
}

/** "AR(1), φ₁ = 0.82 ± 0.03" — the model's orders and coefficients with standard errors. */
export function describeModel(m: Pick<ProcessModelFit, 'p' | 'q' | 'ar' | 'ma' | 'standardErrors'>): string {
  const name = m.p === 0 && m.q === 0 ? 'white noise' : m.q === 0 ? `AR(${m.p})` : m.p === 0 ? `MA(${m.q})` : `ARMA(${m.p},${m.q})`;
  const terms = [
    ...m.ar.map((v, i) => `φ${i + 1} = ${withError(v, m.standardErrors.ar[i])}`),
    ...m.ma.map((v, i) => `θ${i + 1} = ${withError(v, m.standardErrors.ma[i])}`),
  ];
  return terms.length ? `${name}, ${terms.join(', ')}` : name;
}

/** The model's sentence: what was fitted, and how much independent information the readings hold. */
function modelSentence(m: ProcessModelFit, seasonal: boolean): string {
  const on = seasonal ? 'After the cycle is removed, the rest of the series' : 'The series';
  const ratio = m.readingsPerIndependent;
  const information =
    m.smallestArRoot < NEAR_UNIT_ROOT
      ? 'it sits so close to a wandering level (an AR root within 1 % of the unit circle) that it cannot say how many readings are independent information; the effective sample size is the better guide'
      : ratio < 1.5
        ? 'nearly every reading is independent information about the mean'
        : `about 1 in ${ratio < 10 ? ratio.toFixed(1) : Math.round(ratio).toLocaleString('en')} readings is independent information about the mean`;
  const fit =
    m.residualTest.pValue < 0.05
      ? ` Its residuals still fail the Ljung–Box test (p = ${m.residualTest.pValue.toPrecision(2)}), so treat the model as a rough description.`
      : '';
  return ` ${on} is described best by ${describeModel(m)} (exact maximum likelihood, lowest BIC among ARMA orders up to 3), fitted on the last ${m.cells.toLocaleString('en')} values: ${information}.${fit}`;
}

/**
 * Plain-language explanation of a process verdict for a bench scientist: what the pattern
 * means for their readings and what to do before using ordinary statistics on them. The texts
 * are Lagbook's own; the reading rules behind them are Box, Jenkins & Reinsel, *Time Series
 * Analysis*, 4th ed., §6.2 (Table 6.1: ACF and PACF patterns of AR, MA and ARMA processes).
 *
 * Cost: O(1).
 */
export function explainVerdict(f: ExplanationFacts): string {
  const text = verdictText(f);
  return f.model ? text + modelSentence(f.model, f.verdict === 'seasonal') : text;
}

/** The verdict's own text, before the model sentence. */
function verdictText(f: ExplanationFacts): string {
  const persistence = f.lag1 > 0 ? 'similar to' : 'on the opposite side of the mean from';
  switch (f.verdict) {
    case 'white-noise':
      return (
        'The readings behave like independent draws around a fixed level: knowing one reading tells you ' +
        'essentially nothing about the next. Ordinary statistics that assume independent observations are ' +
        (f.ljungBoxP < 0.05
          ? 'nearly safe here, although the portmanteau test picks up a weak overall dependence worth keeping in mind.'
          : 'reasonable for this channel.')
      );
    case 'ar':
      return (
        `Each reading is largely carried over from the previous ${f.p === 1 ? 'one' : plural(f.p ?? 1, 'reading')}: ` +
        `the channel has memory, so a reading tends to be ${persistence} the one before it, and the effect of a ` +
        'disturbance fades gradually instead of vanishing at once, as in an autoregressive process of order ' +
        `${f.p}. Neighbouring readings are not independent: use the effective sample size, not the raw count, ` +
        `for confidence intervals, or model the series as AR(${f.p}).`
      );
    case 'ma':
      return (
        `A disturbance affects the next ${plural(f.q ?? 1, 'reading')} and is then forgotten completely: ` +
        `readings more than ${plural(f.q ?? 1, 'step')} apart are unrelated, as in a moving-average ` +
        `process of order ${f.q} (short-lived shocks, such as a door opening or a brief sensor transient). ` +
        `Treat readings within ${plural(f.q ?? 1, 'step')} of each other as dependent, or model the series as MA(${f.q}).`
      );
    case 'arma':
      return (
        'The channel mixes lasting memory with short-lived shocks: a reading carries over into the next ones ' +
        'and each disturbance also leaves a brief echo of its own. A mixed ' +
        `ARMA(${f.p ?? 1},${f.q ?? 1}) model describes this better than a pure AR or MA model.`
      );
    case 'needs-differencing':
      return (
        'The level of this channel wanders or drifts instead of returning to a stable mean, so its ' +
        'autocorrelation stays high for many lags and hides everything else. Look at the changes from one ' +
        'reading to the next (first differences), or remove the trend, and run the diagnosis again on that.'
      );
    case 'seasonal':
      return (
        `The readings repeat a pattern every ${plural(f.period ?? 0, 'sample')}: values one cycle apart are ` +
        'more alike than values closer together. Remove the cycle (a seasonal decomposition or differencing ' +
        `at lag ${f.period}) before judging the remaining short-term structure or comparing averages.`
      );
  }
}
