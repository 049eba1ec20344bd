import { useMemo, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { EChart } from '../../../components/charts/echart.tsx';
import { SelectField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { CrossCorrelation } from '../api/get-diagnostics.ts';
import { useDiagnosticsRun } from '../hooks/use-diagnostics-run.ts';
import { fmtSeconds } from './format-number.ts';
import { RunProgress } from './run-progress.tsx';
import { lagsOutsideBand, stemChartOption, stemSummary } from './stem-chart-option.ts';

/** Another channel of the lab to compare with. */
export interface PartnerChannel {
  id: number;
  label: string;
  loggerName: string;
}

/**
 * The strongest lag as plain facts (steps, time, r, pairs). The sentence that interprets it,
 * with the sign convention, is the server's `explanation`.
 */
export function strongestLagFacts(ccf: CrossCorrelation): string {
  const s = ccf.strongest;
  if (!s) return 'No lag could be computed.';
  const span = s.lag === 0 ? 'no shift' : `${s.lag > 0 ? '+' : '−'}${fmtSeconds(Math.abs(s.lagMs) / 1000)}`;
  return `Strongest at lag ${s.lag} steps (${span}), r = ${s.value.toFixed(3)}, band ±${ccf.band.toFixed(3)}, ${ccf.pairs.toLocaleString('en')} paired steps; positive lags mean this channel follows ${ccf.with.label}.`;
}

/** Cross-correlation of this channel with another of the lab over the chart's range. */
export function CrossCorrelationPanel({
  slug,
  channelId,
  channelLabel,
  chartRange,
  partners,
}: {
  slug: string;
  channelId: number;
  channelLabel: string;
  chartRange: { from: number; to: number };
  partners: PartnerChannel[];
}) {
  const run = useDiagnosticsRun(slug, channelId);
  const [partner, setPartner] = useState(partners[0]?.id ?? 0);
  const [difference, setDifference] = useState('0');
  const ccf = run.running ? null : (run.query.data?.crossCorrelation ?? null);
  const option = useMemo(
    () =>
      ccf
        ? stemChartOption({
            name: 'CCF',
            lags: ccf.lags,
            values: ccf.values,
            whiteNoise: ccf.band,
            whiteNoiseLabel: 'Band ±z/√pairs',
            highlightLag: ccf.strongest?.lag ?? null,
            xName: 'Lag k (steps): value estimates cor(this[t + k], other[t])',
          })
        : null,
    [ccf],
  );

  function submit(e: FormEvent) {
    e.preventDefault();
    if (!partner) return;
    run.run({ ...chartRange, agg: 'mean', difference: Number(difference), seasonalDifference: 0, period: 'none', decomposition: 'none', alpha: 0.05, ccfWith: partner });
  }

  return (
    <section aria-labelledby="ccf-heading" className="grid gap-4 rounded-xl border border-rule bg-card p-4">
      <h3 id="ccf-heading" className="text-lg font-semibold">
        Cross-correlation
      </h3>
      {partners.length === 0 ? (
        <p className="text-sm text-ink-soft">The lab has no other channel to compare with.</p>
      ) : (
        <form aria-label="Cross-correlation parameters" onSubmit={submit} className="flex flex-wrap items-end gap-3">
          <div className="min-w-64">
            <SelectField label="Compare with" value={partner} onChange={(e) => setPartner(Number(e.target.value))}>
              {partners.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label} — {p.loggerName}
                </option>
              ))}
            </SelectField>
          </div>
          <SelectField label="Differencing (both)" value={difference} onChange={(e) => setDifference(e.target.value)}>
            <option value="0">none</option>
            <option value="1">once</option>
          </SelectField>
          <Button type="submit" tone="primary" disabled={run.running}>
            Cross-correlate
          </Button>
        </form>
      )}
      {run.running && <RunProgress what="Cross-correlating" elapsed={run.elapsed} onCancel={run.cancel} />}
      {run.query.isError && <Notice tone="alert">{run.query.error.message}</Notice>}
      {ccf && option && (
        <div className="grid gap-2" data-testid="ccf-result">
          <p className="font-medium" data-testid="ccf-sentence">
            {ccf.explanation}
          </p>
          <p className="text-sm text-ink-soft">{strongestLagFacts(ccf)}</p>
          <EChart
            option={option}
            label={`Cross-correlation of ${channelLabel} with ${ccf.with.label}`}
            summary={`${stemSummary('CCF', lagsOutsideBand(ccf.lags, ccf.values, () => ccf.band), `band ±${ccf.band.toFixed(3)}`)}`}
            pngName={`${slug}-ccf-${channelId}-${ccf.with.id}`}
          />
        </div>
      )}
    </section>
  );
}
