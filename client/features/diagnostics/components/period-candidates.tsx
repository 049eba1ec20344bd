import type { DiagnosticsReport } from '@shared/contract/diagnostics.ts';
import { durationWords } from '@shared/contract/words/diagnostics.ts';
import { fmtP, fmtSeconds, fmtStat } from './format-number.ts';

/**
 * The seasonal periods the engine considered, the one used and where it came from. The
 * detector's unrounded figure is labelled as the raw estimate behind the period used, never
 * shown as a period of its own.
 */
export function PeriodCandidates({ period, stepS }: { period: DiagnosticsReport['period']; stepS: number }) {
  const used =
    period.used === null
      ? 'none'
      : `${period.used} steps (${durationWords(period.used * stepS)}), ${period.source === 'manual' ? 'set by hand' : 'found in the readings'}`;
  const raw = period.rawEstimate ?? null;
  return (
    <section aria-labelledby="periods-heading" className="grid gap-2 text-sm">
      <h4 id="periods-heading" className="font-semibold">
        Seasonal period
      </h4>
      <p data-testid="period-used">Used in every section: {used}</p>
      {raw !== null && (
        <p className="text-xs text-ink-soft" data-testid="period-raw-estimate">
          Raw estimate from the spectrum: {Number(raw.toFixed(1))} steps, the unrounded figure behind the period used (not a second period).
        </p>
      )}
      <p className="text-xs text-ink-soft">
        Each candidate is judged against the channel’s own persistence (the spectrum of a fitted AR model), and a cycle within one frequency step of an hour, a
        day, a week, a whole number of days or a whole-hour part of a day is reported as exactly that many steps. A harmonic of a longer cycle (half or a third
        of it, for a cycle that is not a pure wave) is shown as part of that cycle, not as a period of its own.
      </p>
      {period.candidates.length === 0 ? (
        <p className="text-ink-soft">No period candidates.</p>
      ) : (
        // six columns do not fit a phone: the table scrolls sideways inside its own box (focusable, so keys scroll it too)
        <div className="overflow-x-auto" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Period candidates</caption>
            <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3">
                  Period
                </th>
                <th scope="col" className="py-1 pr-3">
                  Length
                </th>
                <th scope="col" className="py-1 pr-3">
                  ACF there
                </th>
                <th scope="col" className="py-1 pr-3">
                  Peak ratio
                </th>
                <th scope="col" className="py-1 pr-3">
                  p-value
                </th>
                <th scope="col" className="py-1 pr-3">
                  Seen in
                </th>
                <th scope="col" className="py-1">
                  How the length was read
                </th>
              </tr>
            </thead>
            <tbody>
              {period.candidates.map((c) => (
                <tr key={c.period} className={`border-b border-rule/60 last:border-b-0 ${c.significant ? 'font-semibold' : ''}`}>
                  <td className="py-1 pr-3 font-mono">{c.period}</td>
                  <td className="py-1 pr-3">{fmtSeconds(c.periodS)}</td>
                  <td className="py-1 pr-3 font-mono">{fmtStat(c.acf, 3)}</td>
                  <td className="py-1 pr-3 font-mono">{fmtStat(c.peakRatio, 3)}</td>
                  <td className="py-1 pr-3 font-mono">{fmtP(c.pValue)}</td>
                  <td className="py-1">
                    {c.sources.join(' and ')}
                    {c.significant ? ' · significant' : ''}
                    {c.harmonicOf ? ` · part of the ${c.harmonicOf}-step cycle` : ''}
                  </td>
                  <td className="py-1" data-testid="period-note">
                    {c.note ?? ''}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
