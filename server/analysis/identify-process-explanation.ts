/** What the explanation needs to know about the verdict. */
export interface ExplanationFacts {
  verdict: 'white-noise' | 'ar' | 'ma' | 'arma' | 'needs-differencing' | 'seasonal';
  p?: number;
  q?: number;
  period?: number;
  ljungBoxP: number;
  lag1: number;
}

const plural = (k: number, word: string) => `${k} ${word}${k === 1 ? '' : 's'}`;

/**
 * Plain-language explanation of a process verdict for a bench scientist: what the pattern
 * means for their readings and what to do before using ordinary statistics on them. The texts
 * are Lagbook's own; the reading rules behind them are Box, Jenkins & Reinsel, *Time Series
 * Analysis*, 4th ed., §6.2 (Table 6.1: ACF and PACF patterns of AR, MA and ARMA processes).
 *
 * Cost: O(1).
 */
export function explainVerdict(f: ExplanationFacts): string {
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
        'disturbance fades gradually instead of vanishing at once. The partial autocorrelation stops after ' +
        `lag ${f.p} while the ordinary autocorrelation dies away slowly, the signature of an autoregressive ` +
        `process of order ${f.p}. Neighbouring readings are not independent: use the effective sample size, ` +
        `not the raw count, for confidence intervals, or model the series as AR(${f.p}).`
      );
    case 'ma':
      return (
        `A disturbance affects the next ${plural(f.q ?? 1, 'reading')} and is then forgotten completely: ` +
        `readings more than ${plural(f.q ?? 1, 'step')} apart are unrelated. The autocorrelation stops after ` +
        `lag ${f.q} while the partial autocorrelation fades gradually, the signature of a moving-average ` +
        `process of order ${f.q} (short-lived shocks, such as a door opening or a brief sensor transient). ` +
        `Treat readings within ${plural(f.q ?? 1, 'step')} of each other as dependent, or model the series as MA(${f.q}).`
      );
    case 'arma':
      return (
        'Both the autocorrelation and the partial autocorrelation fade gradually rather than stopping at a ' +
        'particular lag, so the channel mixes lasting memory with short-lived shocks. A mixed ARMA model ' +
        `(start with ARMA(${f.p ?? 1},${f.q ?? 1}) and compare a few neighbours) describes this better than a pure AR or MA model.`
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
