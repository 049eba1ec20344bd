import type { CompareMeansResult } from '../analysis/index.ts';
import type { ChannelWithState } from '../db/channel-state.repo.ts';
import type { ComparisonAnswer, ComparisonParams, RangeSummary } from '../contract/diagnostics.ts';
import type { AppliedNote } from '../contract/notes.ts';
import { channelSummary, excludedNotesSentence } from './diagnostics-report.ts';

const REFERENCES = [
  'Bayley & Hammersley (1946), J. R. Stat. Soc. Suppl. 8:184–197 — the effective number of independent observations',
  'Zwiers & von Storch (1995), J. Climate 8:336–351 — tests of the mean with an equivalent sample size',
  'Geyer (1992), Statistical Science 7:473–483 — the autocorrelation time by the initial monotone sequence',
  'Satterthwaite (1946), Biometrics Bulletin 2:110–114; Welch (1947), Biometrika 34:28–35 — degrees of freedom of a difference of means',
];

/** A value with three significant digits and the unit. */
function withUnit(x: number, unit: string | null): string {
  const digits = x === 0 ? 0 : Math.max(0, 2 - Math.floor(Math.log10(Math.abs(x))));
  return `${x.toFixed(Math.min(digits, 10))}${unit ? ` ${unit}` : ''}`;
}

/**
 * The JSON answer of a before/after comparison: both ranges summarised, the difference of
 * means (b − a) with the interval that respects each range's autocorrelation beside the naive
 * Welch interval, the caution when a range is short for its autocorrelation, a plain sentence
 * and the method with its sources.
 */
export function rangeComparisonReport(input: {
  channel: ChannelWithState;
  other: ChannelWithState | null;
  params: ComparisonParams;
  stepS: number;
  rangeA: { from: number; to: number };
  rangeB: { from: number; to: number };
  result: CompareMeansResult;
  /** Notes whose cells were made missing in range a and range b (none when left out). */
  excludedNotes?: { a: AppliedNote[]; b: AppliedNote[] };
}): ComparisonAnswer {
  const excluded = input.excludedNotes ?? { a: [], b: [] };
  const notesSaid = [
    excluded.a.length ? ` Range a: ${excludedNotesSentence(excluded.a)}` : '',
    excluded.b.length ? ` Range b: ${excludedNotesSentence(excluded.b)}` : '',
  ].join('');
  const { result: r, channel, other } = input;
  const unit = channel.unit;
  const summary = (s: CompareMeansResult['a'], range: { from: number; to: number }): RangeSummary => ({
    from: range.from,
    to: range.to,
    n: s.n,
    mean: s.mean,
    sd: s.sd,
    effectiveN: s.nEff,
    autocorrelationTime: s.tau,
  });
  const level = `${Math.round((1 - r.alpha) * 100)} %`;
  const [lo, hi] = r.effective.interval;
  const bLabel = other ? `${other.label} in range b` : 'range b';
  const verdict =
    lo > 0 || hi < 0 ? 'a difference that the channel’s own wandering does not explain' : 'no difference distinguishable from the channel’s own wandering';
  const welchSays = r.welch.interval[0] > 0 || r.welch.interval[1] < 0;
  const contrast =
    welchSays && !(lo > 0 || hi < 0) ? ' An ordinary Welch test, which treats every reading as independent, would wrongly call it significant.' : '';
  return {
    channel: channelSummary(channel),
    other: other ? channelSummary(other) : null,
    a: summary(r.a, input.rangeA),
    b: summary(r.b, input.rangeB),
    difference: r.difference,
    alpha: r.alpha,
    dependent: { standardError: r.effective.standardError, df: r.effective.df, interval: r.effective.interval },
    welch: { standardError: r.welch.standardError, df: r.welch.df, interval: r.welch.interval },
    caution: r.caution,
    sentence:
      `The mean of ${bLabel} differs from ${channel.label} in range a by ${withUnit(r.difference, unit)} ` +
      `(${level} interval ${withUnit(lo, unit)} to ${withUnit(hi, unit)}, allowing for autocorrelation): ${verdict}.${contrast}`,
    method: {
      stepS: input.stepS,
      agg: input.params.agg,
      statement:
        `Each range was put on a grid of ${input.stepS} s cells (the ${input.params.agg} of each cell's readings). The difference is mean(b) − mean(a). ` +
        'Each mean’s standard error uses the range’s effective sample size n/τ, τ = 1 + 2 Σ ρ_k summed by Geyer’s initial monotone sequence, and the degrees of freedom follow Welch–Satterthwaite with the effective sizes (our combination). ' +
        'The Welch interval beside it is R’s t.test(b, a), which assumes independent readings. A range holding fewer than 10 effective readings gets a caution: its autocorrelation time, and so the interval, is poorly determined.' +
        notesSaid,
      excludedNotes: excluded,
      references: REFERENCES,
    },
  };
}
