import type { TrendAnswer } from '@shared/contract/diagnostics.ts';
import { BlockSection } from './block-section.tsx';
import { fmtP, fmtStat } from './format-number.ts';
import { noTrend } from '../messages.ts';

type Rate = Extract<TrendAnswer, { available: true }>['perDay'];

const interval = (i: [number, number]) => `${fmtStat(i[0], 4)} … ${fmtStat(i[1], 4)}`;

/**
 * The least-squares trend of the series per day and per year, with two intervals side by side:
 * one whose standard error allows for autocorrelation (Newey & West 1987, Bartlett kernel) and
 * the naive ordinary-least-squares one that assumes independent readings, so the difference is
 * visible. When no trend could be estimated, the server's reason.
 */
export function TrendBlock({ trend }: { trend: TrendAnswer }) {
  if (!trend.available) {
    return <BlockSection id="trend-heading" title="Trend (drift)" missing={{ text: noTrend(trend.reason), testId: 'trend-unavailable' }} />;
  }
  const u = trend.unit ?? 'units';
  const level = `${Math.round((1 - trend.alpha) * 1000) / 10}%`;
  const row = (label: string, testId: string, pick: (r: Rate) => { se: number; interval: [number, number] }, soft: boolean) => (
    <tr data-testid={testId} className={`border-b border-rule/60 last:border-b-0 ${soft ? 'text-ink-soft' : ''}`}>
      <th scope="row" className="py-1 pr-3 font-normal">
        {label}
      </th>
      <td className="py-1 pr-3 font-mono">± {fmtStat(pick(trend.perDay).se, 3)}</td>
      <td className="py-1 pr-3 font-mono">{interval(pick(trend.perDay).interval)}</td>
      <td className="py-1 font-mono">{interval(pick(trend.perYear).interval)}</td>
    </tr>
  );
  return (
    <BlockSection id="trend-heading" title="Trend (drift)" testId="trend">
      <p className="font-medium" data-testid="trend-sentence">
        {trend.sentence}
      </p>
      <p className="text-sm">
        Slope <span className="font-mono">{fmtStat(trend.perDay.slope, 4)}</span> {u}/day = <span className="font-mono">{fmtStat(trend.perYear.slope, 4)}</span>{' '}
        {u}/year, from {trend.n.toLocaleString('en')} values; p = {fmtP(trend.pValueHac)} allowing for autocorrelation.
      </p>
      <table className="w-full border-collapse text-left text-sm">
        <caption className="mb-1 text-left text-sm font-semibold">{level} intervals for the slope</caption>
        <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="py-1 pr-3">
              Standard error
            </th>
            <th scope="col" className="py-1 pr-3">
              SE ({u}/day)
            </th>
            <th scope="col" className="py-1 pr-3">
              Per day ({u}/day)
            </th>
            <th scope="col" className="py-1">
              Per year ({u}/year)
            </th>
          </tr>
        </thead>
        <tbody>
          {row(`allowing for autocorrelation (Newey–West, lag ${trend.lag})`, 'trend-hac', (r) => ({ se: r.hacStandardError, interval: r.hacInterval }), false)}
          {row('assuming independent readings (ordinary least squares)', 'trend-ols', (r) => ({ se: r.olsStandardError, interval: r.olsInterval }), true)}
        </tbody>
      </table>
      <p className="text-xs text-ink-soft">The second interval is too narrow when readings carry over from one step to the next; read the first.</p>
    </BlockSection>
  );
}
