import { formatInstant } from '../../../components/clock/format.ts';
import type { ComparisonAnswer, RangeSummary } from '@shared/contract/diagnostics.ts';
import { fmtSeconds, fmtStat } from './format-number.ts';

const TH = 'py-1 pr-3';
const span = (i: [number, number], u: string) => `${fmtStat(i[0], 4)} … ${fmtStat(i[1], 4)}${u}`;

/**
 * A before/after answer: the server's sentence, the difference of means with the interval whose
 * standard errors come from each range's effective sample size and the naive Welch interval
 * beside it, n and effective n of each range, the caution when the server gives one, and the
 * method statement with its references.
 */
export function ComparisonResult({ answer, timezone }: { answer: ComparisonAnswer; timezone: string }) {
  const unit = answer.channel.unit;
  const u = unit ? ` ${unit}` : '';
  const level = `${Math.round((1 - answer.alpha) * 1000) / 10}%`;
  const bChannel = answer.other ?? answer.channel;
  const rangeRow = (name: string, channelLabel: string, r: RangeSummary) => (
    <tr key={name} className="border-b border-rule/60 last:border-b-0">
      <th scope="row" className={`${TH} font-normal`}>
        <span className="font-semibold">{name}</span> <span className="text-ink-soft">{channelLabel}</span>
        <span className="block text-xs text-ink-soft">
          {formatInstant(r.from, timezone, { named: false })} to {formatInstant(r.to, timezone, { named: false })}
        </span>
      </th>
      <td className={`${TH} font-mono`}>{r.n.toLocaleString('en')}</td>
      <td className={`${TH} font-mono`}>{fmtStat(r.effectiveN)}</td>
      <td className={`${TH} font-mono`}>
        {fmtStat(r.autocorrelationTime)} <span className="font-sans text-ink-soft">({fmtSeconds(r.autocorrelationTime * answer.method.stepS)})</span>
      </td>
      <td className={`${TH} font-mono`}>{fmtStat(r.mean, 6)}</td>
      <td className="py-1 font-mono">{fmtStat(r.sd, 4)}</td>
    </tr>
  );
  const intervalRow = (label: string, testId: string, x: ComparisonAnswer['dependent'], soft: boolean) => (
    <tr data-testid={testId} className={`border-b border-rule/60 last:border-b-0 ${soft ? 'text-ink-soft' : ''}`}>
      <th scope="row" className={`${TH} font-normal`}>
        {label}
      </th>
      <td className={`${TH} font-mono`}>± {fmtStat(x.standardError, 3)}</td>
      <td className={`${TH} font-mono`}>{fmtStat(x.df, 4)}</td>
      <td className="py-1 font-mono">{span(x.interval, u)}</td>
    </tr>
  );
  return (
    <div className="grid gap-4" data-testid="comparison-result">
      <p className="font-medium" data-testid="comparison-sentence">
        {answer.sentence}
      </p>
      <p className="text-lg font-semibold" data-testid="comparison-difference">
        mean(B) − mean(A) = <span className="font-mono">{fmtStat(answer.difference, 5)}</span>
        {u}
      </p>
      {answer.caution && (
        <aside aria-label="Comparison caution" className="rounded-lg border border-amber bg-amber/10 p-3 text-sm" data-testid="comparison-caution">
          <strong>Read with care.</strong> {answer.caution}
        </aside>
      )}
      <table className="w-full border-collapse text-left text-sm">
        <caption className="mb-1 text-left text-sm font-semibold">{level} intervals for the difference of means</caption>
        <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className={TH}>
              Standard error
            </th>
            <th scope="col" className={TH}>
              SE{u && ` (${unit})`}
            </th>
            <th scope="col" className={TH}>
              df
            </th>
            <th scope="col" className="py-1">
              Interval
            </th>
          </tr>
        </thead>
        <tbody>
          {intervalRow('allowing for autocorrelation (effective sample sizes)', 'comparison-dependent', answer.dependent, false)}
          {intervalRow('assuming independent readings (Welch)', 'comparison-welch', answer.welch, true)}
        </tbody>
      </table>
      <table className="w-full border-collapse text-left text-sm" data-testid="comparison-ranges">
        <caption className="mb-1 text-left text-sm font-semibold">The two ranges (times in {timezone.replaceAll('_', ' ')})</caption>
        <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className={TH}>
              Range
            </th>
            <th scope="col" className={TH}>
              Values (n)
            </th>
            <th scope="col" className={TH}>
              Effective n
            </th>
            <th scope="col" className={TH}>
              Autocorrelation time τ (steps)
            </th>
            <th scope="col" className={TH}>
              Mean{u && ` (${unit})`}
            </th>
            <th scope="col" className="py-1">
              SD
            </th>
          </tr>
        </thead>
        <tbody>
          {rangeRow('A', answer.channel.label, answer.a)}
          {rangeRow('B', bChannel.label, answer.b)}
        </tbody>
      </table>
      <section aria-labelledby="comparison-method-heading" className="grid gap-1 text-sm">
        <h4 id="comparison-method-heading" className="font-semibold">
          Method
        </h4>
        <p data-testid="comparison-method">{answer.method.statement}</p>
        <p className="text-ink-soft">
          Readings put on a grid of {fmtSeconds(answer.method.stepS)} steps ({answer.method.agg} per step); α = {answer.alpha}.
        </p>
        <ul className="list-disc pl-5 text-ink-soft">
          {answer.method.references.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
